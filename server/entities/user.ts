import { EntitySchema } from 'typeorm'
import type { Role } from '../../shared/auth/roles'

export interface User {
  id: string
  organizationId: string
  /** Stored lower-case; unique across the whole system. */
  email: string
  name: string
  role: Role
  passwordHash: string
  active: boolean
  /** Reviewer licence: number, issuing state or region, expiry (YYYY-MM-DD). */
  licenceNumber: string | null
  licenceRegion: string | null
  licenceExpiry: string | null
  createdAt: Date
  updatedAt: Date
  version: number
}

export const UserEntity = new EntitySchema<User>({
  name: 'User',
  tableName: 'users',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    email: { type: 'text', unique: true },
    name: { type: 'text' },
    role: { type: 'text' },
    passwordHash: { name: 'password_hash', type: 'text' },
    active: { type: 'boolean', default: true },
    licenceNumber: { name: 'licence_number', type: 'text', nullable: true },
    licenceRegion: { name: 'licence_region', type: 'text', nullable: true },
    licenceExpiry: { name: 'licence_expiry', type: 'date', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    updatedAt: { name: 'updated_at', type: 'timestamptz', updateDate: true },
    version: { type: 'integer', version: true },
  },
})
