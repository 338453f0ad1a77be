import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import type { AuthUser } from '../../server/auth/auth-user'
import { SignedInUsers } from '../../server/auth/signed-in-users'
import { seedDemo } from '../../server/demo/seed'
import { UserEntity } from '../../server/entities'
import { demoEmail, login, startHarness, type Harness } from './support/harness'

/**
 * API processes keep the users of bearer tokens between requests; a change to a user row (by any
 * process, committed) makes every process forget that user at once, and a lost listening
 * connection makes them read every request again until it is back.
 */
let h: Harness
let users: SignedInUsers
let reviewer: AuthUser
beforeAll(async () => {
  h = await startHarness()
  await seedDemo(h.db, h.config.bcryptCost)
  users = new SignedInUsers(h.databaseUrl)
  await users.start()
  const row = await h.db.getRepository(UserEntity).findOneByOrFail({ email: demoEmail('reviewer') })
  reviewer = { id: row.id, organizationId: row.organizationId, email: row.email, name: row.name, role: row.role }
}, 60_000)
afterAll(async () => {
  await users.stop()
  await h.close()
})

/** A loader that reads the row as the auth service does, counting its calls. */
function loader() {
  let reads = 0
  const load = async () => {
    reads++
    const row = await h.db.getRepository(UserEntity).findOneBy({ id: reviewer.id, active: true })
    return row ? { ...reviewer, name: row.name, role: row.role } : null
  }
  return { load, reads: () => reads }
}

const eventually = async (check: () => Promise<boolean> | boolean) => {
  for (let i = 0; i < 100; i++) {
    if (await check()) return
    await new Promise((r) => setTimeout(r, 50))
  }
  throw new Error('never came true')
}

describe('users kept between requests', () => {
  it('reads a user once, then keeps it; another organisation never gets it', async () => {
    const { load, reads } = loader()
    expect(await users.get(reviewer.id, reviewer.organizationId, load)).toMatchObject({ id: reviewer.id })
    expect(await users.get(reviewer.id, reviewer.organizationId, load)).toMatchObject({ id: reviewer.id })
    expect(reads()).toBe(1)
    expect(await users.get(reviewer.id, '00000000-0000-4000-8000-000000000000', load)).toBeNull()
  })

  it('forgets a user as soon as the row changes, so a deactivation applies to the next request', async () => {
    const { load, reads } = loader()
    await users.get(reviewer.id, reviewer.organizationId, load)
    const before = reads()
    await h.db.getRepository(UserEntity).update({ id: reviewer.id }, { name: 'Teodor Lindqvist (renamed)' })
    await eventually(async () => (await users.get(reviewer.id, reviewer.organizationId, load))?.name === 'Teodor Lindqvist (renamed)')
    expect(reads()).toBeGreaterThan(before)

    await h.db.getRepository(UserEntity).update({ id: reviewer.id }, { active: false })
    await eventually(async () => (await users.get(reviewer.id, reviewer.organizationId, load)) === null)
    await h.db.getRepository(UserEntity).update({ id: reviewer.id }, { active: true, name: reviewer.name })
    await eventually(async () => (await users.get(reviewer.id, reviewer.organizationId, load))?.name === reviewer.name)
  })

  it('reads every request while its connection is lost, and keeps users again once it listens again', async () => {
    const { load, reads } = loader()
    await users.get(reviewer.id, reviewer.organizationId, load)
    expect(users.listening).toBe(true)
    await h.db.query(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE query LIKE 'LISTEN stringline_users_changed%' AND pid <> pg_backend_pid()`)
    await eventually(() => !users.listening)
    const before = reads()
    await users.get(reviewer.id, reviewer.organizationId, load)
    await users.get(reviewer.id, reviewer.organizationId, load)
    expect(reads()).toBe(before + 2)
    await eventually(() => users.listening)
    await users.get(reviewer.id, reviewer.organizationId, load)
    const kept = reads()
    await users.get(reviewer.id, reviewer.organizationId, load)
    expect(reads()).toBe(kept)
  })
})

describe('through the API, as a deployed process runs it', () => {
  it('refuses a deactivated user on the very next request, and takes a role change at once', async () => {
    const app = createApp({ db: h.db, config: h.config, signedIn: users })
    const admin = (await login(app, demoEmail('admin'))).token
    const coordinator = await login(app, demoEmail('coordinator'))
    const as = (token: string) => ({ Authorization: `Bearer ${token}` })
    expect((await request(app).get('/api/submissions').set(as(coordinator.token))).status).toBe(200)
    expect((await request(app).get('/api/submissions').set(as(coordinator.token))).status).toBe(200)

    expect((await request(app).patch(`/api/users/${coordinator.user.id}`).set(as(admin)).send({ role: 'designer' })).status).toBe(200)
    expect((await request(app).get('/api/submissions').set(as(coordinator.token))).status).toBe(403)
    expect((await request(app).patch(`/api/users/${coordinator.user.id}`).set(as(admin)).send({ active: false })).status).toBe(200)
    expect((await request(app).get('/api/auth/me').set(as(coordinator.token))).status).toBe(401)
  })
})
