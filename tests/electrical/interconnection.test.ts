import { describe, expect, it } from 'vitest'
import {
  busbar100PercentRule,
  busbar120PercentRule,
  busbarSumRule,
  mainBreakerDerate,
  supplySideLimit,
  type BusbarData,
} from '../../shared/electrical/rules/interconnection'

const panel200: BusbarData = { busbarA: 200, mainA: 200, feed: 'end', breakerPosition: 'end_opposite_main', dwelling: true }

describe('load-side connection, 705.12(B)', () => {
  // The textbook case: a 200 A busbar with a 200 A main takes a 40 A backfed breaker, i.e. a
  // 32 A inverter (1.25 × 32 = 40), only under the 120 % rule (value from memory)
  it('fails the 100 % rule and passes the 120 % rule for 32 A on 200 A / 200 A', () => {
    const hundred = busbar100PercentRule(2023, 'k', 32, panel200)
    expect(hundred.value).toBe(240)
    expect(hundred.status).toBe('fail')
    expect(hundred.reference).toBe('NEC 2023 705.12(B)(3)(1)')
    const twenty = busbar120PercentRule(2023, 'k', 32, panel200)
    expect(twenty?.status).toBe('pass')
    expect(twenty?.formula).toBe('1.25 × 32 A + 200 A = 240 A ≤ 1.2 × 200 A = 240 A')
    expect(busbar120PercentRule(2023, 'k', 33, panel200)?.status).toBe('fail')
  })

  // NFPA 70-2017 705.12(B)(2)(3)(a)-(d) became 705.12(B)(3)(1)-(4) in 2020 (numbering from memory)
  it('cites the 2017 numbering', () => {
    expect(busbar100PercentRule(2017, 'k', 32, panel200).reference).toBe('NEC 2017 705.12(B)(2)(3)(a)')
    expect(busbar120PercentRule(2017, 'k', 32, panel200)?.reference).toBe('NEC 2017 705.12(B)(2)(3)(b)')
    expect(busbarSumRule(2017, 'k', 150, 200).reference).toBe('NEC 2017 705.12(B)(2)(3)(c)')
  })

  it('allows 120 % only with the breaker at the end opposite the main on an end-fed busbar', () => {
    expect(busbar120PercentRule(2023, 'k', 32, { ...panel200, breakerPosition: 'busbar_end' })).toBeNull()
    expect(busbar120PercentRule(2023, 'k', 32, { ...panel200, breakerPosition: 'not_at_end' })).toBeNull()
  })

  // NFPA 70-2023 705.12(B)(3)(4): centre-fed panelboards in dwellings, either end but not both (from memory)
  it('allows 120 % at one end of a centre-fed busbar in a dwelling only', () => {
    const centre: BusbarData = { ...panel200, feed: 'centre', breakerPosition: 'busbar_end' }
    const d = busbar120PercentRule(2020, 'k', 32, centre)
    expect(d?.status).toBe('pass')
    expect(d?.reference).toBe('NEC 2020 705.12(B)(3)(4)')
    expect(busbar120PercentRule(2020, 'k', 32, { ...centre, dwelling: false })).toBeNull()
    expect(busbar120PercentRule(2020, 'k', 32, { ...centre, breakerPosition: 'not_at_end' })).toBeNull()
  })

  it('passes 100 % for 32 A on a 225 A busbar with a 175 A main', () => {
    expect(busbar100PercentRule(2023, 'k', 32, { ...panel200, busbarA: 225, mainA: 175 }).status).toBe('pass')
  })

  // NFPA 70-2023 705.12(B)(3)(3): the sum of all breakers except the main within the busbar rating
  it('applies the sum rule', () => {
    expect(busbarSumRule(2023, 'k', 200, 200).status).toBe('pass')
    expect(busbarSumRule(2023, 'k', 210, 200).status).toBe('fail')
  })

  // 1.2 × 200 − 1.25 × 48 = 180 A → 175 A, the next lower standard breaker (Table 240.6(A), value from memory)
  it('suggests a main-breaker derate to a standard rating', () => {
    const d = mainBreakerDerate(2023, 'k', 48, 200)
    expect(d?.value).toBe(175)
    expect(d?.status).toBe('warn')
    expect(d?.message).toContain('Article 220')
    expect(busbar120PercentRule(2023, 'k', 48, { ...panel200, mainA: 175 })?.status).toBe('pass')
    expect(mainBreakerDerate(2023, 'k', 500, 200)).toBeNull()
  })
})

describe('supply-side connection', () => {
  // NFPA 70-2017 705.12(A): sum of source OCPD ratings ≤ service rating; NFPA 70-2020 705.11: sum of continuous output currents (from memory)
  it('compares device ratings in 2017 and output currents from 2020', () => {
    const d2017 = supplySideLimit(2017, 'k', 96, 120, 100)
    expect(d2017.value).toBe(120)
    expect(d2017.status).toBe('fail')
    expect(d2017.reference).toBe('NEC 2017 705.12(A)')
    const d2020 = supplySideLimit(2020, 'k', 96, 120, 100)
    expect(d2020.value).toBe(96)
    expect(d2020.status).toBe('pass')
    expect(d2020.reference).toBe('NEC 2020 705.11')
  })
})
