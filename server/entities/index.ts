import { AuditEventEntity } from './audit-event'
import { DesignEntity } from './design'
import { EquipmentItemEntity } from './equipment-item'
import { JurisdictionProfileEntity } from './jurisdiction-profile'
import { OrganizationEntity } from './organization'
import { PackageJobEntity } from './package-job'
import { PlanSetRevisionEntity } from './plan-set-revision'
import { ProjectEntity } from './project'
import { ProjectTransitionEntity } from './project-transition'
import { RefreshTokenEntity } from './refresh-token'
import { StoredFileEntity } from './stored-file'
import { UserEntity } from './user'

export {
  AuditEventEntity,
  DesignEntity,
  EquipmentItemEntity,
  JurisdictionProfileEntity,
  OrganizationEntity,
  PackageJobEntity,
  PlanSetRevisionEntity,
  ProjectEntity,
  ProjectTransitionEntity,
  RefreshTokenEntity,
  StoredFileEntity,
  UserEntity,
}
export type { AuditEvent } from './audit-event'
export type { Design } from './design'
export type { EquipmentItem } from './equipment-item'
export type { JurisdictionProfile } from './jurisdiction-profile'
export type { Organization } from './organization'
export type { PackageJob } from './package-job'
export type { PlanSetRevision } from './plan-set-revision'
export type { Project } from './project'
export type { ProjectTransition } from './project-transition'
export type { RefreshToken } from './refresh-token'
export type { StoredFile } from './stored-file'
export type { User } from './user'

export const ENTITIES = [
  OrganizationEntity,
  UserEntity,
  RefreshTokenEntity,
  AuditEventEntity,
  JurisdictionProfileEntity,
  ProjectEntity,
  StoredFileEntity,
  EquipmentItemEntity,
  DesignEntity,
  PlanSetRevisionEntity,
  PackageJobEntity,
  ProjectTransitionEntity,
]
