import { pino } from 'pino'
import { ConfigError, loadConfig } from './config'
import { createDataSource } from './db/data-source'
import { startPackageWorker } from './jobs/worker'

/**
 * Entry point of a worker process: generates plan sets from the queue. DATABASE_URL names the
 * same server as the API's; the API process runs the migrations.
 */
async function main() {
  const databaseUrl = process.env.DATABASE_URL
  if (!databaseUrl) throw new ConfigError('DATABASE_URL must be set')
  const config = loadConfig()
  const logger = pino({ level: config.logLevel, base: { process: 'worker' } })
  const db = createDataSource(databaseUrl)
  await db.initialize()
  const worker = await startPackageWorker({ db, config, logger })
  let stopping = false
  const stop = () => {
    if (stopping) return
    stopping = true
    void worker
      .stop()
      .then(() => db.destroy())
      .then(() => process.exit(0))
  }
  process.once('SIGINT', stop)
  process.once('SIGTERM', stop)
}

main().catch((err: unknown) => {
  console.error(err instanceof ConfigError ? `Configuration error: ${err.message}` : err)
  process.exit(1)
})
