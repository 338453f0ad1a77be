import { spawn, type ChildProcess } from 'node:child_process'
import { chmodSync, createWriteStream, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import type { TestProject } from 'vitest/node'
import { clusterAt, ensurePostgresInstalled, freePort, stopCluster } from '../../../scripts/lib/postgres-cluster'
import { CHROMIUM_PATH, REPOSITORY_ROOT, SCREENSHOT_DIR } from './paths'

declare module 'vitest' {
  export interface ProvidedContext {
    /** Where the app started as `npm start` starts it answers, e.g. http://127.0.0.1:40123. */
    appUrl: string
  }
}

/** Building the client, initialising a cluster and seeding on 2 cores shared with the other projects [ms]. */
const STARTUP_LIMIT_MS = 240_000
const SHUTDOWN_LIMIT_MS = 30_000
const APP_LOG = path.join(SCREENSHOT_DIR, 'app.log')

function lastLogLines(count = 30): string {
  return existsSync(APP_LOG) ? readFileSync(APP_LOG, 'utf8').trim().split('\n').slice(-count).join('\n') : '(no log)'
}

async function answersHealth(url: string): Promise<boolean> {
  try {
    const response = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) })
    return response.ok
  } catch {
    return false
  }
}

async function waitForHealth(url: string, launcher: ChildProcess): Promise<void> {
  const deadline = Date.now() + STARTUP_LIMIT_MS
  while (Date.now() < deadline) {
    if (launcher.exitCode !== null || launcher.signalCode !== null) {
      throw new Error(`The launcher (scripts/start.ts) exited with ${launcher.exitCode ?? launcher.signalCode} before answering /api/health:\n${lastLogLines()}`)
    }
    if (await answersHealth(url)) return
    await new Promise((resolve) => setTimeout(resolve, 500))
  }
  throw new Error(`${url}/api/health did not answer within ${STARTUP_LIMIT_MS / 1000} s:\n${lastLogLines()}`)
}

function stopLauncher(launcher: ChildProcess): Promise<void> {
  if (launcher.exitCode !== null || launcher.signalCode !== null) return Promise.resolve()
  return new Promise((resolve) => {
    // a launcher stuck in shutdown must not hang the run; its cluster is stopped after it
    const timer = setTimeout(() => launcher.kill('SIGKILL'), SHUTDOWN_LIMIT_MS)
    launcher.once('exit', () => {
      clearTimeout(timer)
      resolve()
    })
    launcher.kill('SIGINT') // what Ctrl-C sends to `npm start`
  })
}

/** A cluster the launcher left running (it was killed or crashed) must not outlive the run. */
function stopLeftoverCluster(dataDir: string, port: number): void {
  const home = path.join(dataDir, 'postgres') // where scripts/lib/local-database.ts puts it for a reachable folder
  if (existsSync(home)) stopCluster(ensurePostgresInstalled(() => {}), clusterAt(home, port))
}

/**
 * Starts the app as `npm start` does (the same launcher: client build, private cluster,
 * migrations, demo data, API and worker), on free ports and a throwaway data folder; stops it
 * with Ctrl-C's signal at the end and removes the folder.
 */
export default async function setup(project: TestProject) {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(`The browser journeys need Chromium at ${CHROMIUM_PATH}: install Debian's "chromium" package (apt-get install chromium); .ci/run does this.`)
  }
  rmSync(SCREENSHOT_DIR, { recursive: true, force: true }) // screenshots of an earlier run would mislead
  mkdirSync(SCREENSHOT_DIR, { recursive: true })
  // while writing a journey: run it against an app you started yourself (fresh demo data) instead
  if (process.env.BROWSER_APP_URL) {
    project.provide('appUrl', process.env.BROWSER_APP_URL)
    return
  }
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'stringline-browser-'))
  chmodSync(dataDir, 0o755) // as root, the cluster runs as `postgres` and must reach the folder
  const port = await freePort()
  const pgPort = await freePort()
  // each generation step stays on screen a moment, so the journey can watch the bar move
  const env: NodeJS.ProcessEnv = { ...process.env, DATA_DIR: dataDir, PORT: String(port), PG_PORT: String(pgPort), JOB_STEP_PAUSE_MS: '700' }
  // as a person runs `npm start`: no test mode from vitest, and never the test server's database
  delete env.NODE_ENV
  delete env.DATABASE_URL
  const log = createWriteStream(APP_LOG)
  const launcher = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], { cwd: REPOSITORY_ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] })
  launcher.stdout?.pipe(log)
  launcher.stderr?.pipe(log)
  const stop = async () => {
    await stopLauncher(launcher)
    stopLeftoverCluster(dataDir, pgPort)
    rmSync(dataDir, { recursive: true, force: true })
  }
  const url = `http://127.0.0.1:${port}`
  try {
    await waitForHealth(url, launcher)
  } catch (error) {
    await stop()
    throw error
  }
  project.provide('appUrl', url)
  return stop
}
