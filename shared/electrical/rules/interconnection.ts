import { fmt } from '../format'
import { necRef } from '../reference'
import { STANDARD_OCPD_RATINGS } from '../tables/standard-ocpd-ratings'
import type { Derived, NecEdition } from '../types'

/**
 * 705.12 and 705.11 section numbers per edition (numbering from memory): the 2017 load-side rules
 * 705.12(B)(2)(3)(a)–(d) became 705.12(B)(3)(1)–(4) in 2020; the 2017 supply-side rule 705.12(A)
 * became 705.11 in 2020.
 */
export const SECTION_705 = {
  busbar100: { 2017: '705.12(B)(2)(3)(a)', 2020: '705.12(B)(3)(1)', 2023: '705.12(B)(3)(1)' },
  busbar120: { 2017: '705.12(B)(2)(3)(b)', 2020: '705.12(B)(3)(2)', 2023: '705.12(B)(3)(2)' },
  busbarSum: { 2017: '705.12(B)(2)(3)(c)', 2020: '705.12(B)(3)(3)', 2023: '705.12(B)(3)(3)' },
  centreFed: { 2017: '705.12(B)(2)(3)(d)', 2020: '705.12(B)(3)(4)', 2023: '705.12(B)(3)(4)' },
  supplySide: { 2017: '705.12(A)', 2020: '705.11', 2023: '705.11' },
} as const

/** The busbar being backfed. */
export interface BusbarData {
  /** Busbar current rating [A]. */
  busbarA: number
  /** Rating of the overcurrent device protecting the busbar (the main) [A]. */
  mainA: number
  feed: 'end' | 'centre'
  breakerPosition: 'end_opposite_main' | 'busbar_end' | 'not_at_end'
  dwelling: boolean
}

/** 125 % of the power sources' output circuit current, as every busbar rule counts it. */
const sourceTerm = (sourceA: number) => `1.25 × ${fmt(sourceA)} A`

function busbarCheck(
  edition: NecEdition, key: string, label: string, section: string | Record<NecEdition, string>,
  sourceA: number, mainA: number, allowedA: number, allowedText: string, message: string,
): Derived {
  const value = 1.25 * sourceA + mainA
  const pass = value <= allowedA
  return {
    key, label, value, unit: 'A',
    formula: `${sourceTerm(sourceA)} + ${fmt(mainA)} A = ${fmt(value)} A ${pass ? '≤' : '>'} ${allowedText}`,
    reference: necRef(edition, section), status: pass ? 'pass' : 'fail',
    message: pass ? message : `Exceeds the allowance by ${fmt(value - allowedA)} A.`,
  }
}

/**
 * 100 % rule: 125 % of the power source output current plus the main rating must not exceed the
 * busbar rating. Any breaker position.
 * Source: NFPA 70 705.12(B)(2)(3)(a) (2017), 705.12(B)(3)(1) (2020, 2023).
 * @param sourceA sum of the continuous output currents of the sources on the busbar [A]
 */
export function busbar100PercentRule(edition: NecEdition, key: string, sourceA: number, bus: BusbarData): Derived {
  return busbarCheck(edition, key, 'Busbar 100 % rule', SECTION_705.busbar100, sourceA, bus.mainA, bus.busbarA, `${fmt(bus.busbarA)} A busbar`, 'Busbar holds the sources and the main at 100 %.')
}

/**
 * 120 % rule: 125 % of the source current plus the main rating may reach 120 % of the busbar
 * rating when the source breaker is at the end opposite the main (end-fed), or at one end of a
 * centre-fed busbar in a dwelling. Null when the position does not qualify.
 * Source: NFPA 70 705.12(B)(2)(3)(b) and (d) (2017), 705.12(B)(3)(2) and (4) (2020, 2023).
 * @param sourceA sum of the continuous output currents of the sources on the busbar [A]
 */
export function busbar120PercentRule(edition: NecEdition, key: string, sourceA: number, bus: BusbarData): Derived | null {
  const centre = bus.feed === 'centre'
  if (centre ? !bus.dwelling || bus.breakerPosition === 'not_at_end' : bus.breakerPosition !== 'end_opposite_main') return null
  return busbarCheck(
    edition, key, centre ? 'Busbar 120 % rule (centre-fed)' : 'Busbar 120 % rule', centre ? SECTION_705.centreFed : SECTION_705.busbar120,
    sourceA, bus.mainA, 1.2 * bus.busbarA, `1.2 × ${fmt(bus.busbarA)} A = ${fmt(1.2 * bus.busbarA)} A`,
    'Within 120 % of the busbar rating with the source breaker at the permitted end; a warning label is required.',
  )
}

