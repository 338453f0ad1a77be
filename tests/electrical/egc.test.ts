import { describe, expect, it } from 'vitest'
import type { EgcSizing, Derived } from '../../shared/electrical/types'
import { sizeEgc } from '../../shared/electrical/rules/conductors'
import type { EgcSizingInput } from '../../shared/electrical/types'

const base: EgcSizingInput = {
  key: 'run.R1',
  edition: 2023,
  ocpdRatingA: 20,
  maxCurrentA: 14,
  material: 'Cu',
  phaseSizeMinimum: '12',
  phaseSizeChosen: '12',
}

function sized(change: Partial<EgcSizingInput>): EgcSizing {
  const result = sizeEgc({ ...base, ...change })
  if (!result.ok) throw new Error(JSON.stringify(result.issues))
  return result.value
}
const step = (e: EgcSizing, suffix: string): Derived | undefined => e.steps.find((s) => s.key === `run.R1.${suffix}`)
const fields = (change: Record<string, unknown>) => {
  const r = sizeEgc({ ...base, ...change } as EgcSizingInput)
  return r.ok ? [] : r.issues.map((i) => i.field)
}

describe('sizeEgc (NFPA 70-2023 250.122, 690.45; values from memory)', () => {
  it('Table 250.122: 20 A → 12 AWG Cu; 60 A → 10 AWG Cu; 200 A → 4 AWG Al', () => {
    expect(sized({}).size).toBe('12')
    expect(sized({ ocpdRatingA: 60, phaseSizeMinimum: '6', phaseSizeChosen: '6' }).size).toBe('10')
    expect(sized({ ocpdRatingA: 200, material: 'Al', phaseSizeMinimum: '250', phaseSizeChosen: '250' }).size).toBe('4')
  })

  it('PV circuit without a device: 690.45 assumes one rated at the max current', () => {
    // 14 A → the 15 A row → 14 AWG Cu
    const e = sized({ ocpdRatingA: null, phaseSizeMinimum: '10', phaseSizeChosen: '10' })
    expect(e.size).toBe('14')
    expect(step(e, 'egcTable')?.reference).toBe('NEC 2023 690.45; NEC 2023 Table 250.122')
  })

  it('250.122(B): upsized feeder conductors increase the EGC by circular-mil ratio', () => {
    // 200 A → 6 AWG Cu (26,240 cmil); phase 250 → 350 kcmil: 26,240 × 350,000 ÷ 250,000
    // = 36,736 cmil → 4 AWG (41,740 cmil)
    const e = sized({ ocpdRatingA: 200, phaseSizeMinimum: '250', phaseSizeChosen: '350' })
    expect(e.size).toBe('4')
    expect(step(e, 'egcIncrease')).toMatchObject({ value: 36736, reference: 'NEC 2023 250.122(B)' })
  })

  it('690.45: no increase for PV system circuits upsized for voltage drop', () => {
    const e = sized({ ocpdRatingA: 200, phaseSizeMinimum: '250', phaseSizeChosen: '350', pvSystemCircuit: true })
    expect(e.size).toBe('6')
    expect(step(e, 'egcIncrease')?.reference).toBe('NEC 2023 690.45')
  })

  it('250.122(A): never larger than the circuit conductors', () => {
    // 30 A → 10 AWG by the table, but the circuit is 12 AWG (e.g. a tap protected upstream)
    const e = sized({ ocpdRatingA: 30, phaseSizeMinimum: '12', phaseSizeChosen: '12' })
    expect(e.size).toBe('12')
    expect(step(e, 'egcSize')?.reference).toBe('NEC 2023 250.122(A)')
  })

  it('prints the 2017 references alike (same numbers in every edition)', () => {
    expect(step(sized({ edition: 2017 }), 'egcTable')?.reference).toBe('NEC 2017 Table 250.122')
  })

  it('names the field of bad or out-of-table input', () => {
    expect(fields({ ocpdRatingA: 0 })).toEqual(['ocpdRatingA'])
    expect(fields({ ocpdRatingA: 7000, phaseSizeMinimum: '2000', phaseSizeChosen: '2000' })).toEqual(['ocpdRatingA'])
    expect(fields({ ocpdRatingA: null, maxCurrentA: Number.NaN })).toEqual(['maxCurrentA'])
    expect(fields({ material: 'Zn' })).toEqual(['material'])
    expect(fields({ phaseSizeMinimum: '7' })).toEqual(['phaseSizeMinimum'])
    expect(fields({ phaseSizeChosen: '14' })).toEqual(['phaseSizeChosen'])
    expect(fields({ pvSystemCircuit: 'no' })).toEqual(['pvSystemCircuit'])
    // 5000 A aluminium: the table prints 1200 kcmil, not a size the engine carries
    expect(fields({ ocpdRatingA: 5000, material: 'Al', phaseSizeMinimum: '2000', phaseSizeChosen: '2000' })).toEqual(['material'])
  })
})
