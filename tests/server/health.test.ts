import request from 'supertest'
import type { DataSource } from 'typeorm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { createDataSource } from '../../server/db/data-source'
import { testConfig } from './support/harness'
import { startPrivateCluster, type PrivateCluster } from './support/private-cluster'

/** This file stops and starts PostgreSQL, so it runs its own cluster, not the shared test one. */
let postgres: PrivateCluster
let db: DataSource
let app: ReturnType<typeof createApp>

beforeAll(async () => {
  postgres = await startPrivateCluster('health', 'health')
  db = createDataSource(postgres.url)
  await db.initialize()
  await db.runMigrations()
  app = createApp({ db, config: testConfig() })
})

afterAll(async () => {
  await db?.destroy()
  postgres?.remove()
})

describe('GET /api/health', () => {
  it('answers 200 with the database up, 503 within 2 s while it is stopped, 200 again after', async () => {
    const up = await request(app).get('/api/health')
    expect(up.status).toBe(200)
    expect(up.body).toEqual({ status: 'ok', db: 'up' })

    await postgres.fastShutdown()
    const started = Date.now()
    const down = await request(app).get('/api/health')
    expect(down.status).toBe(503)
    expect(down.body.db).toBe('down')
    expect(Date.now() - started).toBeLessThan(2000)

    // a route that needs the database answers 503 in the error shape, not 500
    const login = await request(app).post('/api/auth/login').send({ email: 'a@b.example', password: 'whatever-long' })
    expect(login.status).toBe(503)
    expect(login.body.error.code).toBe('database_unavailable')

    postgres.start()
    let again = await request(app).get('/api/health')
    for (let i = 0; i < 20 && again.status !== 200; i++) {
      await new Promise((r) => setTimeout(r, 250))
      again = await request(app).get('/api/health')
    }
    expect(again.status).toBe(200)
  })
})
