import cluster from 'node:cluster'
import { ClusterMemoryStorePrimary } from '@express-rate-limit/cluster-memory-store'
import { pino } from 'pino'
import { apiProcessCountMessage } from './api-processes'
import type { AppConfig } from './config'
import { prepareDatabase } from './server'

/** A process that died is started again after this pause [ms], so one that fails at start cannot spin. */
const RESTART_PAUSE_MS = 1000

/**
 * The API as `config.apiProcesses` processes sharing one port (node:cluster), for machines with
 * more than one core. This primary answers no request: it migrates the database and loads the demo
 * data once, keeps the sign-in and look-up limits for all processes (so they count as one), starts
 * the API processes (server/main.ts again, which runs the API in a cluster worker) and starts
 * again any that dies. SIGINT or SIGTERM stops them all, then this process.
 */
export async function runApiCluster(config: AppConfig, databaseUrl: string, demo: boolean): Promise<void> {
  const logger = pino({ level: config.logLevel })
  await prepareDatabase(config, databaseUrl, demo)
  new ClusterMemoryStorePrimary().init()

  let stopping = false
  const running = () => Object.values(cluster.workers ?? {}).filter((w) => w !== undefined)
  const listening = new Set<number>()
  const tellProcesses = () => {
    const message = apiProcessCountMessage({ listening: listening.size, configured: config.apiProcesses })
    for (const worker of running()) if (worker.isConnected()) worker.send(message)
  }
  cluster.on('listening', (worker) => {
    listening.add(worker.id)
    tellProcesses()
  })
  cluster.on('exit', (worker, code, signal) => {
    listening.delete(worker.id)
    tellProcesses()
    if (stopping) {
      if (running().length === 0) process.exit(0)
      return
    }
    logger.error({ apiProcessPid: worker.process.pid, code, signal }, 'an API process stopped; starting another')
    setTimeout(() => {
      if (!stopping) cluster.fork()
    }, RESTART_PAUSE_MS)
  })
  const stop = () => {
    if (stopping) return
    stopping = true
    const workers = running()
    if (workers.length === 0) process.exit(0)
    for (const worker of workers) worker.process.kill('SIGTERM')
  }
  process.on('SIGINT', stop)
  process.on('SIGTERM', stop)

  for (let i = 0; i < config.apiProcesses; i++) cluster.fork()
  logger.info({ processes: config.apiProcesses, url: `http://${config.host}:${config.port}` }, 'Stringline API processes starting')
}
