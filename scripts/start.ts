import { build } from 'vite'
import { DEMO_PASSWORD, DEMO_USERS } from '../server/demo/seed'
import { ConfigError, loadConfig } from '../server/config'
import { superviseWorker, type WorkerProcess } from '../server/jobs/worker-process'
import { runServer, type RunningServer } from '../server/server'
import { ClusterError } from './lib/postgres-cluster'
import { prepareLocalDatabase } from './lib/local-database'
import { startLocalMail } from './lib/local-mail'

/**
 * `npm start`: PostgreSQL (installed and started when needed), migrations, demo data, the built
 * client, the app + API on http://127.0.0.1:8080, and a plan-set worker beside it (its log lines
 * start with [worker]), and a mail catcher on loopback. Ctrl-C stops them all.
 */
async function main() {
  // when piped (e.g. into tee) Ctrl-C closes the pipe first: shutting down must not die on EPIPE
  process.stdout.on('error', () => {})
  process.stderr.on('error', () => {})
  const log = (line: string) => console.log(`[stringline] ${line}`)
  const mail = await startLocalMail(loadConfig().dataDir, log)
  Object.assign(process.env, mail.env)
  const config = loadConfig()
  const database = await prepareLocalDatabase(config.dataDir, log)
  const app: { running?: RunningServer; worker?: WorkerProcess } = {}
  let stopping = false
  const shutdown = async () => {
    if (stopping) return
    stopping = true
    log('Stopping…')
    await app.worker?.stop().catch(() => {})
    await app.running?.close().catch(() => {})
    await mail.stop().catch(() => {})
    database.stop()
    log('Stopped.')
    process.exit(0)
  }
  process.once('SIGINT', () => void shutdown())
  process.once('SIGTERM', () => void shutdown())

  if (process.env.SKIP_CLIENT_BUILD !== 'true') {
    log('Building the client…')
    await build({ logLevel: 'warn' })
  }
  const running = await runServer(config, database.url, { demo: true })
  app.running = running
  // after the migrations: the worker uses the tables the API process has just brought up to date
  // NODE_ENV as this launcher read it: the client build sets it to production in this process
  const workerEnv = { ...process.env, NODE_ENV: config.nodeEnv, DATABASE_URL: database.url }
  app.worker = superviseWorker({ command: process.execPath, args: ['--import', 'tsx', 'server/worker.ts'], env: workerEnv, log })
  log(`Open ${running.url} — demo sign-ins (local use only), password "${DEMO_PASSWORD}":`)
  for (const user of DEMO_USERS) log(`  ${user.role.padEnd(12)} ${user.email}`)
  log('Press Ctrl-C to stop.')
}

main().catch((err: unknown) => {
  if (err instanceof ConfigError || err instanceof ClusterError) console.error(`[stringline] ${err.message}`)
  else console.error(err)
  process.exit(1)
})
