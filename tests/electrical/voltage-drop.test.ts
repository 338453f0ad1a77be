import { describe, expect, it } from 'vitest'
import type { VoltageDropInput, VoltageDrop, Derived } from '../../shared/electrical/types'
import { selectConductorForVoltageDrop, voltageDrop } from '../../shared/electrical/rules/conductors'
import { CONDUCTOR_PROPERTIES } from '../../shared/electrical/tables/conductor-properties'

const base: VoltageDropInput = {
  key: 'run.R1',
  edition: 2023,
  system: 'dc',
  currentA: 9.5,
  voltageV: 400,
  lengthFt: 120,
  size: '10',
  material: 'Cu',
  parallelSets: 1,
  method: 'EMT',
  limitPercent: 2,
}

function drop(change: Partial<VoltageDropInput>): VoltageDrop {
  const result = voltageDrop({ ...base, ...change })
  if (!result.ok) throw new Error(JSON.stringify(result.issues))
  return result.value
}
const step = (v: VoltageDrop, suffix: string): Derived => v.steps.find((s) => s.key === `run.R1.${suffix}`) as Derived

describe('voltageDrop, worked by hand (NFPA 70 Chapter 9 Tables 8 and 9, 2023; values from memory)', () => {
  it('DC string: 2 × 120 ft × 9.5 A × 1.24 Ω/kft ÷ 1000 = 2.827 V = 0.707 % of 400 V', () => {
    const v = drop({})
    expect(v.dropV).toBeCloseTo(2.8272, 6)
    expect(v.dropPercent).toBeCloseTo(0.7068, 4)
    expect(step(v, 'voltageDropPercent').status).toBe('pass')
    expect(step(v, 'conductorImpedance')).toMatchObject({ value: 1.24, reference: 'Chapter 9 Table 8' })
  })

  it('DC agrees with the K-method Vd = 2·K·L·I ÷ cmil, K = 12.9 Ω·cmil/ft for Cu at 75 °C, within 1 %', () => {
    // K = 12.9 for copper, 21.2 for aluminium (common practice, no source; resistivity at 75 °C)
    for (const [size, material, k] of [['10', 'Cu', 12.9], ['4/0', 'Cu', 12.9], ['1/0', 'Al', 21.2], ['500', 'Al', 21.2]] as const) {
      const kMethod = (2 * k * 120 * 9.5) / CONDUCTOR_PROPERTIES[size].areaCmil
      expect(Math.abs(drop({ size, material }).dropV / kMethod - 1)).toBeLessThanOrEqual(0.01)
    }
  })

  it('single phase: 8 AWG Cu in PVC, 40 A, 100 ft at 240 V, PF 0.85', () => {
    // Ze = 0.78 × 0.85 + 0.052 × 0.527 = 0.6904 Ω/kft (Table 9 prints 0.69)
    // Vd = 2 × 100 × 40 × 0.6904 ÷ 1000 = 5.523 V = 2.30 % → above a 2 % limit: warn
    const v = drop({ system: 'ac1', currentA: 40, voltageV: 240, lengthFt: 100, size: '8', method: 'PVC40', limitPercent: 2 })
    expect(step(v, 'conductorImpedance').value).toBeCloseTo(0.6904, 4)
    expect(v.dropV).toBeCloseTo(5.523, 3)
    expect(v.dropPercent).toBeCloseTo(2.301, 3)
    expect(step(v, 'voltageDropPercent').status).toBe('warn')
  })

  it('three phase: 3 AWG Cu in EMT (steel column), 100 A, 200 ft at 480 V', () => {
    // Ze = 0.25 × 0.85 + 0.059 × 0.527 = 0.2436 Ω/kft; Vd = √3 × 200 × 100 × 0.2436 ÷ 1000 = 8.438 V = 1.758 %
    const v = drop({ system: 'ac3', currentA: 100, voltageV: 480, lengthFt: 200, size: '3', method: 'EMT', limitPercent: 3 })
    expect(v.dropV).toBeCloseTo(8.438, 2)
    expect(v.dropPercent).toBeCloseTo(1.758, 2)
    expect(step(v, 'voltageDrop').formula).toContain('√3 × 200 ft × 100 A')
  })

  it('power factor 1 uses the AC resistance alone; parallel sets divide the drop', () => {
    const unity = drop({ system: 'ac3', currentA: 100, voltageV: 480, lengthFt: 200, size: '3', method: 'EMT', powerFactor: 1 })
    expect(step(unity, 'conductorImpedance').value).toBeCloseTo(0.25, 10)
    const single = drop({ system: 'ac3', currentA: 600, voltageV: 480, lengthFt: 200, size: '500', method: 'PVC40' })
    const two = drop({ system: 'ac3', currentA: 600, voltageV: 480, lengthFt: 200, size: '500', method: 'PVC40', parallelSets: 2 })
    expect(two.dropV).toBeCloseTo(single.dropV / 2, 10)
  })

  it('AC for a size Table 9 does not print is an issue on size', () => {
    const r = voltageDrop({ ...base, system: 'ac1', size: '700' })
    expect(r.ok ? [] : r.issues.map((i) => i.field)).toEqual(['size'])
    const al14 = voltageDrop({ ...base, system: 'ac1', size: '14', material: 'Al' })
    expect(al14.ok).toBe(false)
  })

  it('names the field of bad input', () => {
    const fields = (change: Record<string, unknown>) => {
      const r = voltageDrop({ ...base, ...change } as VoltageDropInput)
      return r.ok ? [] : r.issues.map((i) => i.field)
    }
    expect(fields({ lengthFt: 0 })).toEqual(['lengthFt'])
    expect(fields({ lengthFt: -5 })).toEqual(['lengthFt'])
    expect(fields({ currentA: Number.NaN })).toEqual(['currentA'])
    expect(fields({ voltageV: 0 })).toEqual(['voltageV'])
    expect(fields({ size: 'big' })).toEqual(['size'])
    expect(fields({ parallelSets: 0 })).toEqual(['parallelSets'])
    expect(fields({ powerFactor: 1.2 })).toEqual(['powerFactor'])
    expect(fields({ system: 'ac2' })).toEqual(['system'])
    expect(fields({ limitPercent: -1 })).toEqual(['limitPercent'])
    expect(fields({ method: 'TRAY' })).toEqual(['method'])
  })
})

