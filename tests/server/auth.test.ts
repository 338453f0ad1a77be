import { performance } from 'node:perf_hooks'
import jwt from 'jsonwebtoken'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { INVALID_CREDENTIALS } from '../../server/services/auth-service'
import { JWT_AUDIENCE, JWT_ISSUER } from '../../server/auth/tokens'
import { DEMO_PASSWORD } from '../../server/demo/seed'
import { demoEmail, login, seedTwoOrganizations, startHarness, type Harness } from './support/harness'

let h: Harness

beforeAll(async () => {
  h = await startHarness()
  await seedTwoOrganizations(h)
})
afterAll(() => h.close())

const cookieValue = (cookies: string[], name: string) => cookies.find((c) => c.startsWith(`${name}=`))!.split(';')[0]!

describe('POST /api/auth/login', () => {
  it('signs in with the right password and sets an httpOnly refresh cookie', async () => {
    const res = await request(h.app).post('/api/auth/login').send({ email: 'Designer@Larkspur-Solar.example', password: DEMO_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ email: demoEmail('designer'), role: 'designer', organizationName: 'Larkspur Valley Solar Co.' })
    expect(res.body.user.passwordHash).toBeUndefined()
    const decoded = jwt.decode(res.body.token, { complete: true }) as jwt.Jwt
    expect(decoded.header.alg).toBe('HS256')
    const claims = decoded.payload as jwt.JwtPayload
    expect(claims.exp! - claims.iat!).toBeLessThanOrEqual(15 * 60)
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('sl_refresh='))!
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Strict/i)
    expect(cookie).toMatch(/Path=\/api\/auth/)
  })

  it('checks passwords off the API\u2019s thread: the event loop stays mostly idle while sign-ins run', async () => {
    const before = performance.eventLoopUtilization()
    const answers = await Promise.all(['designer', 'reviewer', 'coordinator', 'admin'].map((role) =>
      request(h.app).post('/api/auth/login').send({ email: demoEmail(role as 'designer'), password: DEMO_PASSWORD })))
    const busy = performance.eventLoopUtilization(before)
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200])
    // four bcrypt checks at cost 12 are about a second of CPU; on this thread they kept it near 1
    expect(busy.utilization).toBeLessThan(0.5)
  })

  it('answers the same 401 for a wrong password and an unknown e-mail', async () => {
    const wrong = await request(h.app).post('/api/auth/login').send({ email: demoEmail('reviewer'), password: 'not-the-password' })
    const unknown = await request(h.app).post('/api/auth/login').send({ email: 'nobody@larkspur-solar.example', password: 'not-the-password' })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body).toEqual(unknown.body)
    expect(wrong.body.error.message).toBe(INVALID_CREDENTIALS)
  })

  it('answers 400 naming each missing field', async () => {
    const res = await request(h.app).post('/api/auth/login').send({ email: '' })
    expect(res.status).toBe(400)
    expect(res.body.error.fields.map((f: { field: string }) => f.field).sort()).toEqual(['email', 'password'])
  })

  it('limits failed attempts per account (429) without locking out other accounts', async () => {
    const email = demoEmail('coordinator')
    for (let i = 0; i < h.config.loginLimitPerAccount; i++) {
      expect((await request(h.app).post('/api/auth/login').send({ email, password: `wrong-${i}` })).status).toBe(401)
    }
    const blocked = await request(h.app).post('/api/auth/login').send({ email, password: DEMO_PASSWORD })
    expect(blocked.status).toBe(429)
    expect(blocked.body.error.code).toBe('rate_limited')
    expect((await request(h.app).post('/api/auth/login').send({ email: demoEmail('admin'), password: DEMO_PASSWORD })).status).toBe(200)
  })

  it('limits attempts per client address (429)', async () => {
    const limited = await startHarness({ LOGIN_LIMIT_PER_IP: '3' })
    try {
      for (let i = 0; i < 3; i++) {
        await request(limited.app).post('/api/auth/login').send({ email: `someone${i}@x.example`, password: 'whatever-123' })
      }
      const res = await request(limited.app).post('/api/auth/login').send({ email: 'another@x.example', password: 'whatever-123' })
      expect(res.status).toBe(429)
    } finally {
      await limited.close()
    }
  })
})

describe('access tokens', () => {
  const me = (token: string) => request(h.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)

  it('GET /api/auth/me answers the signed-in user', async () => {
    const { token } = await login(h.app, demoEmail('reviewer'))
    const res = await me(token)
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ role: 'reviewer', licenceNumber: 'EC-40718 (demo)', licenceExpiry: '2028-06-30' })
  })

  it('refuses a missing, expired, tampered, wrongly signed or alg:none token (401)', async () => {
    const { token, user } = await login(h.app, demoEmail('designer'))
    const claims = { org: user.organizationId, role: 'admin' }
    const sign = (secret: string, options: jwt.SignOptions) =>
      jwt.sign(claims, secret, { subject: user.id, issuer: JWT_ISSUER, audience: JWT_AUDIENCE, ...options })
    const expired = sign(h.config.jwtSecret, { algorithm: 'HS256', expiresIn: -10 })
    const wrongKey = sign('another-secret-that-is-long-enough-0123456789', { algorithm: 'HS256', expiresIn: 60 })
    const [head, body] = token.split('.')
    const tamperedBody = Buffer.from(JSON.stringify({ ...JSON.parse(Buffer.from(body!, 'base64url').toString()), role: 'admin' })).toString('base64url')
    const tampered = `${head}.${tamperedBody}.${token.split('.')[2]}`
    const none = `${Buffer.from(JSON.stringify({ alg: 'none', typ: 'JWT' })).toString('base64url')}.${tamperedBody}.`
    expect((await request(h.app).get('/api/auth/me')).status).toBe(401)
    for (const bad of [expired, wrongKey, tampered, none, 'not-a-token']) {
      const res = await me(bad)
      expect(res.status).toBe(401)
      expect(res.body.error.code).toBe('unauthorized')
    }
  })
})

describe('refresh and sign-out', () => {
  it('rotates the refresh token; reusing the old one revokes the whole family', async () => {
    const first = await login(h.app, demoEmail('designer'))
    const oldCookie = cookieValue(first.cookie, 'sl_refresh')
    const rotated = await request(h.app).post('/api/auth/refresh').set('Cookie', oldCookie)
    expect(rotated.status).toBe(200)
    expect(rotated.body.token).toEqual(expect.any(String))
    const newCookie = cookieValue(rotated.headers['set-cookie'] as unknown as string[], 'sl_refresh')
    expect(newCookie).not.toBe(oldCookie)

    const reuse = await request(h.app).post('/api/auth/refresh').set('Cookie', oldCookie)
    expect(reuse.status).toBe(401)
    // the stolen-token case: the newer token of the same family dies too
    expect((await request(h.app).post('/api/auth/refresh').set('Cookie', newCookie)).status).toBe(401)
  })

  it('logout revokes the refresh token and clears the cookie', async () => {
    const session = await login(h.app, demoEmail('reviewer'))
    const cookie = cookieValue(session.cookie, 'sl_refresh')
    const out = await request(h.app).post('/api/auth/logout').set('Cookie', cookie)
    expect(out.status).toBe(204)
    expect((out.headers['set-cookie'] as unknown as string[])[0]).toMatch(/sl_refresh=;/)
    expect((await request(h.app).post('/api/auth/refresh').set('Cookie', cookie)).status).toBe(401)
  })

  it('refresh without a cookie answers 401', async () => {
    expect((await request(h.app).post('/api/auth/refresh')).status).toBe(401)
  })
})
