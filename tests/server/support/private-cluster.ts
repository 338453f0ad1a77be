import { chmodSync, mkdtempSync, readFileSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import {
  clusterAt, clusterUrl, ensureDatabase, findPostgresBin, freePort, initCluster, startCluster, stopCluster,
} from '../../../scripts/lib/postgres-cluster'
import { waitFor } from './live-api'

export interface PrivateCluster {
  /** Superuser URL of `database` on this cluster (created on start). */
  url: string
  /** Starts the stopped server again and waits until it accepts connections. */
  start(): void
  /**
   * Fast shutdown: SIGINT to the postmaster (PostgreSQL docs, "Shutting Down the Server"), sent
   * directly rather than through the synchronous `pg_ctl stop`, which would freeze this process
   * (and an API running in it) for the length of the shutdown. Resolves once the server is gone.
   */
  fastShutdown(): Promise<void>
  /** Stops the server and deletes its folder. */
  remove(): void
}

/**
 * A throwaway cluster of one test file's own, for tests that stop and start PostgreSQL (the
 * shared one from tests/setup/global-postgres.ts serves every other file).
 */
export async function startPrivateCluster(name: string, database: string): Promise<PrivateCluster> {
  const bin = findPostgresBin()
  if (!bin) throw new Error('PostgreSQL server binaries not found (the test setup installs them)')
  const root = mkdtempSync(path.join(os.tmpdir(), `stringline-${name}-`))
  chmodSync(root, 0o755) // as root the server runs as `postgres` and must reach its folder
  const cluster = { ...clusterAt(path.join(root, 'cluster'), await freePort()), fast: true }
  initCluster(bin, cluster)
  startCluster(bin, cluster)
  await ensureDatabase(clusterUrl(cluster), database)
  return {
    url: clusterUrl(cluster, database),
    start: () => startCluster(bin, cluster),
    async fastShutdown() {
      const pid = Number(readFileSync(path.join(cluster.home, 'data', 'postmaster.pid'), 'utf8').split('\n')[0])
      process.kill(pid, 'SIGINT')
      const gone = () => {
        try {
          process.kill(pid, 0)
          return false
        } catch {
          return true
        }
      }
      await waitFor(gone, 'the postmaster to exit', 30_000, 20)
    },
    remove() {
      stopCluster(bin, cluster)
      rmSync(root, { recursive: true, force: true })
    },
  }
}
