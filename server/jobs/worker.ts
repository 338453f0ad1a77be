import type { Logger } from 'pino'
import type { DataSource } from 'typeorm'
import type { AppConfig } from '../config'
import { Mailer } from '../mail/mailer'
import { createServices } from '../services'
import { createFileStorage } from '../storage'
import { PlanSetGenerator } from './generate-plan-set'
import { DIGEST_QUEUE, MAIL_QUEUE, MailQueue, type MailJobData } from './mail-queue'
import { connectionStringOf, GENERATE_QUEUE, LOST_GENERATIONS_QUEUE, PackageQueue, type GenerateJobData } from './queue'
import { utcDay } from '../calendar'

export interface RunningWorker {
  /** Finishes the job in hand (up to a few seconds), then stops taking jobs. */
  stop(): Promise<void>
}

/**
 * Takes plan-set generations off the queue, one at a time per worker, and marks the jobs pg-boss
 * gave up on as failed; also sends the queued mails and keeps the daily digest schedule. Several
 * workers (processes) may run against one database.
 */
export async function startPackageWorker(deps: { db: DataSource; config: AppConfig; logger: Logger }): Promise<RunningWorker> {
  const { db, config, logger } = deps
  const generator = new PlanSetGenerator({ db, storage: createFileStorage(config), config, logger })
  const queue = new PackageQueue(connectionStringOf(db), config.jobs, 'worker', (err) => logger.error({ err }, 'queue error'))
  const boss = await queue.boss()
  const pollingIntervalSeconds = config.jobs.pollSeconds
  await boss.work<GenerateJobData>(GENERATE_QUEUE, { includeMetadata: true, batchSize: 1, pollingIntervalSeconds }, async ([job]) => {
    if (!job) return
    logger.info({ packageJobId: job.data.packageJobId, retry: job.retryCount }, 'generating a plan set')
    await generator.run(job.data.packageJobId, { retryCount: job.retryCount, retryLimit: job.retryLimit })
  })
  await boss.work<GenerateJobData>(LOST_GENERATIONS_QUEUE, { batchSize: 1, pollingIntervalSeconds }, async ([job]) => {
    if (job) await generator.markLost(job.data.packageJobId)
  })
  const mailer = new Mailer(config.mail, logger)
  const notifications = createServices(db, config, queue).notifications
  await new MailQueue(queue, config.jobs).boss()
  await boss.work<MailJobData>(MAIL_QUEUE, { batchSize: 1, pollingIntervalSeconds }, async ([job]) => {
    if (!job) return
    const outcome = await notifications.deliver(job.data, mailer)
    logger.info({ kind: job.data.kind, recipientId: job.data.recipientId, outcome }, 'mail job done')
  })
  // pg-boss runs a schedule once per slot however many workers keep it
  await boss.schedule(DIGEST_QUEUE, config.mail.digestCron, {}, { tz: 'UTC' })
  await boss.work(DIGEST_QUEUE, { batchSize: 1, pollingIntervalSeconds }, async () => {
    const queued = await notifications.sendDigest(utcDay())
    logger.info({ queued }, 'daily digest queued')
  })
  logger.info({ queues: [GENERATE_QUEUE, MAIL_QUEUE] }, 'worker is waiting for jobs')
  return {
    stop: async () => {
      await queue.stop(true)
      mailer.close()
    },
  }
}
