import { chmodSync, mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import type { TestProject } from 'vitest/node'
import {
  clusterAt, clusterUrl, ensurePostgresInstalled, freePort, initCluster, startCluster, stopCluster,
} from '../../scripts/lib/postgres-cluster'

declare module 'vitest' {
  export interface ProvidedContext {
    /** A superuser URL of the test server; each test file makes its own database there. */
    adminDatabaseUrl: string
  }
}

/**
 * Starts a throwaway PostgreSQL cluster on 127.0.0.1 for the server tests (never the demo's data),
 * or uses DATABASE_URL when set. Stops and deletes it when the run ends.
 */
export default async function setup(project: TestProject) {
  if (process.env.DATABASE_URL) {
    project.provide('adminDatabaseUrl', process.env.DATABASE_URL)
    return
  }
  const bin = ensurePostgresInstalled()
  const root = mkdtempSync(path.join(os.tmpdir(), 'stringline-test-'))
  chmodSync(root, 0o755) // the server runs as `postgres` when we are root and must reach its folder
  const cluster = { ...clusterAt(path.join(root, 'cluster'), await freePort()), fast: true }
  initCluster(bin, cluster)
  startCluster(bin, cluster)
  project.provide('adminDatabaseUrl', clusterUrl(cluster))
  return () => {
    stopCluster(bin, cluster)
    rmSync(root, { recursive: true, force: true })
  }
}
