import { ROLE_LABELS, type Role } from '@shared/auth/roles'

/** A member as a timeline, comment or reply names them: "Name, Role"; "Former member" once the account is gone. */
export const memberLabel = (member: { name: string; role: string } | null) =>
  member ? `${member.name}, ${ROLE_LABELS[member.role as Role] ?? member.role}` : 'Former member'
