import { evaluate, type Unit } from 'mathjs'
import { describe, expect, it } from 'vitest'
import { maxStringVoltage } from '../../shared/electrical/rules/max-voltage'
import { stringVmpAtCellTemperature } from '../../shared/electrical/rules/mppt'
import { checkNotAbove, checkNotBelow } from '../../shared/electrical/rules/ratings'
import { parallelSum, seriesStringRatings } from '../../shared/electrical/rules/series'

const module30V8A = { vocV: 30, vmpV: 30, iscA: 8, impA: 8, pmaxW: 240 }

describe('facts of the trade, through the engine\u2019s own rules', () => {
  it('a crystalline cell gives about 0.5 V and 60 of them about 30 V', () => {
    // common practice, no source: about 0.5 V per crystalline silicon cell at its operating point
    const cell = { vocV: 0.5, vmpV: 0.5, iscA: 8, impA: 8, pmaxW: 4 }
    expect(seriesStringRatings('k', cell, 60).vmpV.value).toBeCloseTo(30, 9)
  })

  it('four 30 V / 8 A modules: 120 V and 8 A in series, 30 V and 32 A in parallel, 960 W either way', () => {
    // common practice, no source
    const series = seriesStringRatings('k', module30V8A, 4)
    expect(series.vmpV.value).toBe(120)
    expect(series.impA.value).toBe(8)
    expect(series.vmpV.value * series.impA.value).toBe(960)
    const parallel = parallelSum('k', 'current', 'A', [8, 8, 8, 8])
    expect(parallel.value).toBe(32)
    expect(30 * parallel.value).toBe(960)
  })

  it('with a 100–150 V, 25 A inverter window a fifth module exceeds it; two parallel strings of four give 120 V and 16 A', () => {
    // common practice, no source. The window edge is checked with the cold-day voltage: the
    // 0 °C factor of Table 690.7(A) is 1.10 (value from memory).
    const cold = (n: number) => {
      const v = maxStringVoltage(2023, 'k', { vocV: 30, vocCoefficient: null, technology: 'crystalline' }, n, 0)
      if (!v.ok) throw new Error('table must apply')
      return v.value.value
    }
    const window = (v: number) => checkNotAbove({ edition: 2023, key: 'k', label: '', value: v, unit: 'V', limit: 150, limitName: 'window top', section: null, whenCrossed: 'fail', advice: '' })
    expect(window(cold(4)).status).toBe('pass') // 132 V
    expect(window(cold(5)).status).toBe('fail') // 165 V
    expect(seriesStringRatings('k', module30V8A, 5).vmpV.value).toBeGreaterThanOrEqual(150) // already at the top at STC
    const twoStrings = parallelSum('k', 'current', 'A', [8, 8])
    expect(seriesStringRatings('k', module30V8A, 4).vmpV.value).toBe(120)
    expect(twoStrings.value).toBe(16)
    expect(checkNotAbove({ edition: 2023, key: 'k', label: '', value: twoStrings.value, unit: 'A', limit: 25, limitName: 'input current', section: null, whenCrossed: 'fail', advice: '' }).status).toBe('pass')
  })

  it('a 36-cell module gives about 18–19.8 V and still charges a 12 V battery on a hot day', () => {
    // common practice, no source: 0.50–0.55 V per cell at maximum power; a 12 V lead-acid battery absorbs at about 14.4 V
    const perCell = { low: { vocV: 0.5, vmpV: 0.5, iscA: 6, impA: 6, pmaxW: 3 }, high: { vocV: 0.55, vmpV: 0.55, iscA: 6, impA: 6, pmaxW: 3.3 } }
    expect(seriesStringRatings('k', perCell.low, 36).vmpV.value).toBeCloseTo(18, 9)
    expect(seriesStringRatings('k', perCell.high, 36).vmpV.value).toBeCloseTo(19.8, 9)
    const hot = stringVmpAtCellTemperature('k', '', { vmpV: 18, pmaxW: 100, vmpCoefficient: null, pmaxCoefficient: { value: -0.45, unit: '%/°C' } }, 1, 50)
    expect(checkNotBelow({ edition: 2023, key: 'k', label: '', value: hot.value, unit: 'V', limit: 14.4, limitName: 'absorption voltage', section: null, whenCrossed: 'fail', advice: '' }).status).toBe('pass')
  })

  it('silicon\u2019s band gap of about 1.1 eV corresponds to about 1,127 nm (E = hc/λ, mathjs physical constants)', () => {
    // common practice, no source: band gap of crystalline silicon ≈ 1.1 eV at room temperature
    const wavelength = evaluate('planckConstant * speedOfLight / (1.1 eV)') as Unit
    expect(wavelength.toNumber('nm')).toBeCloseTo(1127, 0)
  })
})