/**
 * Sum rule: the ratings of all overcurrent devices on the busbar, load and supply, except the main,
 * must not exceed the busbar rating.
 * Source: NFPA 70 705.12(B)(2)(3)(c) (2017), 705.12(B)(3)(3) (2020, 2023).
 * @param sumOfBreakersA sum of every breaker rating on the busbar except the main [A]
 * @param busbarA        busbar rating [A]
 */
export function busbarSumRule(edition: NecEdition, key: string, sumOfBreakersA: number, busbarA: number): Derived {
  const pass = sumOfBreakersA <= busbarA
  return {
    key, label: 'Busbar sum-of-breakers rule', value: sumOfBreakersA, unit: 'A',
    formula: `${fmt(sumOfBreakersA)} A ${pass ? '≤' : '>'} ${fmt(busbarA)} A`,
    reference: necRef(edition, SECTION_705.busbarSum), status: pass ? 'pass' : 'fail',
    message: pass ? 'All breakers together do not exceed the busbar; a label forbids adding breakers.' : `Breakers exceed the busbar by ${fmt(sumOfBreakersA - busbarA)} A.`,
  }
}

/**
 * Largest standard main breaker that lets the 120 % rule pass: 1.2 × busbar − 1.25 × source
 * current, rounded down to a 240.6(A) breaker rating. Null when no standard rating fits.
 * The derated main must still carry the calculated load of the dwelling (Article 220): the
 * designer verifies that.
 * Source: NFPA 70 705.12(B)(2)(3)(b) (2017), 705.12(B)(3)(2) (2020, 2023); 240.6(A).
 */
export function mainBreakerDerate(edition: NecEdition, key: string, sourceA: number, busbarA: number): Derived | null {
  const maxMainA = 1.2 * busbarA - 1.25 * sourceA
  const rating = [...STANDARD_OCPD_RATINGS].reverse().find((r) => r.devices === 'fuse_or_breaker' && r.ratingA <= maxMainA)
  if (!rating) return null
  return {
    key, label: 'Suggested main breaker derate', value: rating.ratingA, unit: 'A',
    formula: `1.2 × ${fmt(busbarA)} A − ${sourceTerm(sourceA)} = ${fmt(maxMainA)} A → ${rating.ratingA} A`,
    reference: necRef(edition, SECTION_705.busbar120), status: 'warn',
    message: `A ${rating.ratingA} A main would satisfy the 120 % rule with the source at the opposite end; verify the load calculation (Article 220) still allows it.`,
  }
}

/**
 * Supply-side connection: the power sources on the service must not exceed the service rating.
 * 2017 compares the sum of the sources' overcurrent device ratings; 2020 and 2023 compare the sum
 * of their continuous output currents with the service conductor ampacity.
 * Source: NFPA 70 705.12(A) (2017), 705.11(A) (2020, 2023) (from memory).
 * @param sourceA        sum of the continuous output currents of the sources [A]
 * @param sourceOcpdSumA sum of the sources' overcurrent device ratings [A]
 * @param serviceRatingA service rating / service conductor ampacity [A]
 */
export function supplySideLimit(edition: NecEdition, key: string, sourceA: number, sourceOcpdSumA: number, serviceRatingA: number): Derived {
  const byOcpd = edition === 2017
  const value = byOcpd ? sourceOcpdSumA : sourceA
  const pass = value <= serviceRatingA
  return {
    key, label: 'Supply-side connection vs service rating', value, unit: 'A',
    formula: `${fmt(value)} A ${pass ? '≤' : '>'} ${fmt(serviceRatingA)} A`,
    reference: necRef(edition, SECTION_705.supplySide), status: pass ? 'pass' : 'fail',
    message: (byOcpd ? 'Sum of the source overcurrent device ratings' : 'Sum of the source continuous output currents') +
      (pass ? ' is within the service rating.' : ` exceeds the service rating by ${fmt(value - serviceRatingA)} A.`),
  }
}
