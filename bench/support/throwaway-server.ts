import { chmodSync, mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { spawn } from 'node:child_process'
import {
  clusterAt, clusterUrl, ensureDatabase, ensurePostgresInstalled, freePort, initCluster, startCluster, stopCluster,
} from '../../scripts/lib/postgres-cluster'
import { REPOSITORY_ROOT } from '../../tests/browser/support/paths'

export interface ThrowawayServer { url: string; databaseUrl: string; stop(): Promise<void> }

const STARTUP_LIMIT_MS = 120_000

/**
 * The API as a deployed process runs it (`server/main.ts` in a process of its own, production
 * settings, demo data), over a private PostgreSQL cluster in a temporary folder on 127.0.0.1; `stop`
 * removes both. For benchmarks: the load generator keeps this process, the API gets its own.
 */
export async function startThrowawayServer(env: Record<string, string> = {}): Promise<ThrowawayServer> {
  const bin = ensurePostgresInstalled()
  const root = mkdtempSync(path.join(os.tmpdir(), 'stringline-bench-'))
  chmodSync(root, 0o755) // as root the cluster runs as `postgres`, which must reach the folder
  const cluster = { ...clusterAt(path.join(root, 'cluster'), await freePort()), fast: true }
  initCluster(bin, cluster)
  startCluster(bin, cluster)
  await ensureDatabase(clusterUrl(cluster), 'stringline')
  const port = await freePort()
  // BENCH_CPU_PROFILE_DIR: the API process writes a V8 CPU profile there when it stops
  const profile = process.env.BENCH_CPU_PROFILE_DIR ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROFILE_DIR}`] : []
  const api = spawn(process.execPath, [...profile, '--import', 'tsx', 'server/main.ts'], {
    cwd: REPOSITORY_ROOT,
    stdio: ['ignore', 'inherit', 'inherit'],
    env: {
      ...process.env,
      NODE_ENV: 'production',
      DATABASE_URL: clusterUrl(cluster, 'stringline'),
      LOAD_DEMO_DATA: 'true',
      JWT_SECRET: 'bench-only-secret-0123456789abcdef0123456789abcdef',
      DATA_DIR: path.join(root, 'data'),
      PORT: String(port),
      HOST: '127.0.0.1',
      LOG_LEVEL: 'error',
      LOGIN_LIMIT_PER_IP: '1000000',
      LOGIN_LIMIT_PER_ACCOUNT: '1000000',
      ...env,
    },
  })
  const exited = new Promise<void>((resolve) => api.once('exit', () => resolve()))
  const stop = async () => {
    if (api.exitCode === null && api.signalCode === null) {
      api.kill('SIGTERM')
      await exited
    }
    stopCluster(bin, cluster)
    rmSync(root, { recursive: true, force: true })
  }
  const url = `http://127.0.0.1:${port}`
  const deadline = Date.now() + STARTUP_LIMIT_MS
  for (;;) {
    if (await allListening(url)) return { url, databaseUrl: clusterUrl(cluster, 'stringline'), stop }
    if (api.exitCode !== null || Date.now() > deadline) {
      await stop()
      throw new Error(`the API process did not come up at ${url} (exit ${api.exitCode})`)
    }
    await new Promise((resolve) => setTimeout(resolve, 250))
  }
}

/**
 * Whether the API answers its health check with every one of its processes listening: connections
 * made while only the first of a cluster's processes listens would all stay with that one.
 */
async function allListening(url: string): Promise<boolean> {
  const health = await fetch(`${url}/api/health`).then(
    async (r) => (r.ok ? ((await r.json()) as { apiProcesses?: { listening: number; configured: number } }) : null),
    () => null,
  )
  return health !== null && (!health.apiProcesses || health.apiProcesses.listening === health.apiProcesses.configured)
}

/** Signs in over HTTP and answers the access token. */
export async function signIn(url: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email, password }) })
  if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}`)
  return ((await res.json()) as { token: string }).token
}
