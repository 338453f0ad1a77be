import { randomBytes } from 'node:crypto'
import { mkdtempSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import type { Express } from 'express'
import { pino } from 'pino'
import request from 'supertest'
import type { DataSource } from 'typeorm'
import { inject } from 'vitest'
import { dropDatabase, ensureDatabase } from '../../../scripts/lib/postgres-cluster'
import { createApp } from '../../../server/app'
import { hashPassword } from '../../../server/auth/passwords'
import { loadConfig, type AppConfig } from '../../../server/config'
import { createDataSource } from '../../../server/db/data-source'
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from '../../../server/demo/seed'
import { OrganizationEntity, UserEntity } from '../../../server/entities'
import { PackageQueue } from '../../../server/jobs/queue'
import { startPackageWorker, type RunningWorker } from '../../../server/jobs/worker'
import { readCaughtMail, readMailbox, startFakeSmtp, type CaughtMail } from '../../../server/mail/fake-smtp'
import { createFileStorage } from '../../../server/storage'
import type { Role } from '../../../shared/auth/roles'

/** A database URL on the test server with another database name. */
export function withDatabase(url: string, name: string): string {
  const u = new URL(url)
  u.pathname = `/${name}`
  return u.toString()
}

export function testConfig(overrides: Record<string, string> = {}): AppConfig {
  return loadConfig({
    NODE_ENV: 'test',
    JWT_SECRET: randomBytes(32).toString('hex'),
    DATA_DIR: mkdtempSync(path.join(os.tmpdir(), 'stringline-data-')),
    CLIENT_DIR: path.join(os.tmpdir(), 'stringline-no-client'),
    LOGIN_LIMIT_PER_IP: '1000',
    ...overrides,
  })
}

export interface Harness {
  app: Express
  db: DataSource
  config: AppConfig
  /** URL of this harness's own database (for worker child processes). */
  databaseUrl: string
  /** With `mail: true`: every message the fake SMTP server caught, oldest first. */
  mailbox(): CaughtMail[]
  close(): Promise<void>
}

/** Queue settings short enough that retries and lost workers show within seconds. */
export const FAST_JOBS = { JOB_EXPIRE_SECONDS: '10', JOB_RETRY_DELAY_SECONDS: '1', JOB_MAINTENANCE_SECONDS: '1', JOB_POLL_SECONDS: '1' }

/**
 * A fresh database with every migration applied, and the app over it. `worker: true` also runs a
 * plan-set worker in this process, so generations requested through the app complete (and queued
 * mails are sent). `mail: true` starts a fake SMTP server on loopback, points SMTP_* and MAILBOX_DIR at it.
 */
export interface HarnessOptions { worker?: boolean; mail?: boolean }

export async function startHarness(overrides: Record<string, string> = {}, options: HarnessOptions = {}): Promise<Harness> {
  const adminUrl = inject('adminDatabaseUrl')
  const name = `sl_test_${randomBytes(6).toString('hex')}`
  await ensureDatabase(adminUrl, name)
  const databaseUrl = withDatabase(adminUrl, name)
  const db = createDataSource(databaseUrl)
  await db.initialize()
  await db.runMigrations()
  const smtp = options.mail ? await startFakeSmtp(mkdtempSync(path.join(os.tmpdir(), 'stringline-mailbox-'))) : undefined
  if (smtp) overrides = { SMTP_HOST: smtp.host, SMTP_PORT: String(smtp.port), MAILBOX_DIR: smtp.dir, ...overrides }
  const config = testConfig(overrides)
  const queue = new PackageQueue(databaseUrl, config.jobs, 'api')
  let worker: RunningWorker | undefined
  if (options.worker) worker = await startPackageWorker({ db, config, logger: pino({ level: 'silent' }) })
  return {
    app: createApp({ db, config, queue }),
    db,
    config,
    databaseUrl,
    mailbox() {
      if (!smtp) throw new Error('start the harness with { mail: true } to read its mailbox')
      const { dir } = smtp
      return readMailbox(dir).reverse().map((m) => readCaughtMail(dir, m.id)!)
    },
    async close() {
      await worker?.stop()
      await smtp?.stop()
      await queue.stop()
      await db.destroy()
      await dropDatabase(adminUrl, name)
    },
  }
}

export const demoEmail = (role: Role) => DEMO_USERS.find((u) => u.role === role)!.email

/** The demo organisation plus a second, foreign one ("Quillfeather Energy") with a user per role. */
export async function seedTwoOrganizations(h: Harness) {
  await seedDemo(h.db, h.config.bcryptCost, createFileStorage(h.config))
  const foreign = await h.db.getRepository(OrganizationEntity).save({ slug: 'quillfeather-energy', name: 'Quillfeather Energy' })
  const passwordHash = await hashPassword(DEMO_PASSWORD, h.config.bcryptCost)
  const roles: Role[] = ['admin', 'designer', 'reviewer', 'coordinator']
  const foreignUsers = await h.db.getRepository(UserEntity).save(
    roles.map((role) => ({ organizationId: foreign.id, email: `${role}@quillfeather.example`, name: `Quill ${role}`, role, passwordHash })),
  )
  return { foreign, foreignUsers }
}

export async function login(app: Express, email: string, password = DEMO_PASSWORD) {
  const res = await request(app).post('/api/auth/login').send({ email, password })
  if (res.status !== 200) throw new Error(`login ${email} answered ${res.status}: ${JSON.stringify(res.body)}`)
  return { token: res.body.token as string, user: res.body.user as { id: string; organizationId: string }, cookie: res.headers['set-cookie'] as unknown as string[] }
}

/** Signs in as each role of the demo organisation once. */
export async function tokensByRole(app: Express): Promise<Record<Role, string>> {
  const entries = await Promise.all(
    (['admin', 'designer', 'reviewer', 'coordinator'] as const).map(async (role) => [role, (await login(app, demoEmail(role))).token] as const),
  )
  return Object.fromEntries(entries) as Record<Role, string>
}
