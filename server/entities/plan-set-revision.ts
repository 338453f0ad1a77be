import { EntitySchema } from 'typeorm'
import type { Evaluation } from '../../shared/electrical/evaluate'
import type { NecEdition, Status } from '../../shared/electrical/types'
import type { DesignDocument } from '../../shared/schemas/design'
import type { PackageFileDto } from '../../shared/schemas/revision'
import type { StampBox } from '../render/plan-set'

/**
 * One published plan set of a project: the design and evaluation it was drawn from and the package
 * in storage. Immutable (a trigger refuses changes); a new generation makes the next number.
 */
export interface PlanSetRevision {
  id: string
  organizationId: string
  projectId: string
  /** 0, 1, 2 … per project. */
  number: number
  description: string
  designSnapshot: DesignDocument
  designVersion: number
  engineVersion: string
  necEdition: NecEdition
  evaluation: Evaluation
  evaluationStatus: Status
  sheetSize: string
  packageName: string
  packageSha256: string
  packageBytes: number
  /** The files of the zip, each also kept in storage under its SHA-256. */
  files: PackageFileDto[]
  sheetCount: number
  /** Where each sheet's stamp box is in plan-set.pdf (empty for revisions published before they were recorded). */
  stampBoxes: StampBox[]
  createdBy: string | null
  createdAt: Date
}

export const PlanSetRevisionEntity = new EntitySchema<PlanSetRevision>({
  name: 'PlanSetRevision',
  tableName: 'plan_set_revisions',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    projectId: { name: 'project_id', type: 'uuid' },
    number: { type: 'integer' },
    description: { type: 'text' },
    designSnapshot: { name: 'design_snapshot', type: 'jsonb' },
    designVersion: { name: 'design_version', type: 'integer' },
    engineVersion: { name: 'engine_version', type: 'text' },
    necEdition: { name: 'nec_edition', type: 'integer' },
    evaluation: { type: 'jsonb' },
    evaluationStatus: { name: 'evaluation_status', type: 'text' },
    sheetSize: { name: 'sheet_size', type: 'text' },
    packageName: { name: 'package_name', type: 'text' },
    packageSha256: { name: 'package_sha256', type: 'text' },
    packageBytes: { name: 'package_bytes', type: 'integer' },
    files: { type: 'jsonb' },
    sheetCount: { name: 'sheet_count', type: 'integer' },
    stampBoxes: { name: 'stamp_boxes', type: 'jsonb' },
    createdBy: { name: 'created_by', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
