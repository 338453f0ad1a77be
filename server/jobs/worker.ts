import type { Logger } from 'pino'
import type { DataSource } from 'typeorm'
import type { AppConfig } from '../config'
import { createFileStorage } from '../storage'
import { PlanSetGenerator } from './generate-plan-set'
import { connectionStringOf, GENERATE_QUEUE, LOST_GENERATIONS_QUEUE, PackageQueue, type GenerateJobData } from './queue'

export interface RunningWorker {
  /** Finishes the job in hand (up to a few seconds), then stops taking jobs. */
  stop(): Promise<void>
}

/**
 * Takes plan-set generations off the queue, one at a time per worker, and marks the jobs pg-boss
 * gave up on as failed. Several workers (processes) may run against one database.
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
  logger.info({ queue: GENERATE_QUEUE }, 'plan-set worker is waiting for jobs')
  return { stop: () => queue.stop(true) }
}
