import { describe, expect, it } from 'vitest'
import type { ConductorSelectionInput, Derived, Outcome, ConductorSelection } from '../../shared/electrical/types'
import { nextLargerSize, selectConductor } from '../../shared/electrical/rules/conductors'

/** A PV source circuit on a roof, edited per test. */
const base: ConductorSelectionInput = {
  key: 'run.R1',
  edition: 2023,
  maxCurrentA: 14,
  continuous: true,
  material: 'Cu',
  insulation: 'PV',
  method: 'EMT',
  ambientC: 38,
  rooftopHeightIn: 1,
  currentCarryingConductors: 4,
  terminalRatingC: 75,
}

function selected(input: Partial<ConductorSelectionInput>): ConductorSelection {
  const result = selectConductor({ ...base, ...input })
  if (!result.ok) throw new Error(JSON.stringify(result.issues))
  return result.value
}

const step = (selection: ConductorSelection, suffix: string): Derived => {
  const found = selection.steps.find((s) => s.key.endsWith(`.${suffix}`))
  if (!found) throw new Error(`no step ${suffix}`)
  return found
}

const issueFields = (result: Outcome<unknown>) => (result.ok ? [] : result.issues.map((i) => i.field))

describe('selectConductor worked examples (NFPA 70-2023, values from memory)', () => {
  it('PV wire, 14 A, 4 CCC in EMT 1 in above a roof at 38 °C → 12 AWG', () => {
    // By hand:
    // 690.8(B)(1): 1.25 × 14 A = 17.5 A in the 75 °C column: 14 AWG (20 A) would do.
    // 310.15(B)(2): raceway 1 in ≥ 7/8 in above the roof → no adder.
    // Table 310.15(B)(1), 90 °C column, 36–40 °C → 0.91; Table 310.15(C)(1), 4 CCC → 0.80.
    // 690.8(B)(2): 14 A ÷ (0.91 × 0.80) = 19.23 A; 14 AWG 90 °C 25 A ≥ 19.23 A would do.
    // 690.9(B): device ≥ 17.5 A → 20 A (240.6(A)); 240.4(D)(3) limits 14 AWG Cu to 15 A → no.
    // 12 AWG: 75 °C 25 A ≥ 17.5 A; 30 A × 0.728 = 21.84 A ≥ 14 A; 240.4(D)(5) 20 A ≥ 20 A → yes.
    const s = selected({})
    expect(s.size).toBe('12')
    expect(s.parallelSets).toBe(1)
    expect(s.ampacityA).toBeCloseTo(21.84, 6)
    expect(step(s, 'requiredAmpacityWithoutFactors').value).toBe(17.5)
    expect(step(s, 'rooftopAdder').value).toBe(0)
    expect(step(s, 'temperatureCorrection').value).toBe(0.91)
    expect(step(s, 'adjustmentFactor').value).toBe(0.8)
    expect(step(s, 'requiredAmpacityWithFactors').value).toBeCloseTo(19.23, 2)
    expect(step(s, 'conductorProtection')).toMatchObject({ value: 20, reference: 'NEC 2023 240.4(B), 240.4(D)', status: 'pass' })
    expect(step(s, 'ampacity').status).toBe('pass')
  })

  it('same circuit 1/2 in above the roof: 33 °C adder → 10 AWG', () => {
    // 310.15(B)(2): 0.5 in < 7/8 in → 38 + 33 = 71 °C → 90 °C column 71–75 °C → 0.50.
    // 14 A ÷ (0.50 × 0.80) = 35 A: 12 AWG (30 A) no, 10 AWG (40 A) yes: 40 × 0.4 = 16 A.
    // Device 20 A; 16 A → next standard 20 A (240.4(B)) ≥ 20 A.
    const s = selected({ rooftopHeightIn: 0.5 })
    expect(s.size).toBe('10')
    expect(s.ampacityA).toBeCloseTo(16, 6)
    expect(step(s, 'rooftopAdder')).toMatchObject({ value: 33, reference: 'NEC 2023 310.15(B)(2)' })
    expect(step(s, 'temperatureCorrection')).toMatchObject({ value: 0.5, reference: 'NEC 2023 Table 310.15(B)(1)' })
    expect(step(s, 'temperatureCorrection').formula).toContain('38 °C + 33 °C = 71 °C')
    expect(step(s, 'requiredAmpacityWithFactors').formula).toBe('14 A ÷ (0.5 × 0.8) = 35 A')
  })

  it('XHHW-2 is exempt from the rooftop adder → back to 12 AWG', () => {
    // 310.15(B)(2) Exception: XHHW-2 not subject to the adder → 0.91 as in the first example.
    const s = selected({ rooftopHeightIn: 0.5, insulation: 'XHHW-2' })
    expect(step(s, 'rooftopAdder').value).toBe(0)
    expect(s.size).toBe('12')
  })

  it('2017 edition prints its own section numbers', () => {
    const s = selected({ edition: 2017, rooftopHeightIn: 0.5 })
    expect(step(s, 'rooftopAdder').reference).toBe('NEC 2017 310.15(B)(3)(c)')
    expect(step(s, 'temperatureCorrection').reference).toBe('NEC 2017 Table 310.15(B)(2)(a)')
    expect(step(s, 'adjustmentFactor').reference).toBe('NEC 2017 Table 310.15(B)(3)(a)')
    expect(step(s, 'terminalAmpacity').reference).toBe('NEC 2017 110.14(C); NEC 2017 Table 310.15(B)(16)')
    expect(s.size).toBe('10')
  })

  it('inverter output 48 A, THWN-2 in PVC at 40 °C → 6 AWG limited by 75 °C terminals', () => {
    // 1.25 × 48 = 60 A in the 75 °C column: 8 AWG (50 A) no, 6 AWG (65 A) yes.
    // 90 °C: 75 A × 0.91 × 1.00 = 68.25 A ≥ 48 A. Ampacity min(68.25, 65) = 65 A (110.14(C)).
    // Device 60 A; 65 A → next standard 70 A ≥ 60 A.
    const s = selected({ maxCurrentA: 48, insulation: 'THWN-2', method: 'PVC40', ambientC: 40, rooftopHeightIn: null, currentCarryingConductors: 3 })
    expect(s.size).toBe('6')
    expect(s.ampacityA).toBe(65)
    expect(step(s, 'ampacity').message).toContain('limited by the 75 °C terminals')
    expect(step(s, 'adjustmentFactor').value).toBe(1)
  })

  it('free air uses Table 310.17 and no rooftop adder → 12 AWG at 35 A', () => {
    // Table 310.17: 14 AWG 75 °C 30 A, but 240.4(D) 15 A < 20 A device. 12 AWG: 75 °C 35 A,
    // 90 °C 40 A × 0.91 = 36.4 A; ampacity min(36.4, 35) = 35 A.
    const s = selected({ method: 'FREE_AIR', ambientC: 40, rooftopHeightIn: 0.5, currentCarryingConductors: 1 })
    expect(s.size).toBe('12')
    expect(s.ampacityA).toBe(35)
    expect(step(s, 'rooftopAdder').value).toBe(0)
    expect(step(s, 'terminalAmpacity').reference).toContain('Table 310.17')
  })

  it('aluminium XHHW-2, 100 A continuous at 30 °C → 2/0 Al', () => {
    // 1.25 × 100 = 125 A, 75 °C Al: 1/0 120 A no, 2/0 135 A yes; 90 °C 150 A ≥ 100 A.
    // Device 125 A; ampacity min(150, 135) = 135 A → next standard 150 A ≥ 125 A.
    const s = selected({ maxCurrentA: 100, material: 'Al', insulation: 'XHHW-2', method: 'PVC40', ambientC: 30, rooftopHeightIn: null, currentCarryingConductors: 3 })
    expect(s.size).toBe('2/0')
    expect(s.ampacityA).toBe(135)
  })

  it('not continuous: the current itself is checked in the terminal column', () => {
    // 40 A non-continuous, 75 °C Cu: 8 AWG 50 A ≥ 40 A; 90 °C 55 A ≥ 40 A; device 40 A ≤ 50 A.
    const s = selected({ maxCurrentA: 40, continuous: false, insulation: 'THWN-2', ambientC: 30, rooftopHeightIn: null, currentCarryingConductors: 2 })
    expect(s.size).toBe('8')
    expect(step(s, 'requiredAmpacityWithoutFactors').formula).toBe('40 A (not continuous)')
  })

  it('the caller\'s minimum size governs when larger', () => {
    const s = selected({ maxCurrentA: 5, minimumSize: '10' })
    expect(s.size).toBe('10')
    expect(step(s, 'ampacity').message).toContain('minimum size the circuit requires')
  })

  it('600 A continuous needs parallel sets: 2 × 500 kcmil Cu with a warning', () => {
    // 1.25 × 600 = 750 A > 665 A (2000 kcmil at 75 °C) → parallel, 310.10(G) in 2023.
    // Two sets: 375 A each at 75 °C → 500 kcmil (380 A); 90 °C 430 A ≥ 300 A.
    // Ampacity min(430, 380) = 380 A per set, 760 A for both; device 800 A; 760 A → next standard 800 A (240.4(B)).
    const s = selected({ maxCurrentA: 600, insulation: 'THWN-2', method: 'PVC40', ambientC: 30, rooftopHeightIn: null, currentCarryingConductors: 3 })
    expect(s).toMatchObject({ size: '500', parallelSets: 2, ampacityA: 380 })
    expect(step(s, 'ampacity').formula).toBe('min(430 A, 380 A) = 380 A per set; 2 sets = 760 A')
    expect(step(s, 'ampacity').status).toBe('warn')
    expect(step(s, 'ampacity').message).toContain('Parallel conductors are needed (NEC 2023 310.10(G))')
    const s2020 = selected({ edition: 2020, maxCurrentA: 600, insulation: 'THWN-2', method: 'PVC40', ambientC: 30, rooftopHeightIn: null, currentCarryingConductors: 3 })
    expect(step(s2020, 'ampacity').message).toContain('310.10(H)')
  })

  it('a current beyond six parallel sets is an issue on maxCurrentA', () => {
    // 4000 A non-continuous: six sets need 667 A each at 75 °C, above 2000 kcmil's 665 A
    expect(issueFields(selectConductor({ ...base, maxCurrentA: 4000, continuous: false, insulation: 'THWN-2', rooftopHeightIn: null, currentCarryingConductors: 3 }))).toEqual(['maxCurrentA'])
    // 5000 A continuous needs a 6250 A device, above 240.6(A)'s 6000 A
    const tooBig = selectConductor({ ...base, maxCurrentA: 5000 })
    expect(issueFields(tooBig)).toEqual(['maxCurrentA'])
    expect(tooBig.ok ? '' : tooBig.issues[0]?.message).toContain('6000 A')
  })

  it('an ambient beyond the 90 °C column is an issue on ambientC', () => {
    // 60 °C + 33 °C = 93 °C > 85 °C, the last 90 °C band of Table 310.15(B)(1)
    const result = selectConductor({ ...base, ambientC: 60, rooftopHeightIn: 0 })
    expect(issueFields(result)).toEqual(['ambientC'])
  })
})

