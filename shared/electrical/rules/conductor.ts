import {
  CONDUCTOR_SIZES,
  INSULATIONS,
  WIRING_METHODS,
  type ConductorMaterial,
  type ConductorSelection,
  type ConductorSelectionInput,
  type ConductorSize,
  type Derived,
  type Outcome,
  type TemperatureColumn,
} from '../types'
import { necRef } from '../reference'
import { fmt } from '../format'
import { AMPACITY_310_16 } from '../tables/ampacity-310-16'
import { AMPACITY_310_17 } from '../tables/ampacity-310-17'
import { tableAmpacityA, type AmpacityTable } from '../tables/ampacity-table'
import { INSULATION_RATING_C } from '../tables/insulation-ratings'
import { MINIMUM_CONDUCTOR_SIZE, MINIMUM_CONDUCTOR_SIZE_REF } from '../tables/minimum-conductor-size'
import { LARGEST_STANDARD_OCPD_RATING_A, nextStandardRatingA } from '../tables/standard-ocpd-ratings'
import { adjustmentFactor, rooftopAdder, temperatureCorrection } from './ampacity-factors'
import { conductorProtectionLimit, minimumOcpdRatingA } from './ocpd'
import { sizeIndex, sizeLabel } from './sizes'
import {
  checkBoolean,
  checkEdition,
  checkInRange,
  checkInputObject,
  checkKey,
  checkMaterial,
  checkOneOf,
  checkPositive,
  checkSize,
  checkWholeNumber,
  collectIssues,
  inputIssue,
} from './input-checks'

/** Continuous-duty factor on conductor ampacity, 690.8(B)(1) [-]. */
const CONDUCTOR_CONTINUOUS_FACTOR = 1.25

/** Smallest size that may be run in parallel: 310.10(G) (2023), 310.10(H) (2017, 2020). */
const SMALLEST_PARALLEL_SIZE: ConductorSize = '1/0'
const PARALLEL_REF = { 2017: '310.10(H)', 2020: '310.10(H)', 2023: '310.10(G)' } as const

/** Largest size preferred for parallel sets: larger ones are hard to pull and few lugs take them (common practice, no source). */
const LARGEST_PRACTICAL_PARALLEL_SIZE: ConductorSize = '600'

/** More parallel sets than this is a design to rethink, not to size (common practice, no source). */
const MAX_PARALLEL_SETS = 6

/** Design ambients the engine accepts [°C]: beyond these the input is surely a typo (common practice, no source). */
const AMBIENT_RANGE_C = { min: -60, max: 85 } as const

/** Ampacity table for a wiring method: Table 310.17 for single conductors in free air, else 310.16. */
export function ampacityTableFor(method: ConductorSelectionInput['method']): AmpacityTable {
  return method === 'FREE_AIR' ? AMPACITY_310_17 : AMPACITY_310_16
}

/**
 * Next larger size listed in Table 310.16 for the material, or null above 2000 kcmil. Used to
 * upsize a conductor, e.g. for voltage drop.
 */
export function nextLargerSize(size: ConductorSize, material: ConductorMaterial): ConductorSize | null {
  return CONDUCTOR_SIZES.slice(sizeIndex(size) + 1).find((s) => AMPACITY_310_16.rows[material][s] !== undefined) ?? null
}

/** The requirement every candidate must meet, in amperes for the whole circuit. */
interface Requirement {
  material: ConductorMaterial
  table: AmpacityTable
  terminalColumn: TemperatureColumn
  insulationColumn: TemperatureColumn
  /** 690.8(B)(1): 125 % of the current, no factors, in the terminal column [A]. */
  withoutFactorsA: number
  /** 690.8(B)(2) current to carry after factors [A]. */
  maxCurrentA: number
  /** Product of temperature correction and adjustment [-]. */
  factor: number
  /** Standard rating of the overcurrent device 690.9(B) calls for [A]. */
  ocpdRatingA: number
}

