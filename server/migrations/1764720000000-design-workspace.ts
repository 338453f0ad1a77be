import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Jurisdiction profiles, projects, stored files, the equipment library and working designs. */
export class DesignWorkspace1764720000000 implements MigrationInterface {
  name = 'DesignWorkspace1764720000000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE jurisdiction_profiles (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        name text NOT NULL,
        nec_edition integer NOT NULL CHECK (nec_edition IN (2017, 2020, 2023)),
        design_low_c double precision NOT NULL,
        design_high_c double precision NOT NULL,
        sheet_size text NOT NULL DEFAULT 'ANSI_B' CHECK (sheet_size IN ('ANSI_B', 'ANSI_D', 'A3')),
        required_labels jsonb NOT NULL DEFAULT '[]'::jsonb,
        general_notes_template text NOT NULL DEFAULT '',
        submission_method text NOT NULL CHECK (submission_method IN ('portal', 'email', 'counter')),
        submission_contact text,
        submission_email text,
        submission_phone text,
        submission_url text,
        submission_address text,
        fee_notes text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version integer NOT NULL DEFAULT 1,
        CHECK (design_low_c < design_high_c)
      )`)
    await q.query(`CREATE UNIQUE INDEX jurisdiction_profiles_org_name_key ON jurisdiction_profiles (organization_id, lower(name))`)

    await q.query(`
      CREATE TABLE projects (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        code text NOT NULL,
        name text NOT NULL,
        customer_name text NOT NULL,
        customer_email text,
        customer_phone text,
        site_address text NOT NULL,
        site_city text NOT NULL,
        jurisdiction_id uuid REFERENCES jurisdiction_profiles(id) ON DELETE RESTRICT,
        utility text,
        system_kind text NOT NULL CHECK (system_kind IN ('grid_tied', 'grid_tied_storage', 'off_grid', 'ground_mount_farm')),
        status text NOT NULL DEFAULT 'draft' CHECK (status IN ('draft', 'in_review', 'changes_requested', 'stamped', 'submitted',
          'ahj_corrections', 'resubmitted', 'permit_issued', 'closed', 'withdrawn')),
        designer_id uuid REFERENCES users(id) ON DELETE SET NULL,
        reviewer_id uuid REFERENCES users(id) ON DELETE SET NULL,
        coordinator_id uuid REFERENCES users(id) ON DELETE SET NULL,
        target_submission_date date,
        archived_at timestamptz,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version integer NOT NULL DEFAULT 1
      )`)
    await q.query(`CREATE UNIQUE INDEX projects_org_code_key ON projects (organization_id, lower(code))`)
    await q.query(`CREATE INDEX projects_org_status_idx ON projects (organization_id, status) WHERE archived_at IS NULL`)
    await q.query(`CREATE INDEX projects_jurisdiction_idx ON projects (jurisdiction_id)`)

    await q.query(`
      CREATE TABLE stored_files (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        sha256 text NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
        byte_size integer NOT NULL CHECK (byte_size > 0),
        media_type text NOT NULL,
        original_name text NOT NULL,
        uploaded_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`CREATE INDEX stored_files_sha256_idx ON stored_files (sha256)`)

    await q.query(`
      CREATE TABLE equipment_items (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        kind text NOT NULL CHECK (kind IN ('module', 'inverter', 'microinverter', 'optimizer', 'charge_controller',
          'battery', 'combiner', 'disconnect', 'transformer')),
        manufacturer text NOT NULL,
        model text NOT NULL,
        notes text NOT NULL DEFAULT '',
        spec jsonb NOT NULL,
        datasheet_file_id uuid REFERENCES stored_files(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version integer NOT NULL DEFAULT 1
      )`)
    await q.query(`CREATE UNIQUE INDEX equipment_items_org_kind_model_key ON equipment_items (organization_id, kind, lower(manufacturer), lower(model))`)

    await q.query(`
      CREATE TABLE designs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        project_id uuid NOT NULL UNIQUE REFERENCES projects(id) ON DELETE CASCADE,
        document jsonb NOT NULL,
        schema_version integer NOT NULL,
        system_kind text NOT NULL,
        nec_edition integer NOT NULL,
        module_count integer NOT NULL,
        dc_watts_stc double precision NOT NULL,
        evaluation jsonb,
        evaluation_status text CHECK (evaluation_status IN ('pass', 'warn', 'fail', 'info')),
        evaluated_version integer,
        evaluated_at timestamptz,
        updated_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version integer NOT NULL DEFAULT 1
      )`)
    await q.query(`CREATE INDEX designs_org_idx ON designs (organization_id, system_kind)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE designs`)
    await q.query(`DROP TABLE equipment_items`)
    await q.query(`DROP TABLE stored_files`)
    await q.query(`DROP TABLE projects`)
    await q.query(`DROP TABLE jurisdiction_profiles`)
  }
}
