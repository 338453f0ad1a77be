import { describe, expect, it } from 'vitest'
import { checkVoltageLimit, converterStringVoltage, DWELLING_DC_LIMIT_V, maxStringVoltage, type ModuleVocData } from '../../shared/electrical/rules/max-voltage'
import type { Derived, Outcome } from '../../shared/electrical/types'

const value = (o: Outcome<Derived>): Derived => {
  if (!o.ok) throw new Error(JSON.stringify(o.issues))
  return o.value
}
const withCoefficient: ModuleVocData = { vocV: 37.1, vocCoefficient: { value: -0.27, unit: '%/°C' }, technology: 'crystalline' }
const withoutCoefficient: ModuleVocData = { vocV: 40, vocCoefficient: null, technology: 'crystalline' }

describe('maximum PV system voltage, 690.7(A)', () => {
  // NFPA 70-2023 690.7(A)(1): Voc × (1 + β × (Tlow − 25 °C)) per module, summed in series
  it('corrects Voc with a %/°C coefficient', () => {
    const d = value(maxStringVoltage(2023, 'string.S1.vocMax', withCoefficient, 10, -18))
    // 10 × 37.1 × (1 + (−0.0027)(−43)) = 414.073 V, worked by hand
    expect(d.value).toBeCloseTo(414.073, 3)
    expect(d.reference).toBe('NEC 2023 690.7(A)(1)')
    expect(d.formula).toBe('10 × 37.1 V × (1 + (-0.27 %/°C) × (-18 − 25) °C)')
  })

  it('corrects Voc with a V/°C coefficient', () => {
    const m: ModuleVocData = { vocV: 40, vocCoefficient: { value: -0.12, unit: 'V/°C' }, technology: 'crystalline' }
    // 40 V + (−0.12 V/°C)(−20 − 25) = 45.4 V per module, worked by hand
    expect(value(maxStringVoltage(2020, 'k', m, 12, -20)).value).toBeCloseTo(12 * 45.4, 6)
  })

  // NFPA 70 Table 690.7(A), 2017/2020/2023: −6 to −10 °C → 1.14 (value from memory)
  it('uses the Table 690.7(A) factor when no coefficient is given', () => {
    const d = value(maxStringVoltage(2017, 'k', withoutCoefficient, 12, -10))
    expect(d.value).toBeCloseTo(12 * 40 * 1.14, 6)
    expect(d.reference).toBe('NEC 2017 690.7(A)(2)')
    expect(d.message).toContain('Table 690.7(A)')
  })

  // NFPA 70 Table 690.7(A): 4 to 0 °C → 1.10 (value from memory)
  it('reads the 0 °C band of the table', () => {
    expect(value(maxStringVoltage(2023, 'k', withoutCoefficient, 1, 0)).value).toBeCloseTo(44, 9)
  })

  it('keeps the STC Voc when the design low is above 25 °C', () => {
    expect(value(maxStringVoltage(2023, 'k', withCoefficient, 10, 30)).value).toBeCloseTo(371, 9)
    expect(value(maxStringVoltage(2023, 'k', withoutCoefficient, 10, 30)).value).toBeCloseTo(400, 9)
  })

  it('refuses the table for thin film and below −40 °C, naming the field', () => {
    const thin = maxStringVoltage(2023, 'k', { ...withoutCoefficient, technology: 'thin_film' }, 10, -10)
    expect(thin.ok).toBe(false)
    if (!thin.ok) expect(thin.issues[0]?.field).toBe('equipment.modules.vocCoefficient')
    const cold = maxStringVoltage(2023, 'k', withoutCoefficient, 10, -45)
    expect(cold.ok).toBe(false)
    if (!cold.ok) expect(cold.issues[0]?.field).toBe('codeBasis.designLowC')
    // with a coefficient the temperature is no obstacle
    expect(maxStringVoltage(2023, 'k', withCoefficient, 10, -45).ok).toBe(true)
  })

  // NFPA 70 690.7 (2017, 2020, 2023): one- and two-family dwellings up to 600 V (value from memory)
  it('holds dwellings to 600 V', () => {
    expect(DWELLING_DC_LIMIT_V).toBe(600)
    expect(checkVoltageLimit(2023, 'k', 600, DWELLING_DC_LIMIT_V, '600 V dwelling limit', '690.7').status).toBe('pass')
    const over = checkVoltageLimit(2023, 'k', 600.5, DWELLING_DC_LIMIT_V, '600 V dwelling limit', '690.7')
    expect(over.status).toBe('fail')
    expect(over.reference).toBe('NEC 2023 690.7')
    expect(over.message).toContain('fewer modules')
  })

  // NFPA 70 690.7(B): DC-to-DC converters in series, sum of rated maximum outputs (from memory)
  it('sums optimiser output voltages', () => {
    const d = converterStringVoltage(2020, 'k', 60, 10)
    expect(d.value).toBe(600)
    expect(d.reference).toBe('NEC 2020 690.7(B)')
  })

  it('agrees with Table 690.7(A) for a typical −0.3 %/°C module within the table\u2019s rounding', () => {
    // the table is built on roughly −0.3 to −0.4 %/°C: at −10 °C, 1 + 0.0035 × 35 ≈ 1.12–1.14 (common practice, no source)
    const m: ModuleVocData = { vocV: 40, vocCoefficient: { value: -0.38, unit: '%/°C' }, technology: 'crystalline' }
    const byCoefficient = value(maxStringVoltage(2023, 'k', m, 1, -10)).value
    const byTable = value(maxStringVoltage(2023, 'k', withoutCoefficient, 1, -10)).value
    expect(Math.abs(byCoefficient - byTable) / byTable).toBeLessThan(0.01)
  })
})
