import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS } from '../../shared/demo/designs'
import { SAFETY_CAUTION } from '../../shared/electrical/caution'
import { seedTwoOrganizations, startHarness, tokensByRole, type Harness } from './support/harness'
import type { Role } from '../../shared/auth/roles'

let h: Harness
let tokens: Record<Role, string>

beforeAll(async () => {
  h = await startHarness()
  await seedTwoOrganizations(h)
  tokens = await tokensByRole(h.app)
})
afterAll(() => h.close())

const calculate = (role: Role, body: unknown) =>
  request(h.app).post('/api/calculations').set('Authorization', `Bearer ${tokens[role]}`).send(body as object)

describe('POST /api/calculations', () => {
  it('computes every demo design for any signed-in role, with the caution and derivations', async () => {
    for (const [key, design] of Object.entries(DEMO_DESIGN_INPUTS)) {
      const res = await calculate('reviewer', design)
      expect(res.status, key).toBe(200)
      expect(res.body.valid, key).toBe(true)
      expect(res.body.caution).toBe(SAFETY_CAUTION)
      expect(res.body.runs.length, key).toBeGreaterThan(0)
      for (const section of res.body.sections) {
        for (const item of section.items) {
          expect(item, `${key} ${item.key}`).toMatchObject({ unit: expect.any(String), formula: expect.any(String), status: expect.any(String) })
          // JSON turns NaN and Infinity into null, so a null value here would be a lost number
          expect(item.value, `${key} ${item.key}`).not.toBeNull()
        }
      }
    }
  })

  it('answers 400 naming each bad field of an invalid document', async () => {
    const broken = structuredClone(DEMO_DESIGN_INPUTS.gridTied) as Record<string, unknown>
    ;(broken.codeBasis as Record<string, unknown>).necEdition = 2011
    const res = await calculate('designer', broken)
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_design')
    expect(res.body.error.fields.map((f: { field: string }) => f.field)).toContain('codeBasis.necEdition')
  })

  it('answers 400 for a body that is not a design at all', async () => {
    const res = await calculate('coordinator', [1, 2, 3])
    expect(res.status).toBe(400)
    expect(res.body.error.fields.length).toBeGreaterThan(0)
  })

  it('requires sign-in', async () => {
    expect((await request(h.app).post('/api/calculations').send(DEMO_DESIGN_INPUTS.gridTied)).status).toBe(401)
  })
})

describe('GET /api/calculations/schema', () => {
  it('returns the design document JSON Schema', async () => {
    const res = await request(h.app).get('/api/calculations/schema').set('Authorization', `Bearer ${tokens.designer}`)
    expect(res.status).toBe(200)
    expect(res.body.type).toBe('object')
    expect(Object.keys(res.body.properties)).toEqual(expect.arrayContaining(['codeBasis', 'equipment', 'topology']))
  })
})
