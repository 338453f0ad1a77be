import { describe, expect, it } from 'vitest'
import { stringingLayouts, type StringingRequest } from '../../shared/electrical/rules/stringing'

const request: StringingRequest = {
  edition: 2023,
  module: {
    vocV: 37.1, vmpV: 31, iscA: 13.8, impA: 12.9, pmaxW: 400, maxSystemVoltageV: 1000, technology: 'crystalline',
    vocCoefficient: { value: -0.27, unit: '%/°C' }, vmpCoefficient: null, pmaxCoefficient: { value: -0.35, unit: '%/°C' },
  },
  inverter: {
    ratedPowerW: 7600,
    pvInput: { maxDcVoltageV: 600, mpptMinV: 100, mpptMaxV: 480, startVoltageV: 120, mpptCount: 2, maxInputCurrentPerMpptA: 15, maxShortCircuitCurrentPerMpptA: 20 },
  },
  moduleCount: 20,
  designLowC: -18,
  designHighC: 36,
  cellTemperatureRiseC: 25,
  dwelling: true,
}

const layouts = (r: Partial<StringingRequest>) => {
  const out = stringingLayouts({ ...request, ...r })
  if (!out.ok) throw new Error(JSON.stringify(out.issues))
  return out.value
}

describe('auto-stringing', () => {
  it('finds the one valid layout of 20 modules on a two-MPPT 7.6 kW inverter', () => {
    // 20 in series: 828 V > 600 V (690.7); 5 in series: 4 strings, 2 per MPPT, 2 × 17.25 A > 20 A;
    // 4 in series: hot Vmp 108 V < 120 V start; 2 × 10 is what is left.
    const found = layouts({})
    expect(found.map((l) => [l.modulesPerString, l.strings, l.inverters])).toEqual([[10, 2, 1]])
    expect(found[0]?.dcAcRatio).toBeCloseTo(8000 / 7600, 9)
    expect(found[0]?.vocMaxV).toBeCloseTo(414.073, 3)
    expect(found[0]?.voltageLimitV).toBe(600)
  })

  it('lifts the 600 V limit outside dwellings', () => {
    // 16 × 41.41 V = 662.5 V: over 600 V, within a 1000 V inverter
    const inverter = { ...request.inverter, pvInput: { ...request.inverter.pvInput, maxDcVoltageV: 1000, mpptMaxV: 800 } }
    const oneString = (l: { modulesPerString: number }) => l.modulesPerString === 16
    expect(layouts({ dwelling: false, moduleCount: 16, inverter }).some(oneString)).toBe(true)
    expect(layouts({ dwelling: true, moduleCount: 16, inverter }).some(oneString)).toBe(false)
  })

  it('keeps every layout inside the voltage and current limits and ranks by DC/AC ratio', () => {
    const found = layouts({ moduleCount: 48, inverter: { ...request.inverter, pvInput: { ...request.inverter.pvInput, maxShortCircuitCurrentPerMpptA: 40 } } })
    expect(found.length).toBeGreaterThan(1)
    for (const l of found) {
      expect(l.modulesPerString * l.strings).toBe(48)
      expect(l.vocMaxV).toBeLessThanOrEqual(l.voltageLimitV)
      expect(l.vmpHotV).toBeGreaterThanOrEqual(l.windowMinV)
      expect(l.stringsPerMppt * 1.25 * 13.8).toBeLessThanOrEqual(40)
    }
    const distance = found.map((l) => Math.abs(l.dcAcRatio - 1.25))
    expect([...distance].sort((a, b) => a - b)).toEqual(distance)
  })

  it('names the field of a bad request', () => {
    const bad = stringingLayouts({ ...request, moduleCount: 0 })
    expect(bad.ok).toBe(false)
    if (!bad.ok) expect(bad.issues[0]?.field).toBe('moduleCount')
    const ratio = stringingLayouts({ ...request, targetDcAcRatio: 2 })
    expect(ratio.ok).toBe(false)
    if (!ratio.ok) expect(ratio.issues[0]?.field).toBe('targetDcAcRatio')
  })
})
