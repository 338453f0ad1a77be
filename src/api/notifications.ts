import type { CaughtMailDto, CaughtMailSummaryDto, NotificationCategory, NotificationSettingsDto } from '@shared/schemas/notifications'
import { api } from './client'

export const notificationsApi = {
  settings: () => api.get<NotificationSettingsDto>('/profile/notifications').then((answer) => answer.items),
  /** Replaces the categories switched off; answers the settings as they now are. */
  save: (optOuts: NotificationCategory[]) =>
    api.request<NotificationSettingsDto>('PUT', '/profile/notifications', { body: { optOuts } }).then((answer) => answer.items),
}

/** The development mail catcher (administrators; 404 in production or when no catcher runs). */
export const mailboxApi = {
  list: () => api.get<{ items: CaughtMailSummaryDto[] }>('/dev/mailbox').then((answer) => answer.items),
  message: (id: string) => api.get<CaughtMailDto>(`/dev/mailbox/${encodeURIComponent(id)}`),
}
