import { describe, expect, it } from 'vitest'
import { parallelSum, seriesStringRatings } from '../../shared/electrical/rules/series'

const module = { vocV: 37.1, vmpV: 31, iscA: 13.8, impA: 12.9, pmaxW: 400 }

describe('series and parallel sums', () => {
  // Kirchhoff's voltage law: series voltages add, the current is common
  it('adds voltages and power in series and keeps one module\u2019s current', () => {
    const s = seriesStringRatings('string.S1', module, 10)
    expect(s.vocV.value).toBeCloseTo(371, 9)
    expect(s.vmpV.value).toBeCloseTo(310, 9)
    expect(s.iscA.value).toBe(13.8)
    expect(s.impA.value).toBe(12.9)
    expect(s.powerW.value).toBe(4000)
    expect(s.vocV.formula).toBe('10 × 37.1 V')
    expect(s.vocV.key).toBe('string.S1.vocStc')
  })

  // Kirchhoff's current law: parallel currents add, the voltage is common
  it('adds currents in parallel and shows each term', () => {
    const p = parallelSum('input.X.impSum', 'Operating current', 'A', [12.9, 12.9, 12.9])
    expect(p.value).toBeCloseTo(38.7, 9)
    expect(p.formula).toBe('12.9 A + 12.9 A + 12.9 A')
    expect(parallelSum('k', 'none', 'A', []).value).toBe(0)
  })

  it('series power equals string Vmp × Imp within the module\u2019s own rounding', () => {
    const s = seriesStringRatings('k', module, 12)
    // the datasheet Pmax is Vmp × Imp (31 V × 12.9 A = 399.9 W) rounded to the nameplate
    expect(s.vmpV.value * s.impA.value).toBeCloseTo(s.powerW.value, -1)
  })
})
