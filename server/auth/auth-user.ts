import type { Role } from '../../shared/auth/roles'

/** The caller of a request, as loaded from the database for every request. */
export interface AuthUser {
  id: string
  organizationId: string
  email: string
  name: string
  role: Role
}
