import { EntitySchema } from 'typeorm'
import type { ProjectStatus } from '../../shared/schemas/project'
import type { TimelineEvent } from '../../shared/workflow'

/** One step of a project through the permit-set workflow: the project timeline. Rows are never changed. */
export interface ProjectTransition {
  id: string
  /** Orders rows made in the same instant. */
  seq: string
  organizationId: string
  projectId: string
  actorId: string | null
  event: TimelineEvent
  fromStatus: ProjectStatus
  toStatus: ProjectStatus
  note: string | null
  revisionId: string | null
  createdAt: Date
}

export const ProjectTransitionEntity = new EntitySchema<ProjectTransition>({
  name: 'ProjectTransition',
  tableName: 'project_transitions',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    seq: { type: 'bigint', insert: false, update: false },
    organizationId: { name: 'organization_id', type: 'uuid' },
    projectId: { name: 'project_id', type: 'uuid' },
    actorId: { name: 'actor_id', type: 'uuid', nullable: true },
    event: { type: 'text' },
    fromStatus: { name: 'from_status', type: 'text' },
    toStatus: { name: 'to_status', type: 'text' },
    note: { type: 'text', nullable: true },
    revisionId: { name: 'revision_id', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
