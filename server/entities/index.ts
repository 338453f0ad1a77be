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
import { ReviewCommentEntity, ReviewReplyEntity } from './review-comment'
import { RevisionStampEntity } from './revision-stamp'
import { StoredFileEntity } from './stored-file'
import { CorrectionLetterEntity, SubmissionEntity } from './submission'
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
  ReviewCommentEntity,
  ReviewReplyEntity,
  RevisionStampEntity,
  StoredFileEntity,
  SubmissionEntity,
  CorrectionLetterEntity,
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
export type { ReviewComment, ReviewReply } from './review-comment'
export type { RevisionStamp } from './revision-stamp'
export type { StoredFile } from './stored-file'
export type { CorrectionItem, CorrectionLetter, Submission } from './submission'
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
  RevisionStampEntity,
  SubmissionEntity,
  CorrectionLetterEntity,
  ReviewCommentEntity,
  ReviewReplyEntity,
]