describe('selectConductorForVoltageDrop', () => {
  const run = {
    key: 'run.R1',
    edition: 2023 as const,
    maxCurrentA: 14,
    continuous: true,
    material: 'Cu' as const,
    insulation: 'PV' as const,
    method: 'EMT' as const,
    ambientC: 38,
    rooftopHeightIn: 1,
    currentCarryingConductors: 4,
    terminalRatingC: 75 as const,
    system: 'dc' as const,
    voltageV: 400,
    lengthFt: 250,
    dropCurrentA: 10,
    limitPercent: 2,
  }

  it('upsizes 12 AWG (ampacity) to 10 AWG for a 2 % limit on a 250 ft DC run', () => {
    // 12 AWG: 2 × 250 × 10 × 1.98 ÷ 1000 = 9.9 V = 2.475 % > 2 %; 10 AWG: 1.24 Ω/kft → 6.2 V = 1.55 %
    const r = selectConductorForVoltageDrop(run)
    if (!r.ok) throw new Error(JSON.stringify(r.issues))
    expect(r.value.ampacitySelection.size).toBe('12')
    expect(r.value.selection.size).toBe('10')
    expect(r.value.drop.dropPercent).toBeCloseTo(1.55, 6)
    expect(r.value.steps.at(-1)).toMatchObject({ key: 'run.R1.voltageDropUpsize', status: 'info' })
  })

  it('keeps the ampacity size when the drop is already within the limit', () => {
    const r = selectConductorForVoltageDrop({ ...run, lengthFt: 50 })
    expect(r.ok && r.value.selection.size).toBe('12')
    expect(r.ok && r.value.steps.some((s) => s.key.endsWith('voltageDropUpsize'))).toBe(false)
  })

  it('skips AC sizes Table 9 does not print and warns when no size is enough', () => {
    const r = selectConductorForVoltageDrop({ ...run, system: 'ac1', voltageV: 120, lengthFt: 5000, limitPercent: 0.5 })
    if (!r.ok) throw new Error(JSON.stringify(r.issues))
    expect(r.value.selection.size).toBe('1000')
    expect(r.value.steps.find((s) => s.key === 'run.R1.voltageDropPercent')?.status).toBe('warn')
  })

  it('names dropCurrentA when it is bad', () => {
    const r = selectConductorForVoltageDrop({ ...run, dropCurrentA: -1 })
    expect(r.ok ? [] : r.issues.map((i) => i.field)).toEqual(['dropCurrentA'])
  })
})
