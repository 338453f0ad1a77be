import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Review comments on plan-set revisions and their threads of replies. */
export class ReviewComments1764979440000 implements MigrationInterface {
  name = 'ReviewComments1764979440000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE review_comments (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE RESTRICT,
        revision_id uuid NOT NULL REFERENCES plan_set_revisions(id) ON DELETE RESTRICT,
        anchor_kind text NOT NULL CHECK (anchor_kind IN ('general', 'sheet', 'circuit')),
        anchor_ref text,
        body text NOT NULL CHECK (length(body) BETWEEN 1 AND 4000),
        author_id uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        resolved_at timestamptz,
        resolved_by uuid REFERENCES users(id) ON DELETE SET NULL,
        CONSTRAINT review_comments_anchor_ref CHECK ((anchor_kind = 'general') = (anchor_ref IS NULL))
      )`)
    await q.query(`CREATE INDEX review_comments_project_idx ON review_comments (project_id, created_at DESC)`)
    await q.query(`CREATE INDEX review_comments_open_idx ON review_comments (project_id) WHERE resolved_at IS NULL`)
    await q.query(`
      CREATE TABLE review_replies (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        comment_id uuid NOT NULL REFERENCES review_comments(id) ON DELETE RESTRICT,
        body text NOT NULL CHECK (length(body) BETWEEN 1 AND 4000),
        author_id uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`CREATE INDEX review_replies_comment_idx ON review_replies (comment_id, created_at)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE review_replies`)
    await q.query(`DROP TABLE review_comments`)
  }
}
