import { describe, expect, it } from 'vitest'
import type { ConduitFillInput, ConduitFill } from '../../shared/electrical/types'
import { conduitFill } from '../../shared/electrical/rules/conductors'

const base: ConduitFillInput = {
  key: 'run.R1',
  edition: 2023,
  raceway: 'EMT',
  conductors: [
    { size: '10', insulation: 'PV', count: 4 },
    { size: '10', insulation: 'THWN-2', count: 1 },
  ],
}

function filled(change: Partial<ConduitFillInput>): ConduitFill {
  const result = conduitFill({ ...base, ...change })
  if (!result.ok) throw new Error(JSON.stringify(result.issues))
  return result.value
}
const fields = (change: Record<string, unknown>) => {
  const r = conduitFill({ ...base, ...change } as ConduitFillInput)
  return r.ok ? [] : r.issues.map((i) => i.field)
}
const twelves = (count: number) => [{ size: '12' as const, insulation: 'THWN-2' as const, count }]

describe('conduitFill (NFPA 70-2023 Chapter 9 Tables 1, 4, 5; values from memory)', () => {
  it('4 × 10 AWG PV wire + 10 AWG EGC in EMT → 3/4', () => {
    // 4 × 0.0333 + 0.0211 = 0.1543 in²; 5 conductors → 40 %
    // 1/2 EMT: 0.122 in² at 40 % < 0.1543; 3/4 EMT: 0.213 in² ≥ 0.1543 → 0.1543 ÷ 0.533 = 28.9 %
    const f = filled({})
    expect(f.tradeSize).toBe('3/4')
    expect(f.fillPercent).toBeCloseTo(28.95, 2)
    expect(f.steps.find((s) => s.key === 'run.R1.conductorArea')?.value).toBeCloseTo(0.1543, 6)
  })

  it('one conductor may fill 53 %, two 31 %', () => {
    // 1 × 4/0 THWN-2 0.3237 in²: 3/4 EMT 0.533 × 53 % = 0.2825 < 0.3237; 1 EMT 0.864 × 53 % = 0.458 → 1
    expect(filled({ conductors: [{ size: '4/0', insulation: 'THWN-2', count: 1 }] }).tradeSize).toBe('1')
    // 2 × 6 AWG THWN-2 = 0.1014 in²: 1/2 EMT 0.304 × 31 % = 0.0942 < 0.1014 → 3/4
    expect(filled({ conductors: [{ size: '6', insulation: 'THWN-2', count: 2 }] }).tradeSize).toBe('3/4')
  })

  it('agrees with Annex C Table C.1 (EMT, THHN/THWN-2) maximum counts', () => {
    // NFPA 70-2023 Annex C Table C.1 (values from memory): 1/2 EMT holds 9 × 12 AWG, 3/4 EMT 16 × 12 AWG,
    // 1/2 EMT 5 × 10 AWG
    expect(filled({ conductors: twelves(9) }).tradeSize).toBe('1/2')
    expect(filled({ conductors: twelves(10) }).tradeSize).toBe('3/4')
    expect(filled({ conductors: twelves(16) }).tradeSize).toBe('3/4')
    expect(filled({ conductors: twelves(17) }).tradeSize).toBe('1')
    expect(filled({ conductors: [{ size: '10', insulation: 'THWN-2', count: 5 }] }).tradeSize).toBe('1/2')
    expect(filled({ conductors: [{ size: '10', insulation: 'THWN-2', count: 6 }] }).tradeSize).toBe('3/4')
  })

  it('uses each raceway kind\'s own Table 4 areas', () => {
    // 0.1543 in² at 40 %: PVC 80 3/4 holds 0.164 in² → 3/4; RMC 1/2 holds 0.125 → 3/4
    expect(filled({ raceway: 'PVC80' }).tradeSize).toBe('3/4')
    expect(filled({ raceway: 'RMC' }).tradeSize).toBe('3/4')
    expect(filled({ raceway: 'PVC40', conductors: twelves(8) }).tradeSize).toBe('1/2')
  })

  it('more than the largest raceway holds is an issue on conductors', () => {
    expect(fields({ conductors: [{ size: '1000', insulation: 'THWN-2', count: 6 }] })).toEqual(['conductors'])
  })

  it('names the group and field of bad input', () => {
    expect(fields({ conductors: [] })).toEqual(['conductors'])
    expect(fields({ raceway: 'FREE_AIR' })).toEqual(['raceway'])
    expect(fields({ conductors: [{ size: '10', insulation: 'PV', count: 4 }, { size: '9', insulation: 'PV', count: 1 }] })).toEqual(['conductors[1].size'])
    expect(fields({ conductors: [{ size: '10', insulation: 'PV', count: 0 }] })).toEqual(['conductors[0].count'])
    expect(fields({ conductors: [{ size: '10', insulation: 'TW', count: 1 }] })).toEqual(['conductors[0].insulation'])
    // THWN-2 stops at 1000 kcmil in Table 5
    expect(fields({ conductors: [{ size: '2000', insulation: 'THWN-2', count: 1 }] })).toEqual(['conductors[0].size'])
    expect(fields({ conductors: [null] })).toEqual(['conductors[0]'])
  })
})
