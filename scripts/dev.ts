import { spawn, type ChildProcess } from 'node:child_process'
import { loadConfig } from '../server/config'
import { superviseWorker } from '../server/jobs/worker-process'
import { prepareLocalDatabase } from './lib/local-database'
import { startLocalMail } from './lib/local-mail'

/**
 * `npm run dev`: the local cluster, the API with reload on change (tsx watch) on PORT, a plan-set
 * worker (also reloaded on change; log lines start with [worker]), and the Vite dev server with hot
 * reload that proxies /api to it, and the mail catcher.
 */
async function main() {
  const config = loadConfig()
  const log = (line: string) => console.log(`[stringline dev] ${line}`)
  const mail = await startLocalMail(config.dataDir, log)
  const database = await prepareLocalDatabase(config.dataDir, log)
  const env = { ...process.env, ...mail.env, DATABASE_URL: database.url, LOAD_DEMO_DATA: 'true', API_PORT: String(config.port) }
  const children: ChildProcess[] = [
    spawn('npx', ['tsx', 'watch', '--clear-screen=false', 'server/main.ts'], { stdio: 'inherit', env }),
    spawn('npx', ['vite'], { stdio: 'inherit', env }),
  ]
  const worker = superviseWorker({ command: 'npx', args: ['tsx', 'watch', '--clear-screen=false', 'server/worker.ts'], env, log })
  let stopping = false
  const stop = () => {
    if (stopping) return
    stopping = true
    for (const child of children) child.kill('SIGTERM')
    void Promise.all([worker.stop(), mail.stop()]).finally(() => {
      database.stop()
      process.exit(0)
    })
  }
  for (const child of children) child.once('exit', stop)
  process.once('SIGINT', stop)
  process.once('SIGTERM', stop)
}

main().catch((err: unknown) => {
  console.error(err)
  process.exit(1)
})
