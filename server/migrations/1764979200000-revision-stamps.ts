import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Every column of a stamp: once written, none of them changes. */
const STAMP_COLUMNS = [
  'id', 'organization_id', 'project_id', 'revision_id', 'verification_id', 'stamped_by', 'holder_name', 'licence_number', 'licence_region',
  'licence_expiry', 'certificate_common_name', 'certificate_fingerprint', 'certificate_demo', 'stamped_at', 'signed_pdf_sha256', 'signed_pdf_bytes',
  'package_name', 'package_sha256', 'package_bytes', 'files', 'transition_id',
]

/** The reviewer's stamp credentials on the user, and one signed stamp per plan-set revision. */
export class RevisionStamps1764979200000 implements MigrationInterface {
  name = 'RevisionStamps1764979200000'

  async up(q: QueryRunner): Promise<void> {
    // where each sheet's stamp box is on the published PDF; revisions published before this have none
    await q.query(`ALTER TABLE plan_set_revisions ADD COLUMN stamp_boxes jsonb NOT NULL DEFAULT '[]' CHECK (jsonb_typeof(stamp_boxes) = 'array')`)
    await q.query(`
      CREATE FUNCTION plan_set_revisions_keep_stamp_boxes() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF OLD.stamp_boxes IS DISTINCT FROM NEW.stamp_boxes THEN
          RAISE EXCEPTION 'plan-set revision % of project % is immutable: its stamp boxes cannot change', OLD.number, OLD.project_id USING ERRCODE = 'restrict_violation';
        END IF;
        RETURN NEW;
      END
      $$`)
    await q.query(`
      CREATE TRIGGER plan_set_revisions_stamp_boxes_immutable BEFORE UPDATE ON plan_set_revisions
      FOR EACH ROW EXECUTE FUNCTION plan_set_revisions_keep_stamp_boxes()`)
    await q.query(`
      ALTER TABLE users
        ADD COLUMN stamp_image_file_id uuid REFERENCES stored_files(id) ON DELETE RESTRICT,
        ADD COLUMN certificate_file_id uuid REFERENCES stored_files(id) ON DELETE RESTRICT,
        ADD COLUMN certificate_common_name text,
        ADD COLUMN certificate_not_after timestamptz,
        ADD COLUMN certificate_fingerprint text CHECK (certificate_fingerprint ~ '^[0-9a-f]{64}$'),
        ADD COLUMN certificate_demo boolean,
        ADD CONSTRAINT users_certificate_complete CHECK (
          (certificate_file_id IS NULL) = (certificate_common_name IS NULL)
          AND (certificate_file_id IS NULL) = (certificate_not_after IS NULL)
          AND (certificate_file_id IS NULL) = (certificate_fingerprint IS NULL)
          AND (certificate_file_id IS NULL) = (certificate_demo IS NULL))`)
    await q.query(`
      CREATE TABLE revision_stamps (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE RESTRICT,
        revision_id uuid NOT NULL REFERENCES plan_set_revisions(id) ON DELETE RESTRICT,
        verification_id text NOT NULL CHECK (verification_id ~ '^[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}$'),
        stamped_by uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
        holder_name text NOT NULL,
        licence_number text NOT NULL,
        licence_region text NOT NULL,
        licence_expiry date NOT NULL,
        certificate_common_name text NOT NULL,
        certificate_fingerprint text NOT NULL CHECK (certificate_fingerprint ~ '^[0-9a-f]{64}$'),
        certificate_demo boolean NOT NULL,
        stamped_at timestamptz NOT NULL,
        signed_pdf_sha256 text NOT NULL CHECK (signed_pdf_sha256 ~ '^[0-9a-f]{64}$'),
        signed_pdf_bytes integer NOT NULL CHECK (signed_pdf_bytes > 0),
        package_name text NOT NULL,
        package_sha256 text NOT NULL CHECK (package_sha256 ~ '^[0-9a-f]{64}$'),
        package_bytes integer NOT NULL CHECK (package_bytes > 0),
        files jsonb NOT NULL,
        transition_id uuid NOT NULL REFERENCES project_transitions(id) ON DELETE RESTRICT,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`CREATE UNIQUE INDEX revision_stamps_revision_key ON revision_stamps (revision_id)`)
    await q.query(`CREATE UNIQUE INDEX revision_stamps_verification_id_key ON revision_stamps (verification_id)`)
    await q.query(`CREATE INDEX revision_stamps_signed_pdf_idx ON revision_stamps (signed_pdf_sha256)`)
    await q.query(`CREATE INDEX revision_stamps_project_idx ON revision_stamps (project_id)`)
    // a stamp is a signed statement: the database refuses to change or remove it, whatever the application does
    await q.query(`
      CREATE FUNCTION revision_stamps_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'DELETE' THEN
          RAISE EXCEPTION 'stamp % is immutable: it cannot be deleted', OLD.verification_id USING ERRCODE = 'restrict_violation';
        END IF;
        IF (${STAMP_COLUMNS.map((c) => `OLD.${c}`).join(', ')}) IS DISTINCT FROM (${STAMP_COLUMNS.map((c) => `NEW.${c}`).join(', ')}) THEN
          RAISE EXCEPTION 'stamp % is immutable: its columns cannot change', OLD.verification_id USING ERRCODE = 'restrict_violation';
        END IF;
        RETURN NEW;
      END
      $$`)
    await q.query(`
      CREATE TRIGGER revision_stamps_immutable BEFORE UPDATE OR DELETE ON revision_stamps
      FOR EACH ROW EXECUTE FUNCTION revision_stamps_refuse_change()`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE revision_stamps`)
    await q.query(`DROP FUNCTION revision_stamps_refuse_change()`)
    await q.query(`DROP TRIGGER plan_set_revisions_stamp_boxes_immutable ON plan_set_revisions`)
    await q.query(`DROP FUNCTION plan_set_revisions_keep_stamp_boxes()`)
    await q.query(`ALTER TABLE plan_set_revisions DROP COLUMN stamp_boxes`)
    await q.query(`
      ALTER TABLE users DROP CONSTRAINT users_certificate_complete,
        DROP COLUMN stamp_image_file_id, DROP COLUMN certificate_file_id, DROP COLUMN certificate_common_name,
        DROP COLUMN certificate_not_after, DROP COLUMN certificate_fingerprint, DROP COLUMN certificate_demo`)
  }
}
