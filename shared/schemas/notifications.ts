import { z } from 'zod'

/** The kinds of e-mail Stringline sends; each user can switch any of them off on their profile. */
export const NOTIFICATION_CATEGORIES = ['review_requested', 'changes_requested', 'stamped', 'submitted', 'ahj_corrections', 'permit_issued', 'daily_digest'] as const
export type NotificationCategory = (typeof NOTIFICATION_CATEGORIES)[number]

export interface NotificationCategoryInfo {
  label: string
  /** Who receives it when nobody has switched it off, in words for the settings page. */
  recipients: string
}

/** Who receives what is common practice, no source; server/services/notification-service.ts decides it. */
export const NOTIFICATION_CATEGORY_INFO: Record<NotificationCategory, NotificationCategoryInfo> = {
  review_requested: { label: 'A plan set is handed to review', recipients: 'The reviewing electrician assigned to the project, or every reviewing electrician when none is' },
  changes_requested: { label: 'The reviewer requests changes', recipients: 'The project’s designer, or whoever asked for the review' },
  stamped: { label: 'A plan set is approved and stamped', recipients: 'The designer and the permit coordinator' },
  submitted: { label: 'A plan set is submitted or resubmitted to the AHJ', recipients: 'The designer, the stamping electrician and the permit coordinator' },
  ahj_corrections: { label: 'The AHJ asks for corrections', recipients: 'The designer, the stamping electrician and the permit coordinator' },
  permit_issued: { label: 'The permit is issued', recipients: 'The designer, the stamping electrician and the permit coordinator' },
  daily_digest: { label: 'Daily list of due and overdue items', recipients: 'Permit coordinators and administrators with something due' },
}

/** One category as the signed-in user sees it on their profile. */
export const notificationSettingDto = z.object({
  category: z.enum(NOTIFICATION_CATEGORIES),
  label: z.string(),
  recipients: z.string(),
  enabled: z.boolean(),
})
export const notificationSettingsDto = z.object({ items: z.array(notificationSettingDto) })
export type NotificationSettingsDto = z.infer<typeof notificationSettingsDto>

/** PUT body: the categories the user does not want, replacing the previous list. */
export const notificationSettingsBody = z.object({ optOuts: z.array(z.enum(NOTIFICATION_CATEGORIES)).max(NOTIFICATION_CATEGORIES.length) }).strict()
export type NotificationSettingsBody = z.infer<typeof notificationSettingsBody>

/** A message the development mail catcher holds, as listed. */
export const caughtMailSummaryDto = z.object({
  id: z.string(),
  receivedAt: z.iso.datetime(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  category: z.string().nullable(),
})
export const caughtMailDto = caughtMailSummaryDto.extend({ text: z.string().nullable(), html: z.string().nullable() })
export type CaughtMailSummaryDto = z.infer<typeof caughtMailSummaryDto>
export type CaughtMailDto = z.infer<typeof caughtMailDto>