interface Candidate {
  size: ConductorSize
  sets: number
  terminalA: number
  insulationA: number
  /** Per conductor, after factors [A]. */
  correctedA: number
  /** One conductor, after factors and limited by the terminal column (110.14(C)) [A]. */
  ampacityA: number
  /** All parallel sets together [A]. */
  totalAmpacityA: number
}

/** Candidate `sets × size` when it meets every requirement, else null. */
function evaluate(req: Requirement, size: ConductorSize, sets: number): Candidate | null {
  const terminalA = tableAmpacityA(req.table, size, req.material, req.terminalColumn)
  const insulationA = tableAmpacityA(req.table, size, req.material, req.insulationColumn)
  if (terminalA === null || insulationA === null) return null
  const correctedA = insulationA * req.factor
  const ampacityA = Math.min(correctedA, terminalA)
  const totalAmpacityA = sets * ampacityA
  const candidate = { size, sets, terminalA, insulationA, correctedA, ampacityA, totalAmpacityA }
  const meetsTerminal = sets * terminalA >= req.withoutFactorsA
  const meetsConditions = sets * correctedA >= req.maxCurrentA
  const protectedByDevice = req.ocpdRatingA <= conductorProtectionLimit(totalAmpacityA, size, req.material).limitA
  return meetsTerminal && meetsConditions && protectedByDevice ? candidate : null
}

/** Smallest single conductor meeting the requirement, from `fromSize` up. */
function smallestSingle(req: Requirement, fromSize: ConductorSize): Candidate | null {
  for (const size of CONDUCTOR_SIZES.slice(sizeIndex(fromSize))) {
    const found = evaluate(req, size, 1)
    if (found) return found
  }
  return null
}

/**
 * Parallel sets: the fewest sets, each of the smallest size that works, preferring sizes up to
 * LARGEST_PRACTICAL_PARALLEL_SIZE; falls back to any size when no set count up to the limit
 * works with those.
 */
function smallestParallel(req: Requirement, fromSize: ConductorSize): Candidate | null {
  const sizes = CONDUCTOR_SIZES.slice(Math.max(sizeIndex(fromSize), sizeIndex(SMALLEST_PARALLEL_SIZE)))
  const practical = sizes.filter((s) => sizeIndex(s) <= sizeIndex(LARGEST_PRACTICAL_PARALLEL_SIZE))
  for (const allowed of [practical, sizes]) {
    for (let sets = 2; sets <= MAX_PARALLEL_SETS; sets++) {
      const found = allowed.map((size) => evaluate(req, size, sets)).find((c) => c !== null)
      if (found) return found
    }
  }
  return null
}

function checkInput(input: ConductorSelectionInput) {
  return collectIssues(
    checkKey(input.key),
    checkEdition(input.edition),
    checkPositive('maxCurrentA', input.maxCurrentA, 'A'),
    checkBoolean('continuous', input.continuous),
    checkMaterial(input.material),
    checkOneOf('insulation', input.insulation, INSULATIONS),
    checkOneOf('method', input.method, WIRING_METHODS),
    checkInRange('ambientC', input.ambientC, '°C', AMBIENT_RANGE_C.min, AMBIENT_RANGE_C.max),
    // 10,000 in is only a bound against typos: the adder cares about less than 7/8 in
    input.rooftopHeightIn === null ? null : checkInRange('rooftopHeightIn', input.rooftopHeightIn, 'in', 0, 10_000),
    checkWholeNumber('currentCarryingConductors', input.currentCarryingConductors, 1),
    checkOneOf('terminalRatingC', input.terminalRatingC, [60, 75, 90]),
    input.minimumSize === undefined ? null : checkSize('minimumSize', input.minimumSize),
  )
}

