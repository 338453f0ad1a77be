import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { loadDemoWorkspace } from '../../server/demo/workspace'
import { EquipmentItemEntity, JurisdictionProfileEntity, ProjectEntity, UserEntity } from '../../server/entities'
import { buildRoutes } from '../../server/routes'
import type { AnyRoute } from '../../server/http/route'
import { ROLES, type Role } from '../../shared/auth/roles'
import { login, seedTwoOrganizations, startHarness, testConfig, type Harness } from './support/harness'

/**
 * The route × role × organisation matrix, generated from the route table: every declared route is
 * called by every role of the demo organisation with an unknown id, with an id of a foreign
 * organisation, and (for reads without parameters) plainly. Denied roles get 403; allowed roles
 * get past the guard; a foreign id answers exactly as an unknown one (404, never 403 or 2xx). The
 * calls use unknown or foreign ids only, so nothing of the demo organisation changes.
 */

const routes = buildRoutes(testConfig()).filter((r) => r.access !== 'public')
const key = (r: AnyRoute) => `${r.method.toUpperCase()} ${r.path}`
const UNKNOWN_ID = '00000000-0000-4000-8000-000000000000'

/** Entity whose id a route's `:id` names, by the path's first segment under /api/. */
const ID_OWNERS = {
  projects: ProjectEntity,
  equipment: EquipmentItemEntity,
  jurisdictions: JurisdictionProfileEntity,
  users: UserEntity,
} as const
/** Values for the other path parameters (they address things under the `:id`). */
const OTHER_PARAMS: Record<string, string> = { number: '0', name: 'plan-set.pdf', jobId: UNKNOWN_ID, kind: 'module', commentId: UNKNOWN_ID, fileId: UNKNOWN_ID, messageId: '1700000000000-00000000' }

let h: Harness
let tokens: Record<Role, string>
const foreignIds = {} as Record<keyof typeof ID_OWNERS, string>
/** Every id of the foreign organisation's rows, to look for in what lists answer. */
const everyForeignId: string[] = []

beforeAll(async () => {
  // with the development mail catcher, so its pages answer as they do under npm start
  h = await startHarness({}, { mail: true })
  const { foreign } = await seedTwoOrganizations(h)
  await h.db.transaction((manager) => loadDemoWorkspace(manager, foreign.id))
  for (const [segment, entity] of Object.entries(ID_OWNERS)) {
    const rows = await h.db.getRepository<{ id: string }>(entity).findBy({ organizationId: foreign.id } as never)
    expect(rows.length, `foreign ${segment}`).toBeGreaterThan(0)
    foreignIds[segment as keyof typeof ID_OWNERS] = rows[0]!.id
    everyForeignId.push(...rows.map((row) => row.id))
  }
  tokens = Object.fromEntries(
    await Promise.all(ROLES.map(async (role) => [role, (await login(h.app, `${role}@larkspur-solar.example`)).token] as const)),
  ) as Record<Role, string>
}, 60_000)
afterAll(() => h.close())

function pathWith(r: AnyRoute, id: string): string {
  return r.path.replace(/:(\w+)/g, (_, name: string) => {
    if (name === 'id') return id
    const value = OTHER_PARAMS[name]
    if (value === undefined) throw new Error(`${key(r)}: no matrix value for path parameter :${name}; add one to OTHER_PARAMS`)
    return value
  })
}

function idOwner(r: AnyRoute): keyof typeof ID_OWNERS {
  const segment = r.path.split('/')[2]!
  if (!(segment in ID_OWNERS)) throw new Error(`${key(r)}: no fixture for ids under /api/${segment}; add its entity to ID_OWNERS`)
  return segment as keyof typeof ID_OWNERS
}

const call = (r: AnyRoute, path: string, role: Role) => request(h.app)[r.method](path).set('Authorization', `Bearer ${tokens[role]}`)

describe('route × role × organisation matrix', () => {
  it('covers every non-public route of the table', () => {
    expect(routes.length).toBeGreaterThan(20)
    for (const r of routes.filter((x) => x.path.includes(':id'))) idOwner(r)
  })

  for (const r of routes) {
    const allowed = new Set(r.access as readonly Role[])
    it(key(r), async () => {
      for (const role of ROLES) {
        if (r.path.includes(':id')) {
          const unknown = await call(r, pathWith(r, UNKNOWN_ID), role)
          const foreign = await call(r, pathWith(r, foreignIds[idOwner(r)]), role)
          if (!allowed.has(role)) {
            expect(unknown.status, `${role} unknown id`).toBe(403)
            expect(foreign.status, `${role} foreign id`).toBe(403)
            continue
          }
          expect([401, 403], `${role} unknown id`).not.toContain(unknown.status)
          expect(unknown.status, `${role} unknown id answers below 500`).toBeLessThan(500)
          // a foreign id is indistinguishable from an id that does not exist
          expect(foreign.status, `${role} foreign id`).toBe(unknown.status)
          expect(foreign.status, `${role} foreign id is never served`).toBeGreaterThanOrEqual(400)
        } else if (r.method === 'get' && r.path.includes(':')) {
          // addresses something that is not an organisation's row (a caught message): the guard, then no 5xx
          const res = await call(r, pathWith(r, UNKNOWN_ID), role)
          if (!allowed.has(role)) expect(res.status, role).toBe(403)
          else {
            expect([401, 403], role).not.toContain(res.status)
            expect(res.status, role).toBeLessThan(500)
          }
        } else if (r.method === 'get') {
          const res = await call(r, pathWith(r, UNKNOWN_ID), role)
          if (!allowed.has(role)) expect(res.status, role).toBe(403)
          else {
            expect(res.status, role).toBe(200)
            const body = JSON.stringify(res.body)
            expect(body, `${role} sees nothing of the foreign organisation`).not.toMatch(/quillfeather/i)
            for (const id of everyForeignId) expect(body.includes(id), `${role} sees foreign id ${id}`).toBe(false)
          }
        } else {
          // writes without an id: an empty body is refused by validation, after the guard
          const res = await call(r, r.path, role).send({})
          if (!allowed.has(role)) expect(res.status, role).toBe(403)
          else {
            expect([401, 403], role).not.toContain(res.status)
            expect(res.status, role).toBeLessThan(500)
          }
        }
      }
    }, 30_000)
  }
})
