import { z } from 'zod'
import { ROLES } from '../auth/roles'

/** Request and response shapes of sign-in and user administration, shared by client and server. */

const email = z.email({ message: 'Enter a valid e-mail address' }).max(254).transform((v) => v.toLowerCase())
const personName = z.string().trim().min(1, 'Enter a name').max(120)
/** Passwords: long rather than clever (NIST SP 800-63B favours length over composition rules). */
export const PASSWORD_MIN_LENGTH = 12
const password = z.string().min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`).max(200)
const isoDate = z.iso.date({ message: 'Use a date as YYYY-MM-DD' })
/** Forms hold '' until a role is picked: say so rather than list the allowed values. */
const role = z.enum(ROLES, { error: 'Choose a role' })

export const loginBody = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').max(254).transform((v) => v.toLowerCase()),
  password: z.string().min(1, 'Enter your password').max(200),
})
export type LoginBody = z.infer<typeof loginBody>

export const createUserBody = z.object({
  email,
  name: personName,
  role,
  password,
  licenceNumber: z.string().trim().max(60).nullable().optional(),
  licenceRegion: z.string().trim().max(60).nullable().optional(),
  licenceExpiry: isoDate.nullable().optional(),
})
export type CreateUserBody = z.infer<typeof createUserBody>

export const updateUserBody = z
  .object({
    name: personName,
    role,
    active: z.boolean(),
    licenceNumber: z.string().trim().max(60).nullable(),
    licenceRegion: z.string().trim().max(60).nullable(),
    licenceExpiry: isoDate.nullable(),
  })
  .partial()
  .strict()
export type UpdateUserBody = z.infer<typeof updateUserBody>

export const USER_SORTS = ['name', '-name', 'email', '-email', 'role', '-role', 'createdAt', '-createdAt'] as const

/** What the API tells about a user: never the password hash. */
export interface UserDto {
  id: string
  email: string
  name: string
  role: (typeof ROLES)[number]
  organizationId: string
  organizationName: string
  active: boolean
  licenceNumber: string | null
  licenceRegion: string | null
  licenceExpiry: string | null
  createdAt: string
}

/** Who is in the organisation, for assignments and filters: visible to every role. */
export const memberDto = z.object({
  id: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
})
export type MemberDto = z.infer<typeof memberDto>
