import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Columns a published revision never changes; later columns (e.g. a stamp) may be set beside them. */
const FROZEN_COLUMNS = [
  'id', 'organization_id', 'project_id', 'number', 'description', 'design_snapshot', 'design_version', 'engine_version',
  'nec_edition', 'evaluation', 'evaluation_status', 'sheet_size', 'package_name', 'package_sha256', 'package_bytes',
  'files', 'sheet_count', 'created_by', 'created_at',
]

/** Immutable plan-set revisions, and the background jobs that generate them. */
export class PlanSetRevisions1764806400000 implements MigrationInterface {
  name = 'PlanSetRevisions1764806400000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE plan_set_revisions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE RESTRICT,
        number integer NOT NULL CHECK (number >= 0),
        description text NOT NULL,
        design_snapshot jsonb NOT NULL,
        design_version integer NOT NULL,
        engine_version text NOT NULL,
        nec_edition integer NOT NULL CHECK (nec_edition IN (2017, 2020, 2023)),
        evaluation jsonb NOT NULL,
        evaluation_status text NOT NULL CHECK (evaluation_status IN ('pass', 'warn', 'fail', 'info')),
        sheet_size text NOT NULL,
        package_name text NOT NULL,
        package_sha256 text NOT NULL CHECK (package_sha256 ~ '^[0-9a-f]{64}$'),
        package_bytes integer NOT NULL CHECK (package_bytes > 0),
        files jsonb NOT NULL,
        sheet_count integer NOT NULL CHECK (sheet_count > 0),
        created_by uuid REFERENCES users(id) ON DELETE RESTRICT,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`CREATE UNIQUE INDEX plan_set_revisions_project_number_key ON plan_set_revisions (project_id, number)`)
    await q.query(`CREATE INDEX plan_set_revisions_org_idx ON plan_set_revisions (organization_id)`)
    // what was issued stays as issued: the database refuses, whatever the application does
    await q.query(`
      CREATE FUNCTION plan_set_revisions_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'DELETE' THEN
          RAISE EXCEPTION 'plan-set revision % of project % is immutable: it cannot be deleted', OLD.number, OLD.project_id
            USING ERRCODE = 'restrict_violation';
        END IF;
        IF (${FROZEN_COLUMNS.map((c) => `OLD.${c}`).join(', ')}) IS DISTINCT FROM (${FROZEN_COLUMNS.map((c) => `NEW.${c}`).join(', ')}) THEN
          RAISE EXCEPTION 'plan-set revision % of project % is immutable: its published columns cannot change', OLD.number, OLD.project_id
            USING ERRCODE = 'restrict_violation';
        END IF;
        RETURN NEW;
      END
      $$`)
    await q.query(`
      CREATE TRIGGER plan_set_revisions_immutable BEFORE UPDATE OR DELETE ON plan_set_revisions
      FOR EACH ROW EXECUTE FUNCTION plan_set_revisions_refuse_change()`)

    await q.query(`
      CREATE TABLE package_jobs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        requested_by uuid REFERENCES users(id) ON DELETE SET NULL,
        design_version integer NOT NULL,
        description text NOT NULL,
        state text NOT NULL DEFAULT 'queued' CHECK (state IN ('queued', 'running', 'failed', 'completed')),
        step text NOT NULL DEFAULT 'queued'
          CHECK (step IN ('queued', 'evaluating', 'drawing', 'attachments', 'labels', 'packing', 'publishing', 'done')),
        progress integer NOT NULL DEFAULT 0 CHECK (progress BETWEEN 0 AND 100),
        error text,
        attempts integer NOT NULL DEFAULT 0,
        revision_id uuid REFERENCES plan_set_revisions(id) ON DELETE RESTRICT,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK ((state = 'completed') = (revision_id IS NOT NULL))
      )`)
    // one generation at a time per project: a second request finds the first one's row
    await q.query(`CREATE UNIQUE INDEX package_jobs_one_active_key ON package_jobs (project_id) WHERE state IN ('queued', 'running')`)
    await q.query(`CREATE INDEX package_jobs_project_idx ON package_jobs (project_id, created_at DESC)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE package_jobs`)
    await q.query(`DROP TABLE plan_set_revisions`)
    await q.query(`DROP FUNCTION plan_set_revisions_refuse_change()`)
  }
}
