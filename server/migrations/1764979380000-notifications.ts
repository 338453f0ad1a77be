import type { MigrationInterface, QueryRunner } from 'typeorm'

// written out, not imported: a migration must keep meaning what it meant when it ran
const CATEGORIES = `'review_requested', 'changes_requested', 'stamped', 'submitted', 'ahj_corrections', 'permit_issued', 'daily_digest'`

/** The e-mail categories each user has switched off. */
export class Notifications1764979380000 implements MigrationInterface {
  name = 'Notifications1764979380000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE users ADD COLUMN notification_opt_outs text[] NOT NULL DEFAULT '{}'
        CONSTRAINT users_notification_opt_outs_known CHECK (notification_opt_outs <@ ARRAY[${CATEGORIES}]::text[])`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE users DROP COLUMN notification_opt_outs`)
  }
}
