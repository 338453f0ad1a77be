import { createServer, type Server } from 'node:http'
import { pino, type Logger } from 'pino'
import type { DataSource } from 'typeorm'
import { createApp } from './app'
import { SignedInUsers } from './auth/signed-in-users'
import type { AppConfig } from './config'
import { createDataSource } from './db/data-source'
import { seedDemo } from './demo/seed'
import { PackageQueue } from './jobs/queue'
import { createFileStorage } from './storage'

export interface RunningServer {
  server: Server
  url: string
  close(): Promise<void>
}

export interface DatabaseSetup {
  /** Load the demo data when it is not there yet. */
  demo: boolean
  /** false when another process has already migrated the database (and loaded the demo data): a cluster's primary does it for all its processes. */
  prepare?: boolean
}

async function prepare(db: DataSource, config: AppConfig, logger: Logger, demo: boolean): Promise<void> {
  const applied = await db.runMigrations({ transaction: 'each' })
  if (applied.length) logger.info({ migrations: applied.map((m) => m.name) }, 'migrations applied')
  if (demo) logger.info({ demo: await seedDemo(db, config.bcryptCost, createFileStorage(config)) }, 'demo data')
}

/** Runs the migrations and, when asked, loads the demo data, over a connection of its own. */
export async function prepareDatabase(config: AppConfig, databaseUrl: string, demo: boolean): Promise<void> {
  const db = createDataSource(databaseUrl)
  await db.initialize()
  try {
    await prepare(db, config, pino({ level: config.logLevel }), demo)
  } finally {
    await db.destroy()
  }
}

/** Connects, migrates, optionally loads the demo data, starts the queue (sender side), and listens. */
export async function runServer(config: AppConfig, databaseUrl: string, setup: DatabaseSetup): Promise<RunningServer> {
  const logger = pino({ level: config.logLevel })
  const db = createDataSource(databaseUrl)
  await db.initialize()
  if (setup.prepare !== false) await prepare(db, config, logger, setup.demo)
  // this process only sends generations; worker processes (server/worker.ts) run them
  const queue = new PackageQueue(databaseUrl, config.jobs, 'api', (err) => logger.error({ err }, 'queue error'))
  await queue.boss()
  const signedIn = new SignedInUsers(databaseUrl, (err) => logger.warn({ err }, 'lost the users-changed listener; reading users per request until it is back'))
  await signedIn.start()
  const server = createServer(createApp({ db, config, logger, queue, signedIn }))
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(config.port, config.host, resolve)
  })
  const url = `http://${config.host}:${config.port}`
  logger.info({ url }, 'Stringline is listening')
  return {
    server,
    url,
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()))
      server.closeAllConnections()
      await signedIn.stop()
      await queue.stop()
      await db.destroy()
    },
  }
}
