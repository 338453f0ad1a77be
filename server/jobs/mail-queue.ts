import type PgBoss from 'pg-boss'
import type { EntityManager } from 'typeorm'
import type { NotificationCategory } from '../../shared/schemas/notifications'
import type { DueItemDto } from '../../shared/schemas/submission'
import type { AppConfig } from '../config'
import { inTransaction, type PackageQueue } from './queue'

/** One mail to one user per job, so a failure retries that mail alone. */
export const MAIL_QUEUE = 'mail.send'
/** The cron-scheduled job that puts the daily digest mails on MAIL_QUEUE. */
export const DIGEST_QUEUE = 'mail.digest'
/** A failing SMTP server is retried for a while (doubling waits) before the mail is given up. */
const MAIL_RETRY_LIMIT = 6

export type MailJobData =
  | { kind: 'step'; category: Exclude<NotificationCategory, 'daily_digest'>; recipientId: string; transitionId: string }
  | { kind: 'digest'; recipientId: string; today: string; horizonDays: number; items: DueItemDto[] }

/** The mail queues, on the same pg-boss as plan-set generation (one pool per process). */
export class MailQueue {
  private ready?: Promise<PgBoss>

  constructor(
    private readonly queue: PackageQueue,
    private readonly jobs: AppConfig['jobs'],
  ) {}

  boss(): Promise<PgBoss> {
    this.ready ??= this.queue.boss().then((boss) =>
      this.queue.settingUp(async () => {
        const policy = { name: MAIL_QUEUE, retryLimit: MAIL_RETRY_LIMIT, retryDelay: this.jobs.retryDelaySeconds, retryBackoff: true, expireInSeconds: 120 }
        await boss.createQueue(MAIL_QUEUE, policy)
        await boss.updateQueue(MAIL_QUEUE, policy)
        await boss.createQueue(DIGEST_QUEUE, { name: DIGEST_QUEUE, retryLimit: 2, expireInSeconds: 600 })
        return boss
      }),
    )
    this.ready.catch(() => (this.ready = undefined))
    return this.ready
  }

  /** Queues mails; with `manager`, inside that transaction, so they go only if it commits. */
  async send(mails: MailJobData[], manager?: EntityManager): Promise<void> {
    if (!mails.length) return
    const boss = await this.boss()
    const options = manager ? { db: inTransaction(manager) } : {}
    for (const data of mails) {
      const id = await boss.send(MAIL_QUEUE, data, options)
      if (!id) throw new Error(`the queue ${MAIL_QUEUE} refused the job`)
    }
  }
}