/**
 * Conductor size for a circuit: the smallest size whose ampacity satisfies both 690.8(B)(1)
 * (125 % of the current for continuous duty in the terminal column, no factors; 110.14(C)) and
 * 690.8(B)(2) (the current after temperature correction and adjustment, in the insulation's
 * column), and that the overcurrent device 690.9(B) calls for protects by 240.4(B)–(D).
 * Where no single size suffices, equal parallel sets of 1/0 and larger (310.10(G)/(H)).
 * Sources: NFPA 70 690.8(B), 110.14(C), 240.4, Tables 310.16/310.17 and the correction and
 * adjustment tables (2017, 2020, 2023 numbering via necRef).
 * Notes: the OCPD check is conservative for PV circuits that need no device (690.9(A)
 * exceptions). For FREE_AIR give the conductors bundled without spacing as
 * `currentCarryingConductors`; for parallel sets in one raceway, count every conductor.
 * `ampacityA` of the result is for one conductor; multiply by `parallelSets` for the circuit [A].
 */
export function selectConductor(input: ConductorSelectionInput): Outcome<ConductorSelection> {
  const shape = checkInputObject(input)
  if (shape) return { ok: false, issues: [shape] }
  const issues = checkInput(input)
  if (issues.length > 0) return { ok: false, issues }

  const { key, edition, maxCurrentA, continuous, material, insulation, method, terminalRatingC } = input
  const insulationColumn = INSULATION_RATING_C[insulation]
  const adder = rooftopAdder(key, edition, insulation, method, input.rooftopHeightIn)
  const correction = temperatureCorrection(key, edition, input.ambientC, adder.value, insulationColumn)
  const adjustment = adjustmentFactor(key, edition, input.currentCarryingConductors)
  if (!correction.ok) return correction
  if (!adjustment.ok) return adjustment

  const table = ampacityTableFor(method)
  const tableRef = necRef(edition, table.reference)
  const factor = correction.value.value * adjustment.value.value
  const ocpdRatingA = nextStandardRatingA(minimumOcpdRatingA(maxCurrentA, continuous))
  if (ocpdRatingA === null) {
    return {
      ok: false,
      issues: [inputIssue('maxCurrentA', `${fmt(maxCurrentA)} A needs an overcurrent device above ${LARGEST_STANDARD_OCPD_RATING_A} A, the largest standard rating (240.6(A))`)],
    }
  }
  const req: Requirement = {
    material,
    table,
    terminalColumn: terminalRatingC,
    insulationColumn,
    withoutFactorsA: continuous ? CONDUCTOR_CONTINUOUS_FACTOR * maxCurrentA : maxCurrentA,
    maxCurrentA,
    factor,
    ocpdRatingA,
  }
  const minimumSize = MINIMUM_CONDUCTOR_SIZE[material]
  const fromSize =
    input.minimumSize !== undefined && sizeIndex(input.minimumSize) > sizeIndex(minimumSize) ? input.minimumSize : minimumSize
  const chosen = smallestSingle(req, fromSize) ?? smallestParallel(req, fromSize)
  if (!chosen) {
    return {
      ok: false,
      issues: [
        inputIssue(
          'maxCurrentA',
          `${fmt(maxCurrentA)} A needs more than ${MAX_PARALLEL_SETS} parallel sets of 2000 kcmil ${material} under these conditions: split the circuit or change the wiring method`,
        ),
      ],
    }
  }

  const { sets } = chosen
  const perSet = (amps: number) => (sets > 1 ? `${fmt(amps)} A ÷ ${sets} sets = ${fmt(amps / sets)} A` : `${fmt(amps)} A`)
  const conductorText = `${sizeLabel(chosen.size)} ${material} ${insulation}`
  const steps: Derived[] = [
    {
      key: `${key}.requiredAmpacityWithoutFactors`,
      label: 'Required ampacity before correction and adjustment',
      value: req.withoutFactorsA,
      unit: 'A',
      formula: continuous ? `1.25 × ${fmt(maxCurrentA)} A = ${fmt(req.withoutFactorsA)} A` : `${fmt(maxCurrentA)} A (not continuous)`,
      reference: necRef(edition, '690.8(B)(1)'),
      status: 'info',
      message: continuous ? '125 % of the maximum current, checked in the terminal temperature column without factors.' : 'Maximum current, checked in the terminal temperature column.',
    },
    adder,
    correction.value,
    adjustment.value,
    {
      key: `${key}.requiredAmpacityWithFactors`,
      label: 'Required table ampacity after correction and adjustment',
      value: maxCurrentA / factor,
      unit: 'A',
      formula: `${fmt(maxCurrentA)} A ÷ (${fmt(correction.value.value)} × ${fmt(adjustment.value.value)}) = ${fmt(maxCurrentA / factor)} A`,
      reference: necRef(edition, '690.8(B)(2)'),
      status: 'info',
      message: `Maximum current divided by the factors, checked in the ${insulationColumn} °C column of ${tableRef}.`,
    },
    {
      key: `${key}.terminalAmpacity`,
      label: 'Ampacity in the terminal temperature column',
      value: chosen.terminalA,
      unit: 'A',
      formula: `${conductorText}, ${terminalRatingC} °C column: ${chosen.terminalA} A ≥ ${perSet(req.withoutFactorsA)}`,
      reference: `${necRef(edition, '110.14(C)')}; ${tableRef}`,
      status: 'pass',
      message: `Terminations rated ${terminalRatingC} °C limit the conductor to the ${terminalRatingC} °C column.`,
    },
    {
      key: `${key}.correctedAmpacity`,
      label: 'Ampacity after correction and adjustment',
      value: chosen.correctedA,
      unit: 'A',
      formula: `${chosen.insulationA} A × ${fmt(correction.value.value)} × ${fmt(adjustment.value.value)} = ${fmt(chosen.correctedA)} A ≥ ${perSet(maxCurrentA)}`,
      reference: `${necRef(edition, '690.8(B)(2)')}; ${tableRef}`,
      status: 'pass',
      message: `${insulation} is rated ${insulationColumn} °C; its column carries the conditions of use.`,
    },
  ]
  const protection = conductorProtectionLimit(chosen.totalAmpacityA, chosen.size, material)
  steps.push({
    key: `${key}.conductorProtection`,
    label: 'Protection by the required overcurrent device',
    value: protection.limitA,
    unit: 'A',
    formula: `${protection.basis}; device needed ${ocpdRatingA} A ≤ ${fmt(protection.limitA)} A`,
    reference: necRef(edition, protection.sections),
    status: 'pass',
    message: `The ${ocpdRatingA} A device 690.9(B) calls for protects this conductor.`,
  })
  const minimumNote =
    chosen.size !== fromSize
      ? ''
      : fromSize === minimumSize
        ? ` ${sizeLabel(minimumSize)} ${material} is the smallest size permitted (${necRef(edition, MINIMUM_CONDUCTOR_SIZE_REF)}).`
        : ` ${sizeLabel(fromSize)} is the minimum size the circuit requires.`
  const limitedBy = chosen.correctedA <= chosen.terminalA ? 'conditions of use' : `${terminalRatingC} °C terminals`
  const parallelNote =
    sets > 1
      ? ` Parallel conductors are needed (${necRef(edition, PARALLEL_REF)}): every set the same length, material, size, insulation and termination, and the current-carrying conductor count must include each set that shares a raceway.`
      : ''
  steps.push({
    key: `${key}.ampacity`,
    label: 'Conductor ampacity',
    value: chosen.ampacityA,
    unit: 'A',
    formula: `min(${fmt(chosen.correctedA)} A, ${chosen.terminalA} A) = ${fmt(chosen.ampacityA)} A${sets > 1 ? ` per set; ${sets} sets = ${fmt(chosen.totalAmpacityA)} A` : ''}`,
    reference: necRef(edition, '110.14(C)'),
    status: sets > 1 ? 'warn' : 'pass',
    message: `${sets > 1 ? `${sets} sets of ` : ''}${conductorText}: ${fmt(chosen.totalAmpacityA)} A, limited by the ${limitedBy}.${minimumNote}${parallelNote}`,
  })
  return { ok: true, value: { size: chosen.size, parallelSets: sets, ampacityA: chosen.ampacityA, steps } }
}
