import { AuditEventEntity } from './audit-event'
import { OrganizationEntity } from './organization'
import { RefreshTokenEntity } from './refresh-token'
import { UserEntity } from './user'

export { AuditEventEntity, OrganizationEntity, RefreshTokenEntity, UserEntity }
export type { AuditEvent } from './audit-event'
export type { Organization } from './organization'
export type { RefreshToken } from './refresh-token'
export type { User } from './user'

export const ENTITIES = [OrganizationEntity, UserEntity, RefreshTokenEntity, AuditEventEntity]
