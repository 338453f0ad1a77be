import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Tells API processes when a user row changes, so each may keep the users it has seen on tokens
 * and still apply a deactivation or role change at once (server/auth/signed-in-users.ts).
 */
export class UsersChanged1765065600000 implements MigrationInterface {
  name = 'UsersChanged1765065600000'

  async up(q: QueryRunner): Promise<void> {
    // written out, not imported: a migration keeps meaning what it meant when it ran
    await q.query(`
      CREATE FUNCTION users_notify_changed() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM pg_notify('stringline_users_changed', OLD.id::text);
        RETURN NULL;
      END
      $$`)
    await q.query(`CREATE TRIGGER users_changed AFTER UPDATE OR DELETE ON users FOR EACH ROW EXECUTE FUNCTION users_notify_changed()`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER users_changed ON users`)
    await q.query(`DROP FUNCTION users_notify_changed()`)
  }
}
