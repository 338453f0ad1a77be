import { ROLE_LABELS, type Role } from '@shared/auth/roles'

const dateTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' })

/** An ISO timestamp with its time of day, in the reader's locale and zone. */
export const formatDateTime = (iso: string) => dateTimeFormat.format(new Date(iso))

/** The author of a comment or reply; null once the member's account is gone. */
export const authorLabel = (author: { name: string; role: string } | null) =>
  author ? `${author.name}, ${ROLE_LABELS[author.role as Role] ?? author.role}` : 'Former member'
