import { createServer, type Server } from 'node:http'
import { pino } from 'pino'
import { createApp } from './app'
import type { AppConfig } from './config'
import { createDataSource } from './db/data-source'
import { seedDemo } from './demo/seed'

export interface RunningServer {
  server: Server
  url: string
  close(): Promise<void>
}

/** Connects, migrates, optionally loads the demo data, and listens. */
export async function runServer(config: AppConfig, databaseUrl: string, options: { demo: boolean }): Promise<RunningServer> {
  const logger = pino({ level: config.logLevel })
  const db = createDataSource(databaseUrl)
  await db.initialize()
  const applied = await db.runMigrations({ transaction: 'each' })
  if (applied.length) logger.info({ migrations: applied.map((m) => m.name) }, 'migrations applied')
  if (options.demo) logger.info({ demo: await seedDemo(db, config.bcryptCost) }, 'demo data')
  const server = createServer(createApp({ db, config, logger }))
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
      await db.destroy()
    },
  }
}
