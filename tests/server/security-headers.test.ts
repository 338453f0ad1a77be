import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { DEMO_PASSWORD } from '../../server/demo/seed'
import { buildRoutes } from '../../server/routes'
import { demoEmail, login, seedTwoOrganizations, startHarness, testConfig, type Harness } from './support/harness'

/**
 * Security headers on every answer of every route (helmet's defaults, with our CSP), including
 * refusals and errors; the refresh cookie's flags in development and in production.
 */
let h: Harness
let token: string
beforeAll(async () => {
  h = await startHarness()
  await seedTwoOrganizations(h)
  token = (await login(h.app, demoEmail('admin'))).token
}, 60_000)
afterAll(() => h.close())

const UNKNOWN = '00000000-0000-4000-8000-000000000000'

function expectSecurityHeaders(res: request.Response, label: string): void {
  const headers = res.headers
  expect(headers['x-content-type-options'], label).toBe('nosniff')
  expect(headers['x-frame-options'], label).toBe('SAMEORIGIN')
  expect(headers['referrer-policy'], label).toBe('no-referrer')
  expect(headers['strict-transport-security'], label).toMatch(/max-age=\d+/)
  expect(headers['cross-origin-opener-policy'], label).toBe('same-origin')
  expect(headers['cross-origin-resource-policy'], label).toBe('same-origin')
  expect(headers['x-powered-by'], label).toBeUndefined()
  const csp = headers['content-security-policy'] as string
  expect(csp, label).toContain("default-src 'self'")
  expect(csp, label).toContain("frame-ancestors 'self'")
  expect(csp, label).toContain("script-src 'self'")
  expect(csp, label).not.toContain('unsafe-eval')
}

describe('security headers', () => {
  it('come with every route of the table, signed in or not, allowed or refused', async () => {
    for (const r of buildRoutes(testConfig())) {
      const path = r.path.replace(/:(\w+)/g, UNKNOWN)
      const label = `${r.method.toUpperCase()} ${r.path}`
      expectSecurityHeaders(await request(h.app)[r.method](path), `${label} signed out`)
      expectSecurityHeaders(await request(h.app)[r.method](path).set('Authorization', `Bearer ${token}`).send({}), `${label} as admin`)
    }
  }, 60_000)

  it('come with errors too: an unknown API path, malformed JSON, a wrong content type', async () => {
    expectSecurityHeaders(await request(h.app).get('/api/no-such-thing'), '404')
    expectSecurityHeaders(await request(h.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":'), 'malformed JSON')
    expectSecurityHeaders(await request(h.app).post('/api/auth/login').set('Content-Type', 'text/plain').send('hello'), 'text body')
  })
})

describe('the refresh cookie', () => {
  const refreshCookie = (res: request.Response) => (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('sl_refresh='))!

  it('is httpOnly, SameSite=Strict and scoped to /api/auth; not Secure over plain http in development', async () => {
    const res = await request(h.app).post('/api/auth/login').send({ email: demoEmail('designer'), password: DEMO_PASSWORD })
    const cookie = refreshCookie(res)
    expect(cookie).toMatch(/; HttpOnly/i)
    expect(cookie).toMatch(/; SameSite=Strict/i)
    expect(cookie).toMatch(/; Path=\/api\/auth/)
    expect(cookie).not.toMatch(/; Secure/i)
    expect(cookie).toMatch(/; Expires=/)
    // the access token is never a cookie
    expect((res.headers['set-cookie'] as unknown as string[]).some((c) => c.includes(res.body.token))).toBe(false)
  })

  it('is Secure in production', async () => {
    const production = createApp({ db: h.db, config: testConfig({ NODE_ENV: 'production' }) })
    const res = await request(production).post('/api/auth/login').send({ email: demoEmail('coordinator'), password: DEMO_PASSWORD })
    expect(res.status).toBe(200)
    expect(refreshCookie(res)).toMatch(/; Secure/i)
    expectSecurityHeaders(res, 'production login')
  })
})
