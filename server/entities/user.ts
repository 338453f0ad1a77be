import { EntitySchema } from 'typeorm'
import type { Role } from '../../shared/auth/roles'
import type { NotificationCategory } from '../../shared/schemas/notifications'

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
  /** Reviewer's stamp image (PNG in stored_files) and PKCS#12 signing certificate; its password is never kept. */
  stampImageFileId: string | null
  certificateFileId: string | null
  certificateCommonName: string | null
  certificateNotAfter: Date | null
  /** SHA-256 of the certificate (DER), lower-case hex. */
  certificateFingerprint: string | null
  certificateDemo: boolean | null
  /** E-mail categories the user switched off. */
  notificationOptOuts: NotificationCategory[]
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
    stampImageFileId: { name: 'stamp_image_file_id', type: 'uuid', nullable: true },
    certificateFileId: { name: 'certificate_file_id', type: 'uuid', nullable: true },
    certificateCommonName: { name: 'certificate_common_name', type: 'text', nullable: true },
    certificateNotAfter: { name: 'certificate_not_after', type: 'timestamptz', nullable: true },
    certificateFingerprint: { name: 'certificate_fingerprint', type: 'text', nullable: true },
    certificateDemo: { name: 'certificate_demo', type: 'boolean', nullable: true },
    notificationOptOuts: { name: 'notification_opt_outs', type: 'text', array: true, default: () => "'{}'" },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    updatedAt: { name: 'updated_at', type: 'timestamptz', updateDate: true },
    version: { type: 'integer', version: true },
  },
})
