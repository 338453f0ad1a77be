/** The four roles of an installer organisation (see DEVELOPERS.md, "Who may do what"). */
export const ROLES = ['admin', 'designer', 'reviewer', 'coordinator'] as const
export type Role = (typeof ROLES)[number]

/** Every signed-in role: for routes that any member of the organisation may call. */
export const ANY_ROLE: readonly Role[] = ROLES

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  designer: 'PV designer',
  reviewer: 'Reviewing electrician',
  coordinator: 'Permit coordinator',
}
