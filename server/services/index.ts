import type { DataSource } from 'typeorm'
import type { SignedInUsers } from '../auth/signed-in-users'
import type { AppConfig } from '../config'
import { MailQueue } from '../jobs/mail-queue'
import { connectionStringOf, PackageQueue } from '../jobs/queue'
import { createFileStorage } from '../storage'
import { AuditService } from './audit-service'
import { AuthService } from './auth-service'
import { DesignService } from './design-service'
import { EquipmentService } from './equipment-service'
import { HealthService } from './health-service'
import { JurisdictionService } from './jurisdiction-service'
import { NotificationService } from './notification-service'
import { ProjectService } from './project-service'
import { ReviewService } from './review-service'
import { RevisionService } from './revision-service'
import { StampService } from './stamp-service'
import { SubmissionService } from './submission-service'
import { UploadService } from './upload-service'
import { UserService } from './user-service'
import { WorkflowService } from './workflow-service'

/** The domain services of one app instance, built once over its data source. */
export interface Services {
  audit: AuditService
  auth: AuthService
  health: HealthService
  users: UserService
  jurisdictions: JurisdictionService
  projects: ProjectService
  designs: DesignService
  uploads: UploadService
  equipment: EquipmentService
  revisions: RevisionService
  workflow: WorkflowService
  notifications: NotificationService
  stamps: StampService
  reviews: ReviewService
  submissions: SubmissionService
}

/**
 * `queue` is where generations are sent; by default one is made over the same database, started on
 * first use. `signedIn` keeps the users of bearer tokens between requests (API processes start one).
 */
export function createServices(db: DataSource, config: AppConfig, queue = new PackageQueue(connectionStringOf(db), config.jobs, 'api'), signedIn?: SignedInUsers): Services {
  const audit = new AuditService(db)
  const users = new UserService(db, audit, config.bcryptCost, signedIn)
  const jurisdictions = new JurisdictionService(db, audit)
  const projects = new ProjectService(db, audit, jurisdictions)
  const storage = createFileStorage(config)
  const uploads = new UploadService(db, storage)
  const workflow = new WorkflowService(db, audit, projects)
  const submissions = new SubmissionService(db, audit, projects, uploads, workflow)
  return {
    audit,
    users,
    auth: new AuthService(db, config, users, audit, signedIn),
    health: new HealthService(db),
    jurisdictions,
    projects,
    designs: new DesignService(db, audit, projects, workflow),
    uploads,
    equipment: new EquipmentService(db, audit, uploads, config),
    revisions: new RevisionService(db, audit, projects, storage, queue),
    workflow,
    notifications: new NotificationService(db, config, new MailQueue(queue, config.jobs), workflow, submissions),
    stamps: new StampService(db, audit, uploads, storage, config, workflow),
    reviews: new ReviewService(db, audit, projects, workflow),
    submissions,
  }
}