describe('selectConductor input errors name the field', () => {
  it.each<readonly [string, Partial<ConductorSelectionInput> | Record<string, unknown>]>([
    ['maxCurrentA', { maxCurrentA: 0 }],
    ['maxCurrentA', { maxCurrentA: -3 }],
    ['maxCurrentA', { maxCurrentA: Number.NaN }],
    ['maxCurrentA', { maxCurrentA: Number.POSITIVE_INFINITY }],
    ['edition', { edition: 2014 }],
    ['key', { key: '' }],
    ['continuous', { continuous: 'yes' }],
    ['material', { material: 'Fe' }],
    ['insulation', { insulation: 'TW' }],
    ['method', { method: 'ENT' }],
    ['ambientC', { ambientC: Number.NaN }],
    ['ambientC', { ambientC: 120 }],
    ['rooftopHeightIn', { rooftopHeightIn: -1 }],
    ['currentCarryingConductors', { currentCarryingConductors: 0 }],
    ['currentCarryingConductors', { currentCarryingConductors: 2.5 }],
    ['terminalRatingC', { terminalRatingC: 105 }],
    ['minimumSize', { minimumSize: '5' }],
  ])('%s', (field, change) => {
    const result = selectConductor({ ...base, ...change } as ConductorSelectionInput)
    expect(result.ok).toBe(false)
    expect(result.ok ? [] : result.issues).toEqual([expect.objectContaining({ field, severity: 'error' })])
  })

  it('reports every bad field at once, and a non-object without throwing', () => {
    expect(issueFields(selectConductor({ ...base, maxCurrentA: -1, currentCarryingConductors: 0 }))).toEqual(['maxCurrentA', 'currentCarryingConductors'])
    expect(selectConductor(null as unknown as ConductorSelectionInput).ok).toBe(false)
  })
})

describe('nextLargerSize', () => {
  it('steps through the Table 310.16 sizes of the material', () => {
    expect(nextLargerSize('10', 'Cu')).toBe('8')
    expect(nextLargerSize('4/0', 'Cu')).toBe('250')
    expect(nextLargerSize('16', 'Al')).toBe('12')
    expect(nextLargerSize('2000', 'Cu')).toBeNull()
  })
})
