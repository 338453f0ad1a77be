import { createHash } from 'node:crypto'
import { mkdirSync } from 'node:fs'
import path from 'node:path'
import {
  clusterAt, clusterUrl, ensureDatabase, ensurePostgresInstalled, initCluster, serverUserCanReach, startCluster, stopCluster,
} from './postgres-cluster'

export interface LocalDatabase {
  url: string
  /** Stops the cluster this process started; a no-op for an outside DATABASE_URL. */
  stop(): void
}

const DEFAULT_PG_PORT = 54329
const DATABASE_NAME = 'stringline'

/**
 * The cluster lives in the data folder, unless (running as root) the `postgres` user cannot reach
 * it, e.g. a checkout inside /root: then under /var/lib/stringline, one folder per checkout.
 */
function clusterHome(dataDir: string, log: (line: string) => void): string {
  mkdirSync(dataDir, { recursive: true, mode: 0o755 })
  if (serverUserCanReach(dataDir)) return path.join(dataDir, 'postgres')
  const home = path.join('/var/lib/stringline', createHash('sha256').update(dataDir).digest('hex').slice(0, 12), 'postgres')
  log(`The postgres user cannot reach ${dataDir}; keeping the cluster in ${home}`)
  return home
}

/**
 * The database for `npm start` and `npm run dev`: DATABASE_URL when set, otherwise a private
 * cluster under the data folder on 127.0.0.1 (initialised on first use, kept between runs).
 */
export async function prepareLocalDatabase(dataDir: string, log: (line: string) => void): Promise<LocalDatabase> {
  if (process.env.DATABASE_URL) {
    log('Using the PostgreSQL server named by DATABASE_URL')
    return { url: process.env.DATABASE_URL, stop: () => {} }
  }
  const bin = ensurePostgresInstalled(log)
  const cluster = clusterAt(clusterHome(dataDir, log), Number(process.env.PG_PORT ?? DEFAULT_PG_PORT))
  initCluster(bin, cluster)
  startCluster(bin, cluster)
  log(`PostgreSQL running on 127.0.0.1:${cluster.port} (data in ${cluster.home})`)
  await ensureDatabase(clusterUrl(cluster), DATABASE_NAME)
  return { url: clusterUrl(cluster, DATABASE_NAME), stop: () => stopCluster(bin, cluster) }
}
