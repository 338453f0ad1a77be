import fc from 'fast-check'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { anyDesign, numbersIn } from '../support/design-fuzz'
import { seedTwoOrganizations, startHarness, tokensByRole, type Harness } from './support/harness'

let h: Harness
let token: string

beforeAll(async () => {
  h = await startHarness()
  await seedTwoOrganizations(h)
  token = (await tokensByRole(h.app)).designer
})
afterAll(() => h.close())

/** A sample of the fuzz run against POST /api/calculations (the benchmark runs 10,000). */
describe('POST /api/calculations fuzz sample', () => {
  it('answers 200 with finite results or 400 naming each field; never a 5xx', async () => {
    await fc.assert(
      fc.asyncProperty(anyDesign, async ({ doc }) => {
        const res = await request(h.app).post('/api/calculations').set('Authorization', `Bearer ${token}`).set('Content-Type', 'application/json').send(JSON.stringify(doc ?? null))
        expect([200, 400], JSON.stringify(res.body).slice(0, 300)).toContain(res.status)
        if (res.status === 200) {
          // JSON turns NaN and Infinity into null: a null derivation value would be a lost number
          for (const section of res.body.sections) for (const item of section.items) expect(item.value, item.key).not.toBeNull()
          expect(numbersIn(res.body).every(Number.isFinite)).toBe(true)
        } else {
          expect(res.body.error.fields.length).toBeGreaterThan(0)
          for (const f of res.body.error.fields) expect(f.field.length * f.message.length).toBeGreaterThan(0)
        }
      }),
      { numRuns: 200 },
    )
  }, 120_000)
})
