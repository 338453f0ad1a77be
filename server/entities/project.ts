import { EntitySchema } from 'typeorm'
import type { SystemKind } from '../../shared/schemas/design'
import type { ProjectStatus } from '../../shared/schemas/project'

/** One permit job: the customer, the site, the AHJ, who works on it and where it stands. */
export interface Project {
  id: string
  organizationId: string
  code: string
  name: string
  customerName: string
  customerEmail: string | null
  customerPhone: string | null
  siteAddress: string
  siteCity: string
  jurisdictionId: string | null
  utility: string | null
  systemKind: SystemKind
  status: ProjectStatus
  designerId: string | null
  reviewerId: string | null
  coordinatorId: string | null
  /** YYYY-MM-DD. */
  targetSubmissionDate: string | null
  archivedAt: Date | null
  createdBy: string | null
  createdAt: Date
  updatedAt: Date
  version: number
}

export const ProjectEntity = new EntitySchema<Project>({
  name: 'Project',
  tableName: 'projects',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    code: { type: 'text' },
    name: { type: 'text' },
    customerName: { name: 'customer_name', type: 'text' },
    customerEmail: { name: 'customer_email', type: 'text', nullable: true },
    customerPhone: { name: 'customer_phone', type: 'text', nullable: true },
    siteAddress: { name: 'site_address', type: 'text' },
    siteCity: { name: 'site_city', type: 'text' },
    jurisdictionId: { name: 'jurisdiction_id', type: 'uuid', nullable: true },
    utility: { type: 'text', nullable: true },
    systemKind: { name: 'system_kind', type: 'text' },
    status: { type: 'text', default: 'draft' },
    designerId: { name: 'designer_id', type: 'uuid', nullable: true },
    reviewerId: { name: 'reviewer_id', type: 'uuid', nullable: true },
    coordinatorId: { name: 'coordinator_id', type: 'uuid', nullable: true },
    targetSubmissionDate: { name: 'target_submission_date', type: 'date', nullable: true },
    archivedAt: { name: 'archived_at', type: 'timestamptz', nullable: true },
    createdBy: { name: 'created_by', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    updatedAt: { name: 'updated_at', type: 'timestamptz', updateDate: true },
    version: { type: 'integer', version: true },
  },
})
