import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { AuditEventEntity } from '../../server/entities'
import { demoEmail, login, seedTwoOrganizations, startHarness, tokensByRole, type Harness } from './support/harness'
import type { Role } from '../../shared/auth/roles'

let h: Harness
let tokens: Record<Role, string>
let foreignUserId: string

beforeAll(async () => {
  h = await startHarness()
  const { foreignUsers } = await seedTwoOrganizations(h)
  foreignUserId = foreignUsers[0]!.id
  tokens = await tokensByRole(h.app)
})
afterAll(() => h.close())

const as = (role: Role) => ({ Authorization: `Bearer ${tokens[role]}` })

describe('user administration', () => {
  it('lists only the own organisation, paged, searchable and sorted', async () => {
    const res = await request(h.app).get('/api/users?pageSize=2&sort=-email').set(as('admin'))
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ total: 4, page: 1, pageSize: 2 })
    expect(res.body.items.map((u: { email: string }) => u.email)).toEqual([demoEmail('reviewer'), demoEmail('designer')])
    const search = await request(h.app).get('/api/users?q=okafor').set(as('admin'))
    expect(search.body.items.map((u: { role: string }) => u.role)).toEqual(['designer'])
    expect(JSON.stringify(res.body)).not.toContain('quillfeather')
  })

  it('answers 400 naming the field for a bad query', async () => {
    const res = await request(h.app).get('/api/users?pageSize=500&sort=password').set(as('admin'))
    expect(res.status).toBe(400)
    expect(res.body.error.fields.map((f: { field: string }) => f.field).sort()).toEqual(['pageSize', 'sort'])
  })

  it('denies other roles (403)', async () => {
    for (const role of ['designer', 'reviewer', 'coordinator'] as const) {
      expect((await request(h.app).get('/api/users').set(as(role))).status).toBe(403)
    }
  })

  it('creates a user (201), refuses a taken e-mail (409) and bad fields (400)', async () => {
    const body = { email: 'new.designer@larkspur-solar.example', name: 'Noor Haddad', role: 'designer', password: 'a-long-enough-password' }
    const created = await request(h.app).post('/api/users').set(as('admin')).send(body)
    expect(created.status).toBe(201)
    expect(created.body.user).toMatchObject({ email: body.email, role: 'designer', active: true })
    expect((await login(h.app, body.email, body.password)).token).toBeTruthy()

    const again = await request(h.app).post('/api/users').set(as('admin')).send({ ...body, email: 'NEW.designer@larkspur-solar.example' })
    expect(again.status).toBe(409)
    expect(again.body.error.fields[0].field).toBe('email')

    const bad = await request(h.app).post('/api/users').set(as('admin')).send({ email: 'not-an-email', name: '', role: 'owner', password: 'short' })
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields.map((f: { field: string }) => f.field).sort()).toEqual(['email', 'name', 'password', 'role'])
  })

  it('changes a role and records who did it in the audit log', async () => {
    const { user } = await login(h.app, demoEmail('coordinator'))
    const res = await request(h.app).patch(`/api/users/${user.id}`).set(as('admin')).send({ role: 'designer' })
    expect(res.status).toBe(200)
    expect(res.body.user.role).toBe('designer')
    const events = await h.db.getRepository(AuditEventEntity).findBy({ entityId: user.id, action: 'user.updated' })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ fromState: 'coordinator', toState: 'designer' })
    await request(h.app).patch(`/api/users/${user.id}`).set(as('admin')).send({ role: 'coordinator' })
  })

  it('a foreign organisation\u2019s user id answers 404, as does a malformed id', async () => {
    expect((await request(h.app).get(`/api/users/${foreignUserId}`).set(as('admin'))).status).toBe(404)
    expect((await request(h.app).patch(`/api/users/${foreignUserId}`).set(as('admin')).send({ active: false })).status).toBe(404)
    expect((await request(h.app).get('/api/users/not-a-uuid').set(as('admin'))).status).toBe(404)
  })

  it('a deactivated user\u2019s access and refresh tokens stop working at once', async () => {
    const body = { email: 'temp@larkspur-solar.example', name: 'Temporary Person', role: 'designer', password: 'temporary-password' }
    const created = await request(h.app).post('/api/users').set(as('admin')).send(body)
    const session = await login(h.app, body.email, body.password)
    expect((await request(h.app).get('/api/auth/me').set('Authorization', `Bearer ${session.token}`)).status).toBe(200)
    const off = await request(h.app).patch(`/api/users/${created.body.user.id}`).set(as('admin')).send({ active: false })
    expect(off.body.user.active).toBe(false)
    expect((await request(h.app).get('/api/auth/me').set('Authorization', `Bearer ${session.token}`)).status).toBe(401)
    const cookie = session.cookie.find((c) => c.startsWith('sl_refresh='))!.split(';')[0]!
    expect((await request(h.app).post('/api/auth/refresh').set('Cookie', cookie)).status).toBe(401)
    expect((await request(h.app).post('/api/auth/login').send({ email: body.email, password: body.password })).status).toBe(401)
  })

  it('an admin cannot deactivate themself or drop their own admin role (409)', async () => {
    const { user } = await login(h.app, demoEmail('admin'))
    const self = await request(h.app).patch(`/api/users/${user.id}`).set(as('admin')).send({ active: false })
    expect(self.status).toBe(409)
    expect(self.body.error.fields[0].field).toBe('active')
    expect((await request(h.app).patch(`/api/users/${user.id}`).set(as('admin')).send({ role: 'designer' })).status).toBe(409)
  })

  it('refuses unknown fields in an update (400)', async () => {
    const { user } = await login(h.app, demoEmail('designer'))
    const res = await request(h.app).patch(`/api/users/${user.id}`).set(as('admin')).send({ passwordHash: 'x' })
    expect(res.status).toBe(400)
  })

  it('every role reads the member directory: active members of its own organisation, id, name and role only', async () => {
    for (const role of ['designer', 'reviewer', 'coordinator', 'admin'] as const) {
      const res = await request(h.app).get('/api/members').set(as(role))
      expect(res.status, role).toBe(200)
      expect(res.body.items.map((m: { role: string }) => m.role)).toEqual(expect.arrayContaining(['admin', 'designer', 'reviewer', 'coordinator']))
      for (const member of res.body.items) expect(Object.keys(member).sort()).toEqual(['id', 'name', 'role'])
      expect(JSON.stringify(res.body)).not.toMatch(/Quill|Temporary Person/)
    }
  })

  it('admins read the audit log of their organisation', async () => {
    const res = await request(h.app).get('/api/audit-events').set(as('admin'))
    expect(res.status).toBe(200)
    expect(res.body.items.some((e: { action: string }) => e.action === 'user.created')).toBe(true)
    expect((await request(h.app).get('/api/audit-events').set(as('designer'))).status).toBe(403)
  })
})
