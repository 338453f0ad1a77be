import { EntitySchema } from 'typeorm'
import type { PackageJobState, PackageStep } from '../../shared/schemas/revision'

/** One request to generate a plan set, as the designer follows it; the queue itself is pg-boss's. */
export interface PackageJob {
  id: string
  organizationId: string
  projectId: string
  requestedBy: string | null
  /** The design version the request was made at. */
  designVersion: number
  description: string
  state: PackageJobState
  step: PackageStep
  /** 0–100. */
  progress: number
  /** Why the last attempt failed, in words for the designer. */
  error: string | null
  attempts: number
  /** Set when published. */
  revisionId: string | null
  createdAt: Date
  updatedAt: Date
}

export const PackageJobEntity = new EntitySchema<PackageJob>({
  name: 'PackageJob',
  tableName: 'package_jobs',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    projectId: { name: 'project_id', type: 'uuid' },
    requestedBy: { name: 'requested_by', type: 'uuid', nullable: true },
    designVersion: { name: 'design_version', type: 'integer' },
    description: { type: 'text' },
    state: { type: 'text' },
    step: { type: 'text' },
    progress: { type: 'integer' },
    error: { type: 'text', nullable: true },
    attempts: { type: 'integer' },
    revisionId: { name: 'revision_id', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    updatedAt: { name: 'updated_at', type: 'timestamptz', updateDate: true },
  },
})
