import type { LocationQueryValue } from 'vue-router'
import type { Role } from '@shared/auth/roles'
import type { RouteAccess } from './routes'

export function canOpen(access: RouteAccess, role: Role | undefined): boolean {
  return access === 'public' || (role !== undefined && access.includes(role))
}

/**
 * The `?next=` target after sign-in, only when it is a path inside this app: an absolute or
 * protocol-relative URL would let a crafted link send the user to another site.
 */
export function safeNextPath(next: LocationQueryValue | LocationQueryValue[] | undefined): string | null {
  const value = Array.isArray(next) ? next[0] : next
  if (typeof value !== 'string' || !value.startsWith('/')) return null
  if (value.startsWith('//') || value.startsWith('/\\') || value.startsWith('/sign-in')) return null
  return value
}
