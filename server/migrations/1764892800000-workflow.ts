import type { MigrationInterface, QueryRunner } from 'typeorm'

// written out, not imported: a migration must keep meaning what it meant when it ran
const STATUSES = `'draft', 'in_review', 'changes_requested', 'stamped', 'submitted', 'ahj_corrections', 'resubmitted', 'permit_issued', 'closed', 'withdrawn'`
const EVENTS = `'request_review', 'request_changes', 'approve_and_stamp', 'record_submission', 'record_corrections', 'record_resubmittal',
  'record_permit', 'close', 'withdraw', 'design_reopened'`

/** The project timeline: one row per workflow step, never changed afterwards. */
export class Workflow1764892800000 implements MigrationInterface {
  name = 'Workflow1764892800000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE project_transitions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seq bigint GENERATED ALWAYS AS IDENTITY,
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
        event text NOT NULL CHECK (event IN (${EVENTS})),
        from_status text NOT NULL CHECK (from_status IN (${STATUSES})),
        to_status text NOT NULL CHECK (to_status IN (${STATUSES})),
        note text CHECK (length(note) <= 2000),
        revision_id uuid REFERENCES plan_set_revisions(id) ON DELETE RESTRICT,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`CREATE INDEX project_transitions_project_idx ON project_transitions (project_id, seq DESC)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE project_transitions`)
  }
}
