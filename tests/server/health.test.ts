import { chmodSync, mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import request from 'supertest'
import type { DataSource } from 'typeorm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import {
  clusterAt, clusterUrl, ensureDatabase, findPostgresBin, freePort, initCluster, startCluster, stopCluster, type Cluster,
} from '../../scripts/lib/postgres-cluster'
import { createApp } from '../../server/app'
import { createDataSource } from '../../server/db/data-source'
import { testConfig } from './support/harness'

/** This file stops and starts PostgreSQL, so it runs its own cluster, not the shared test one. */
let bin: string
let cluster: Cluster
let root: string
let db: DataSource
let app: ReturnType<typeof createApp>

beforeAll(async () => {
  bin = findPostgresBin()!
  root = mkdtempSync(path.join(os.tmpdir(), 'stringline-health-'))
  chmodSync(root, 0o755)
  cluster = { ...clusterAt(path.join(root, 'cluster'), await freePort()), fast: true }
  initCluster(bin, cluster)
  startCluster(bin, cluster)
  await ensureDatabase(clusterUrl(cluster), 'health')
  db = createDataSource(clusterUrl(cluster, 'health'))
  await db.initialize()
  await db.runMigrations()
  app = createApp({ db, config: testConfig() })
})

afterAll(async () => {
  await db?.destroy()
  stopCluster(bin, cluster)
  rmSync(root, { recursive: true, force: true })
})

describe('GET /api/health', () => {
  it('answers 200 with the database up, 503 within 2 s while it is stopped, 200 again after', async () => {
    const up = await request(app).get('/api/health')
    expect(up.status).toBe(200)
    expect(up.body).toEqual({ status: 'ok', db: 'up' })

    stopCluster(bin, cluster)
    const started = Date.now()
    const down = await request(app).get('/api/health')
    expect(down.status).toBe(503)
    expect(down.body.db).toBe('down')
    expect(Date.now() - started).toBeLessThan(2000)

    // a route that needs the database answers 503 in the error shape, not 500
    const login = await request(app).post('/api/auth/login').send({ email: 'a@b.example', password: 'whatever-long' })
    expect(login.status).toBe(503)
    expect(login.body.error.code).toBe('database_unavailable')

    startCluster(bin, cluster)
    let again = await request(app).get('/api/health')
    for (let i = 0; i < 20 && again.status !== 200; i++) {
      await new Promise((r) => setTimeout(r, 250))
      again = await request(app).get('/api/health')
    }
    expect(again.status).toBe(200)
  })
})
