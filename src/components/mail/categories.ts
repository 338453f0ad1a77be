import { NOTIFICATION_CATEGORIES, NOTIFICATION_CATEGORY_INFO, type NotificationCategory } from '@shared/schemas/notifications'

const isCategory = (value: string): value is NotificationCategory => (NOTIFICATION_CATEGORIES as readonly string[]).includes(value)

/** A caught message's category in words; one this client does not know is shown as it came. */
export const categoryLabel = (category: string | null) => (category === null ? '—' : isCategory(category) ? NOTIFICATION_CATEGORY_INFO[category].label : category)
