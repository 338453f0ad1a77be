import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { buildRoutes } from '../../server/routes'
import { ROLES } from '../../shared/auth/roles'
import { startHarness, testConfig, type Harness } from './support/harness'

/** Routes open to callers who are not signed in; anything else must name its roles. */
const PUBLIC_ROUTES = ['GET /api/health', 'GET /api/docs', 'POST /api/auth/login', 'POST /api/auth/refresh', 'POST /api/auth/logout', 'GET /api/verify/:code', 'POST /api/verify']

const routes = buildRoutes(testConfig())
const key = (r: { method: string; path: string }) => `${r.method.toUpperCase()} ${r.path}`

let h: Harness
beforeAll(async () => {
  h = await startHarness()
})
afterAll(() => h.close())

describe('the route table', () => {
  it('every route declares who may call it', () => {
    for (const r of routes) {
      if (r.access === 'public') expect(PUBLIC_ROUTES, key(r)).toContain(key(r))
      else {
        expect(r.access.length, key(r)).toBeGreaterThan(0)
        for (const role of r.access) expect(ROLES).toContain(role)
      }
      expect(r.summary.length, key(r)).toBeGreaterThan(5)
    }
    expect(new Set(routes.map(key)).size).toBe(routes.length)
  })

  it('every API route Express serves comes from the table', () => {
    const declared = new Set(routes.map(key))
    type Layer = { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: Layer[] } }
    const served: string[] = []
    const walk = (stack: Layer[]) => {
      for (const layer of stack) {
        if (layer.route) for (const m of Object.keys(layer.route.methods)) served.push(`${m.toUpperCase()} ${layer.route.path}`)
        else if (layer.handle?.stack) walk(layer.handle.stack)
      }
    }
    walk((h.app as unknown as { router: { stack: Layer[] } }).router.stack)
    const apiServed = served.filter((s) => s.split(' ')[1]!.startsWith('/api/'))
    expect(apiServed.length).toBeGreaterThan(0)
    for (const s of apiServed) expect(declared, s).toContain(s)
  })

  it('every non-public route answers 401 without a token', async () => {
    for (const r of routes.filter((x) => x.access !== 'public')) {
      const path = r.path.replace(/:(\w+)/g, '00000000-0000-4000-8000-000000000000')
      const res = await request(h.app)[r.method](path)
      expect(res.status, key(r)).toBe(401)
    }
  })
})
