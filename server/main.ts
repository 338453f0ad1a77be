import cluster from 'node:cluster'
import { runApiCluster } from './api-cluster'
import { ConfigError, loadConfig } from './config'
import { runServer } from './server'

/**
 * Entry point for a deployed API process: DATABASE_URL names the server, migrations run at start.
 * With API_PROCESSES above 1 this process becomes the cluster's primary (server/api-cluster.ts) and
 * each API process it starts runs this file again as a cluster worker.
 * The local launcher (`npm start`, scripts/start.ts) starts its own cluster first.
 */
async function main() {
  const databaseUrl = process.env.DATABASE_URL
  if (!databaseUrl) throw new ConfigError('DATABASE_URL must be set')
  const config = loadConfig()
  const demo = process.env.LOAD_DEMO_DATA === 'true'
  if (cluster.isPrimary && config.apiProcesses > 1) return runApiCluster(config, databaseUrl, demo)
  // in a cluster the primary has migrated the database and loaded the demo data already
  const running = await runServer(config, databaseUrl, { demo, prepare: cluster.isPrimary })
  let stopping = false
  const stop = () => {
    if (stopping) return
    stopping = true
    void running.close().then(() => process.exit(0))
  }
  // Ctrl-C reaches a cluster's primary and its workers alike, and the primary then sends SIGTERM too
  process.on('SIGINT', stop)
  process.on('SIGTERM', stop)
}

main().catch((err: unknown) => {
  console.error(err instanceof ConfigError ? `Configuration error: ${err.message}` : err)
  process.exit(1)
})
