import { EntitySchema } from 'typeorm'

/** One row per thing that happened: who, when, what, and for workflow steps from → to. */
export interface AuditEvent {
  id: string
  organizationId: string
  /** Null for events without a signed-in actor (e.g. a failed sign-in). */
  actorId: string | null
  action: string
  entityType: string
  entityId: string | null
  fromState: string | null
  toState: string | null
  note: string | null
  data: Record<string, unknown>
  createdAt: Date
}

export const AuditEventEntity = new EntitySchema<AuditEvent>({
  name: 'AuditEvent',
  tableName: 'audit_events',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    actorId: { name: 'actor_id', type: 'uuid', nullable: true },
    action: { type: 'text' },
    entityType: { name: 'entity_type', type: 'text' },
    entityId: { name: 'entity_id', type: 'text', nullable: true },
    fromState: { name: 'from_state', type: 'text', nullable: true },
    toState: { name: 'to_state', type: 'text', nullable: true },
    note: { type: 'text', nullable: true },
    data: { type: 'jsonb', default: () => "'{}'::jsonb" },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
