import { describe, expect, it } from 'vitest'
import type { OcpdSizingInput, OcpdSizing, Derived } from '../../shared/electrical/types'
import { sizeOcpd } from '../../shared/electrical/rules/conductors'
import { conductorProtectionLimit, minimumOcpdRatingA } from '../../shared/electrical/rules/ocpd'

const base: OcpdSizingInput = {
  key: 'run.R1',
  edition: 2023,
  maxCurrentA: 14,
  continuous: true,
  conductorAmpacityA: 21.84,
  conductorSize: '12',
  material: 'Cu',
}

function sized(change: Partial<OcpdSizingInput>): OcpdSizing {
  const result = sizeOcpd({ ...base, ...change })
  if (!result.ok) throw new Error(JSON.stringify(result.issues))
  return result.value
}
const step = (s: OcpdSizing, suffix: string): Derived => s.steps.find((x) => x.key === `run.R1.${suffix}`) as Derived

describe('sizeOcpd (NFPA 70-2023 690.9(B), 240.4, 240.6(A); values from memory)', () => {
  it('PV source circuit: 1.25 × 14 A = 17.5 A → 20 A protects 12 AWG Cu (240.4(D) 20 A)', () => {
    const s = sized({})
    expect(s.ratingA).toBe(20)
    expect(step(s, 'ocpdMinimum')).toMatchObject({ value: 17.5, reference: 'NEC 2023 690.9(B)(1)', formula: '1.25 × 14 A = 17.5 A' })
    // 21.84 A → next standard 25 A (240.4(B)), capped at 20 A for 12 AWG Cu by 240.4(D)(5)
    expect(step(s, 'conductorProtection')).toMatchObject({ value: 20, status: 'pass', reference: 'NEC 2023 240.4(B), 240.4(D)' })
  })

  it('inverter output 48 A on 6 AWG (65 A) → 60 A device, 240.4(B) allows up to 70 A', () => {
    const s = sized({ maxCurrentA: 48, conductorAmpacityA: 65, conductorSize: '6' })
    expect(s.ratingA).toBe(60)
    expect(step(s, 'conductorProtection')).toMatchObject({ value: 70, status: 'pass' })
  })

  it('fails when the device would not protect the conductor', () => {
    // 40 A continuous → 50 A device; 8 AWG at 41.8 A → next standard 45 A < 50 A
    const s = sized({ maxCurrentA: 40, conductorAmpacityA: 41.8, conductorSize: '8' })
    expect(s.ratingA).toBe(50)
    expect(step(s, 'ocpdRating').status).toBe('fail')
    expect(step(s, 'conductorProtection')).toMatchObject({ value: 45, status: 'fail' })
  })

  it('above 800 A the conductor ampacity must reach the rating (240.4(C))', () => {
    // 700 A continuous → 875 A → 1000 A device
    expect(step(sized({ maxCurrentA: 700, conductorAmpacityA: 950, conductorSize: '500' }), 'conductorProtection')).toMatchObject({
      value: 950,
      status: 'fail',
      reference: 'NEC 2023 240.4(C)',
    })
    expect(step(sized({ maxCurrentA: 700, conductorAmpacityA: 1010, conductorSize: '500' }), 'ocpdRating').status).toBe('pass')
  })

  it('next size up stops at 800 A (240.4(B)(3))', () => {
    expect(conductorProtectionLimit(760, '500', 'Cu').limitA).toBe(800)
    expect(conductorProtectionLimit(801, '500', 'Cu')).toMatchObject({ limitA: 801, sections: '240.4(C)' })
    // a standard ampacity is its own limit
    expect(conductorProtectionLimit(65, '6', 'Cu').limitA).toBe(70)
    expect(conductorProtectionLimit(60, '6', 'Cu').limitA).toBe(60)
    // 240.4(D)(6): 10 AWG Al at most 25 A
    expect(conductorProtectionLimit(32, '10', 'Al').limitA).toBe(25)
  })

  it('not continuous: the device may equal the current', () => {
    expect(minimumOcpdRatingA(40, false)).toBe(40)
    expect(sized({ maxCurrentA: 40, continuous: false, conductorAmpacityA: 50, conductorSize: '8' }).ratingA).toBe(40)
  })

  it('says when the rating is a fuse-only standard rating', () => {
    // 1.25 × 7 A = 8.75 A → 10 A, a fuse-only rating in 240.6(A)
    const s = sized({ maxCurrentA: 7, conductorAmpacityA: 30, conductorSize: '10' })
    expect(s.ratingA).toBe(10)
    expect(step(s, 'ocpdRating').message).toContain('fuses only')
  })

  it('names the field of bad input', () => {
    const fields = (change: Record<string, unknown>) => {
      const r = sizeOcpd({ ...base, ...change } as OcpdSizingInput)
      return r.ok ? [] : r.issues.map((i) => i.field)
    }
    expect(fields({ maxCurrentA: 0 })).toEqual(['maxCurrentA'])
    expect(fields({ conductorAmpacityA: Number.NaN })).toEqual(['conductorAmpacityA'])
    expect(fields({ conductorSize: '11' })).toEqual(['conductorSize'])
    expect(fields({ material: 'Ag' })).toEqual(['material'])
    expect(fields({ continuous: 1 })).toEqual(['continuous'])
    expect(fields({ edition: 2026 })).toEqual(['edition'])
    // 1.25 × 5000 A = 6250 A, above the largest standard rating
    expect(fields({ maxCurrentA: 5000 })).toEqual(['maxCurrentA'])
  })
})
