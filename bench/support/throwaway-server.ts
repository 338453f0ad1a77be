import { chmodSync, mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { loadConfig } from '../../server/config'
import { runServer, type RunningServer } from '../../server/server'
import {
  clusterAt, clusterUrl, ensureDatabase, ensurePostgresInstalled, freePort, initCluster, startCluster, stopCluster,
} from '../../scripts/lib/postgres-cluster'

export interface ThrowawayServer { url: string; running: RunningServer; stop(): Promise<void> }

/**
 * The API as a deployed process runs it (production settings, demo data), over a private
 * PostgreSQL cluster in a temporary folder on 127.0.0.1; `stop` removes both. For benchmarks.
 */
export async function startThrowawayServer(env: Record<string, string> = {}): Promise<ThrowawayServer> {
  const bin = ensurePostgresInstalled()
  const root = mkdtempSync(path.join(os.tmpdir(), 'stringline-bench-'))
  chmodSync(root, 0o755) // as root the cluster runs as `postgres`, which must reach the folder
  const cluster = { ...clusterAt(path.join(root, 'cluster'), await freePort()), fast: true }
  initCluster(bin, cluster)
  startCluster(bin, cluster)
  await ensureDatabase(clusterUrl(cluster), 'stringline')
  const config = loadConfig({
    NODE_ENV: 'production',
    JWT_SECRET: 'bench-only-secret-0123456789abcdef0123456789abcdef',
    DATA_DIR: path.join(root, 'data'),
    PORT: String(await freePort()),
    HOST: '127.0.0.1',
    LOG_LEVEL: 'error',
    LOGIN_LIMIT_PER_IP: '1000000',
    LOGIN_LIMIT_PER_ACCOUNT: '1000000',
    ...env,
  })
  const running = await runServer(config, clusterUrl(cluster, 'stringline'), { demo: true })
  return {
    url: running.url,
    running,
    async stop() {
      await running.close()
      stopCluster(bin, cluster)
      rmSync(root, { recursive: true, force: true })
    },
  }
}

/** Signs in over HTTP and answers the access token. */
export async function signIn(url: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email, password }) })
  if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}`)
  return ((await res.json()) as { token: string }).token
}
