import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Submissions to the AHJ (one per project and stamped revision), their correction letters, and
 * one view of what is due, which the board, its filters and the reminders all read.
 */
export class Submissions1764979320000 implements MigrationInterface {
  name = 'Submissions1764979320000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE submissions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE RESTRICT,
        revision_id uuid NOT NULL REFERENCES plan_set_revisions(id) ON DELETE RESTRICT,
        method text NOT NULL CHECK (method IN ('portal', 'email', 'counter')),
        submitted_on date NOT NULL,
        ahj_reference text,
        fee_cents integer CHECK (fee_cents >= 0),
        fee_due_on date,
        fee_paid_on date,
        fee_receipt_file_id uuid REFERENCES stored_files(id) ON DELETE RESTRICT,
        permit_number text,
        permit_issued_on date,
        permit_expires_on date,
        inspection_on date,
        submitted_transition_id uuid NOT NULL REFERENCES project_transitions(id) ON DELETE RESTRICT,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version integer NOT NULL DEFAULT 1,
        CONSTRAINT submissions_permit_complete CHECK ((permit_number IS NULL) = (permit_issued_on IS NULL)),
        CONSTRAINT submissions_expiry_after_issue CHECK (permit_expires_on IS NULL OR permit_issued_on IS NULL OR permit_expires_on > permit_issued_on)
      )`)
    await q.query(`CREATE UNIQUE INDEX submissions_revision_key ON submissions (project_id, revision_id)`)
    await q.query(`CREATE INDEX submissions_org_project_idx ON submissions (organization_id, project_id, created_at DESC)`)
    await q.query(`
      CREATE TABLE correction_letters (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        submission_id uuid NOT NULL REFERENCES submissions(id) ON DELETE RESTRICT,
        round integer NOT NULL CHECK (round >= 1),
        received_on date NOT NULL,
        response_due_on date NOT NULL CHECK (response_due_on >= received_on),
        letter_file_id uuid NOT NULL REFERENCES stored_files(id) ON DELETE RESTRICT,
        items jsonb NOT NULL CHECK (jsonb_typeof(items) = 'array'),
        resubmitted_on date CHECK (resubmitted_on IS NULL OR resubmitted_on >= received_on),
        transition_id uuid NOT NULL REFERENCES project_transitions(id) ON DELETE RESTRICT,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`CREATE UNIQUE INDEX correction_letters_round_key ON correction_letters (submission_id, round)`)
    // the submission a project is on now is its newest; due dates of earlier ones are history
    await q.query(`
      CREATE VIEW submission_due_items AS
      WITH current_submission AS (
        SELECT DISTINCT ON (s.project_id) s.* FROM submissions s ORDER BY s.project_id, s.created_at DESC, s.id
      ), open_project AS (
        SELECT c.*, p.status FROM current_submission c JOIN projects p ON p.id = c.project_id
        WHERE p.archived_at IS NULL AND p.status NOT IN ('closed', 'withdrawn')
      )
      SELECT o.organization_id, o.project_id, 'corrections_response'::text AS kind, l.response_due_on AS due_on,
             (SELECT count(*) FROM jsonb_array_elements(l.items) i WHERE NOT (i ->> 'done')::boolean)::integer AS open_items,
             NULL::integer AS fee_cents, NULL::text AS permit_number
        FROM open_project o JOIN correction_letters l ON l.submission_id = o.id
        WHERE o.status = 'ahj_corrections' AND l.resubmitted_on IS NULL
      UNION ALL
      SELECT o.organization_id, o.project_id, 'fee_payment', o.fee_due_on, NULL, o.fee_cents, NULL
        FROM open_project o WHERE o.fee_cents IS NOT NULL AND o.fee_due_on IS NOT NULL AND o.fee_paid_on IS NULL
      UNION ALL
      SELECT o.organization_id, o.project_id, 'inspection', o.inspection_on, NULL, NULL, o.permit_number
        FROM open_project o WHERE o.status = 'permit_issued' AND o.inspection_on IS NOT NULL
      UNION ALL
      SELECT o.organization_id, o.project_id, 'permit_expiry', o.permit_expires_on, NULL, NULL, o.permit_number
        FROM open_project o WHERE o.status = 'permit_issued' AND o.permit_expires_on IS NOT NULL`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP VIEW submission_due_items`)
    await q.query(`DROP TABLE correction_letters`)
    await q.query(`DROP TABLE submissions`)
  }
}
