import pg from 'pg'
import PgBoss from 'pg-boss'
import type { DataSource, EntityManager } from 'typeorm'
import type { AppConfig } from '../config'

/** The queue of plan-set generations. */
export const GENERATE_QUEUE = 'plan-set.generate'
/** Where pg-boss moves a generation after its last attempt failed or expired, so its row can say so. */
export const LOST_GENERATIONS_QUEUE = 'plan-set.generate.lost'
/** pg-boss keeps its tables apart from ours. */
const QUEUE_SCHEMA = 'pgboss'
/** Advisory lock key ("STLQ") held while a process makes or updates the queues. */
const QUEUE_SETUP_LOCK = 0x53544c51

export interface GenerateJobData {
  packageJobId: string
}

/** The database URL a TypeORM data source was made with: pg-boss opens its own small pool on it. */
export function connectionStringOf(db: DataSource): string {
  const url = (db.options as { url?: string }).url
  if (!url) throw new Error('the data source has no url; pg-boss needs one')
  return url
}

/** Lets pg-boss write inside one of our transactions. */
export function inTransaction(manager: EntityManager): PgBoss.Db {
  return {
    executeSql: async (text, values) => {
      const result = await manager.queryRunner!.query(text, values, true)
      return { rows: result.records }
    },
  }
}

/**
 * pg-boss on the app's database, started on first use. An API process only sends
 * (`supervise: false`); a worker also looks after expired jobs.
 */
export class PackageQueue {
  private starting?: Promise<PgBoss>

  constructor(
    private readonly connectionString: string,
    private readonly jobs: AppConfig['jobs'],
    private readonly role: 'api' | 'worker',
    private readonly onError: (err: Error) => void = () => {},
  ) {}

  boss(): Promise<PgBoss> {
    this.starting ??= this.start()
    return this.starting
  }

  private async start(): Promise<PgBoss> {
    const boss = new PgBoss({
      connectionString: this.connectionString,
      schema: QUEUE_SCHEMA,
      application_name: `stringline-${this.role}`,
      max: 3,
      supervise: this.role === 'worker',
      maintenanceIntervalSeconds: this.jobs.maintenanceSeconds,
      // cron schedules (the daily digest) are kept by workers only
      schedule: this.role === 'worker',
    })
    boss.on('error', this.onError)
    await this.settingUp(async () => {
      await boss.start()
      await boss.createQueue(LOST_GENERATIONS_QUEUE)
      const policy = {
        name: GENERATE_QUEUE,
        retryLimit: this.jobs.retryLimit,
        retryDelay: this.jobs.retryDelaySeconds,
        expireInSeconds: this.jobs.expireSeconds,
        deadLetter: LOST_GENERATIONS_QUEUE,
      }
      await boss.createQueue(GENERATE_QUEUE, policy)
      // a queue made by an earlier start keeps its settings unless told the new ones
      await boss.updateQueue(GENERATE_QUEUE, policy)
    })
    return boss
  }

  /**
   * Runs `setup` (making or updating queues) while this process holds the queue-setup advisory
   * lock: processes starting together on a fresh database otherwise deadlock inside pg-boss's
   * queue creation. Ending the lock's own connection releases it, also when `setup` fails.
   */
  async settingUp<T>(setup: () => Promise<T>): Promise<T> {
    const lock = new pg.Client({ connectionString: this.connectionString, application_name: `stringline-${this.role}-setup` })
    await lock.connect()
    try {
      await lock.query('SELECT pg_advisory_lock($1)', [QUEUE_SETUP_LOCK])
      return await setup()
    } finally {
      await lock.end()
    }
  }

  /** Queues a generation; with `manager`, inside that transaction, so a rollback takes the job back too. */
  async send(data: GenerateJobData, manager?: EntityManager): Promise<void> {
    const boss = await this.boss()
    const id = await boss.send(GENERATE_QUEUE, data, manager ? { db: inTransaction(manager) } : {})
    if (!id) throw new Error(`the queue ${GENERATE_QUEUE} refused the job`)
  }

  /** `graceful` lets a job in hand finish (up to 10 s) before the connections close. */
  async stop(graceful = false): Promise<void> {
    if (!this.starting) return
    const boss = await this.starting.catch(() => null)
    this.starting = undefined
    await boss?.stop({ graceful, wait: true, timeout: 10_000 })
  }
}
