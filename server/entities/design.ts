import { EntitySchema } from 'typeorm'
import type { Evaluation } from '../../shared/electrical/evaluate'
import type { NecEdition, Status } from '../../shared/electrical/types'
import type { DesignDocument, SystemKind } from '../../shared/schemas/design'

/**
 * The working design of a project: the validated design document, a few columns taken from it
 * for lists and reports, and the server's last evaluation of it.
 */
export interface Design {
  id: string
  organizationId: string
  projectId: string
  document: DesignDocument
  schemaVersion: number
  systemKind: SystemKind
  necEdition: NecEdition
  moduleCount: number
  /** Sum of module nameplate power at STC [W]. */
  dcWattsStc: number
  evaluation: Evaluation | null
  evaluationStatus: Status | null
  /** The design version the stored evaluation was computed for. */
  evaluatedVersion: number | null
  evaluatedAt: Date | null
  updatedBy: string | null
  createdAt: Date
  updatedAt: Date
  version: number
}

export const DesignEntity = new EntitySchema<Design>({
  name: 'Design',
  tableName: 'designs',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    projectId: { name: 'project_id', type: 'uuid', unique: true },
    document: { type: 'jsonb' },
    schemaVersion: { name: 'schema_version', type: 'integer' },
    systemKind: { name: 'system_kind', type: 'text' },
    necEdition: { name: 'nec_edition', type: 'integer' },
    moduleCount: { name: 'module_count', type: 'integer' },
    dcWattsStc: { name: 'dc_watts_stc', type: 'double precision' },
    evaluation: { type: 'jsonb', nullable: true },
    evaluationStatus: { name: 'evaluation_status', type: 'text', nullable: true },
    evaluatedVersion: { name: 'evaluated_version', type: 'integer', nullable: true },
    evaluatedAt: { name: 'evaluated_at', type: 'timestamptz', nullable: true },
    updatedBy: { name: 'updated_by', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    updatedAt: { name: 'updated_at', type: 'timestamptz', updateDate: true },
    version: { type: 'integer', version: true },
  },
})
