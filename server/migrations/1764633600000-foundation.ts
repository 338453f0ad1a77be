import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Organisations, users, refresh tokens and the audit log. */
export class Foundation1764633600000 implements MigrationInterface {
  name = 'Foundation1764633600000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE organizations (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        name text NOT NULL,
        slug text NOT NULL UNIQUE,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`
      CREATE TABLE users (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        email text NOT NULL UNIQUE CHECK (email = lower(email)),
        name text NOT NULL,
        role text NOT NULL CHECK (role IN ('admin', 'designer', 'reviewer', 'coordinator')),
        password_hash text NOT NULL,
        active boolean NOT NULL DEFAULT true,
        licence_number text,
        licence_region text,
        licence_expiry date,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version integer NOT NULL DEFAULT 1
      )`)
    await q.query(`CREATE INDEX users_organization_idx ON users (organization_id)`)
    await q.query(`
      CREATE TABLE refresh_tokens (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        family_id uuid NOT NULL,
        token_hash text NOT NULL UNIQUE,
        expires_at timestamptz NOT NULL,
        revoked_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`CREATE INDEX refresh_tokens_family_idx ON refresh_tokens (family_id)`)
    await q.query(`
      CREATE TABLE audit_events (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE RESTRICT,
        actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
        action text NOT NULL,
        entity_type text NOT NULL,
        entity_id text,
        from_state text,
        to_state text,
        note text,
        data jsonb NOT NULL DEFAULT '{}'::jsonb,
        created_at timestamptz NOT NULL DEFAULT now()
      )`)
    await q.query(`CREATE INDEX audit_events_org_time_idx ON audit_events (organization_id, created_at DESC)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE audit_events`)
    await q.query(`DROP TABLE refresh_tokens`)
    await q.query(`DROP TABLE users`)
    await q.query(`DROP TABLE organizations`)
  }
}
