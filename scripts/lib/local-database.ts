import path from 'node:path'
import { clusterAt, clusterUrl, ensureDatabase, ensurePostgresInstalled, initCluster, startCluster, stopCluster } from './postgres-cluster'

export interface LocalDatabase {
  url: string
  /** Stops the cluster this process started; a no-op for an outside DATABASE_URL. */
  stop(): void
}

const DEFAULT_PG_PORT = 54329
const DATABASE_NAME = 'stringline'

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
  const cluster = clusterAt(path.join(dataDir, 'postgres'), Number(process.env.PG_PORT ?? DEFAULT_PG_PORT))
  initCluster(bin, cluster)
  startCluster(bin, cluster)
  log(`PostgreSQL running on 127.0.0.1:${cluster.port} (data in ${cluster.home})`)
  await ensureDatabase(clusterUrl(cluster), DATABASE_NAME)
  return { url: clusterUrl(cluster, DATABASE_NAME), stop: () => stopCluster(bin, cluster) }
}
