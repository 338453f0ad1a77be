import type { ConductorMaterial, ConductorSize, Derived, OcpdSizing, OcpdSizingInput, Outcome } from '../types'
import { necRef } from '../reference'
import { fmt } from '../format'
import { LARGEST_STANDARD_OCPD_RATING_A, nextStandardRatingA, STANDARD_OCPD_RATINGS } from '../tables/standard-ocpd-ratings'
import { SMALL_CONDUCTOR_MAX_OCPD_A } from '../tables/small-conductor-limits'
import {
  checkBoolean,
  checkEdition,
  checkInputObject,
  checkKey,
  checkMaterial,
  checkPositive,
  checkSize,
  collectIssues,
  inputIssue,
} from './input-checks'

/** Largest rating for which 240.4(B) lets the device be the next standard size above the ampacity [A]. */
const NEXT_SIZE_UP_LIMIT_A = 800

/** Continuous-duty factor on the device rating, 690.9(B)(1) [-]. */
const OCPD_CONTINUOUS_FACTOR = 1.25

/**
 * Least overcurrent device rating for a circuit: 125 % of the maximum current for continuous
 * duty, else 100 %.
 * Source: NFPA 70 690.9(B)(1) (2017, 2020, 2023; from memory).
 * @returns least rating [A]
 */
export function minimumOcpdRatingA(maxCurrentA: number, continuous: boolean): number {
  return continuous ? OCPD_CONTINUOUS_FACTOR * maxCurrentA : maxCurrentA
}

/** Largest device rating that still protects a conductor, and the section that sets it. */
export interface ConductorProtectionLimit {
  /** The device rating must not exceed this [A]. */
  limitA: number
  /** Text of the derivation, e.g. "ampacity 27.3 A → next standard 30 A (240.4(B))". */
  basis: string
  /** Sections applied, e.g. "240.4(B), 240.4(D)". */
  sections: string
}

/**
 * Largest overcurrent device rating that protects a conductor of a given ampacity.
 * Source: NFPA 70 240.4(B) (next standard rating up, up to 800 A), 240.4(C) (above 800 A the
 * ampacity must not be less than the rating), 240.4(D) (small conductors); same in 2017, 2020
 * and 2023 (from memory).
 * @param conductorAmpacityA corrected ampacity of the conductor (all parallel sets together) [A]
 */
export function conductorProtectionLimit(
  conductorAmpacityA: number,
  size: ConductorSize,
  material: ConductorMaterial,
): ConductorProtectionLimit {
  const isStandard = STANDARD_OCPD_RATINGS.some((r) => r.ratingA === conductorAmpacityA)
  const nextUp = nextStandardRatingA(conductorAmpacityA)
  const byAmpacity =
    !isStandard && nextUp !== null && nextUp <= NEXT_SIZE_UP_LIMIT_A
      ? { limitA: nextUp, basis: `ampacity ${fmt(conductorAmpacityA)} A → next standard rating ${nextUp} A`, sections: '240.4(B)' }
      : {
          limitA: conductorAmpacityA,
          basis: `rating ≤ ampacity ${fmt(conductorAmpacityA)} A`,
          sections: conductorAmpacityA > NEXT_SIZE_UP_LIMIT_A ? '240.4(C)' : '240.4(B)',
        }
  const smallLimitA = SMALL_CONDUCTOR_MAX_OCPD_A[material][size]
  if (smallLimitA === undefined || smallLimitA >= byAmpacity.limitA) return byAmpacity
  return {
    limitA: smallLimitA,
    basis: `${byAmpacity.basis}; ${size} AWG ${material} limited to ${smallLimitA} A`,
    sections: `${byAmpacity.sections}, 240.4(D)`,
  }
}

/**
 * Overcurrent device rating for a circuit: the least rating by 690.9(B), rounded up to a
 * standard rating by 240.6(A), then checked against the protection of the conductor by 240.4.
 * A device that does not protect the conductor gives a `fail` step, not an error: the input is
 * valid, the design is not.
 */
export function sizeOcpd(input: OcpdSizingInput): Outcome<OcpdSizing> {
  const shape = checkInputObject(input)
  if (shape) return { ok: false, issues: [shape] }
  const issues = collectIssues(
    checkKey(input.key),
    checkEdition(input.edition),
    checkPositive('maxCurrentA', input.maxCurrentA, 'A'),
    checkBoolean('continuous', input.continuous),
    checkPositive('conductorAmpacityA', input.conductorAmpacityA, 'A'),
    checkSize('conductorSize', input.conductorSize),
    checkMaterial(input.material),
  )
  if (issues.length > 0) return { ok: false, issues }

  const { key, edition, maxCurrentA, continuous, conductorAmpacityA, conductorSize, material } = input
  const minimumA = minimumOcpdRatingA(maxCurrentA, continuous)
  const ratingA = nextStandardRatingA(minimumA)
  if (ratingA === null) {
    return {
      ok: false,
      issues: [inputIssue('maxCurrentA', `needs a device of at least ${fmt(minimumA)} A, above the largest standard rating of ${LARGEST_STANDARD_OCPD_RATING_A} A (240.6(A))`)],
    }
  }
  const protection = conductorProtectionLimit(conductorAmpacityA, conductorSize, material)
  const protects = ratingA <= protection.limitA
  const fuseOnly = STANDARD_OCPD_RATINGS.find((r) => r.ratingA === ratingA)?.devices === 'fuse_only'
  const steps: Derived[] = [
    {
      key: `${key}.ocpdMinimum`,
      label: 'Least overcurrent device rating',
      value: minimumA,
      unit: 'A',
      formula: continuous ? `1.25 × ${fmt(maxCurrentA)} A = ${fmt(minimumA)} A` : `${fmt(maxCurrentA)} A (not continuous)`,
      reference: necRef(edition, '690.9(B)(1)'),
      status: 'info',
      message: continuous ? 'Continuous current: the device is rated at least 125 % of the maximum current.' : 'Not continuous: the device is rated at least the maximum current.',
    },
    {
      key: `${key}.ocpdRating`,
      label: 'Overcurrent device rating',
      value: ratingA,
      unit: 'A',
      formula: `next standard rating ≥ ${fmt(minimumA)} A → ${ratingA} A`,
      reference: necRef(edition, '240.6(A)'),
      status: protects ? 'pass' : 'fail',
      message:
        (protects ? `${ratingA} A protects the conductor.` : `${ratingA} A does not protect ${conductorSize} ${material}: choose a larger conductor.`) +
        (fuseOnly ? ` ${ratingA} A is a standard rating for fuses only.` : ''),
    },
    {
      key: `${key}.conductorProtection`,
      label: 'Largest rating protecting the conductor',
      value: protection.limitA,
      unit: 'A',
      formula: `${protection.basis}; ${ratingA} A ${protects ? '≤' : '>'} ${fmt(protection.limitA)} A`,
      reference: necRef(edition, protection.sections),
      status: protects ? 'pass' : 'fail',
      message: protects
        ? `The ${conductorSize} ${material} conductor is protected by a ${ratingA} A device.`
        : `A ${ratingA} A device exceeds the ${fmt(protection.limitA)} A the ${conductorSize} ${material} conductor allows.`,
    },
  ]
  return { ok: true, value: { ratingA, steps } }
}
