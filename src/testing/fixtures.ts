import type { Role } from '@shared/auth/roles'
import type { AuthSession, User } from '@/api/types'

/** Demo members of an invented installer, for specs only. */
export function aMember(role: Role, overrides: Partial<User> = {}): User {
  return {
    id: `7a0c4e5e-1b2d-4c3f-9e8a-00000000000${['admin', 'designer', 'reviewer', 'coordinator'].indexOf(role)}`,
    email: `${role}@kestrelfen-solar.example`,
    name: { admin: 'Odile Marsh', designer: 'Ines Okafor', reviewer: 'Tobias Wren', coordinator: 'Priya Calder' }[role],
    role,
    organizationId: '0b8e6b1c-7d3e-4a4f-8c55-1f0a2d9e6c11',
    organizationName: 'Kestrel Fen Solar Co-op',
    active: true,
    licenceNumber: null,
    licenceRegion: null,
    licenceExpiry: null,
    createdAt: '2026-03-02T15:04:05.000Z',
    ...overrides,
  }
}

export const sessionOf = (user: User): AuthSession => ({ token: `token-for-${user.role}`, user })

export const jsonResponse = (status: number, body: unknown): Response =>
  new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } })

export const errorResponse = (status: number, code: string, message: string, fields?: { field: string; message: string }[]) =>
  jsonResponse(status, { error: { code, message, ...(fields ? { fields } : {}) } })
