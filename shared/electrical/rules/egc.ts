import { CONDUCTOR_SIZES, type ConductorSize, type Derived, type EgcSizing, type EgcSizingInput, type Outcome } from '../types'
import { necRef } from '../reference'
import { fmt } from '../format'
import { CONDUCTOR_PROPERTIES } from '../tables/conductor-properties'
import { EGC_250_122, egcRow } from '../tables/egc-250-122'
import { MINIMUM_CONDUCTOR_SIZE } from '../tables/minimum-conductor-size'
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
import { sizeIndex, sizeLabel } from './sizes'

const cmil = (size: ConductorSize): number => CONDUCTOR_PROPERTIES[size].areaCmil

/** Smallest size of at least `areaCmil`, from the material's minimum size up; null above 2000 kcmil. */
function sizeWithAreaAtLeast(areaCmil: number, fromSize: ConductorSize): ConductorSize | null {
  return CONDUCTOR_SIZES.slice(sizeIndex(fromSize)).find((s) => cmil(s) >= areaCmil) ?? null
}

/**
 * Equipment grounding conductor size.
 * Table 250.122 by the rating of the overcurrent device ahead of the circuit; for PV circuits
 * without a device, 690.45 uses an assumed device rated at the circuit's maximum current, and
 * needs no increase for voltage drop. Elsewhere 250.122(B) increases the EGC in proportion to
 * the circular-mil area of upsized ungrounded conductors. 250.122(A): the EGC need not be larger
 * than the circuit conductors.
 * Sources: NFPA 70 250.122(A), (B), Table 250.122, 690.45 (2017, 2020, 2023; from memory).
 */
export function sizeEgc(input: EgcSizingInput): Outcome<EgcSizing> {
  const shape = checkInputObject(input)
  if (shape) return { ok: false, issues: [shape] }
  const issues = collectIssues(
    checkKey(input.key),
    checkEdition(input.edition),
    input.ocpdRatingA === null ? null : checkPositive('ocpdRatingA', input.ocpdRatingA, 'A'),
    checkPositive('maxCurrentA', input.maxCurrentA, 'A'),
    checkMaterial(input.material),
    checkSize('phaseSizeMinimum', input.phaseSizeMinimum),
    checkSize('phaseSizeChosen', input.phaseSizeChosen),
    input.pvSystemCircuit === undefined ? null : checkBoolean('pvSystemCircuit', input.pvSystemCircuit),
  )
  if (issues.length > 0) return { ok: false, issues }
  if (sizeIndex(input.phaseSizeChosen) < sizeIndex(input.phaseSizeMinimum)) {
    return { ok: false, issues: [inputIssue('phaseSizeChosen', `${input.phaseSizeChosen} is smaller than the minimum size ${input.phaseSizeMinimum}`)] }
  }

  const { key, edition, material, phaseSizeMinimum, phaseSizeChosen } = input
  const pvCircuit = input.pvSystemCircuit === true || input.ocpdRatingA === null
  const basisA = input.ocpdRatingA ?? input.maxCurrentA
  const basisField = input.ocpdRatingA === null ? 'maxCurrentA' : 'ocpdRatingA'
  const row = egcRow(basisA)
  if (!row) {
    const largest = EGC_250_122[EGC_250_122.length - 1]?.upToA
    return { ok: false, issues: [inputIssue(basisField, `${fmt(basisA)} A is above the last row of Table 250.122 (${largest} A)`)] }
  }
  const tableSize = row.sizes[material]
  if (!tableSize) {
    return {
      ok: false,
      issues: [inputIssue('material', `Table 250.122 gives ${row.printedAl} kcmil aluminium at ${row.upToA} A, a size the engine does not carry: size this EGC by hand`)],
    }
  }

  const steps: Derived[] = [
    {
      key: `${key}.egcTable`,
      label: 'Equipment grounding conductor from Table 250.122',
      value: cmil(tableSize),
      unit: 'cmil',
      formula:
        input.ocpdRatingA === null
          ? `no overcurrent device: assumed device = max current ${fmt(basisA)} A ≤ ${row.upToA} A → ${sizeLabel(tableSize)} ${material}`
          : `device ${fmt(basisA)} A ≤ ${row.upToA} A → ${sizeLabel(tableSize)} ${material}`,
      reference: input.ocpdRatingA === null ? `${necRef(edition, '690.45')}; ${necRef(edition, 'Table 250.122')}` : necRef(edition, 'Table 250.122'),
      status: 'info',
      message: `${sizeLabel(tableSize)} ${material} for a ${row.upToA} A row.`,
    },
  ]

  let size = tableSize
  if (phaseSizeChosen !== phaseSizeMinimum) {
    if (pvCircuit) {
      steps.push({
        key: `${key}.egcIncrease`,
        label: 'Increase for upsized circuit conductors',
        value: cmil(tableSize),
        unit: 'cmil',
        formula: `PV system circuit: no increase for ${sizeLabel(phaseSizeMinimum)} → ${sizeLabel(phaseSizeChosen)}`,
        reference: necRef(edition, '690.45'),
        status: 'info',
        message: 'PV system circuits need no EGC increase where conductors are upsized for voltage drop.',
      })
    } else {
      const ratio = cmil(phaseSizeChosen) / cmil(phaseSizeMinimum)
      const neededCmil = cmil(tableSize) * ratio
      const increased = sizeWithAreaAtLeast(neededCmil, MINIMUM_CONDUCTOR_SIZE[material])
      if (!increased) return { ok: false, issues: [inputIssue('phaseSizeChosen', 'the proportional EGC increase exceeds 2000 kcmil')] }
      size = increased
      steps.push({
        key: `${key}.egcIncrease`,
        label: 'Increase for upsized circuit conductors',
        value: neededCmil,
        unit: 'cmil',
        formula: `${cmil(tableSize)} cmil × ${cmil(phaseSizeChosen)} cmil ÷ ${cmil(phaseSizeMinimum)} cmil = ${fmt(neededCmil, 0)} cmil → ${sizeLabel(size)}`,
        reference: necRef(edition, '250.122(B)'),
        status: 'info',
        message: 'Circuit conductors were upsized, so the EGC increases in proportion to their circular-mil area.',
      })
    }
  }
  const capped = sizeIndex(size) > sizeIndex(phaseSizeChosen)
  if (capped) size = phaseSizeChosen
  steps.push({
    key: `${key}.egcSize`,
    label: 'Equipment grounding conductor',
    value: cmil(size),
    unit: 'cmil',
    formula: capped ? `${sizeLabel(size)} ${material} (not larger than the circuit conductors)` : `${sizeLabel(size)} ${material}`,
    reference: necRef(edition, capped ? '250.122(A)' : '250.122'),
    status: 'pass',
    message: `Use a ${sizeLabel(size)} ${material} equipment grounding conductor${capped ? ', the size of the circuit conductors' : ''}.`,
  })
  return { ok: true, value: { size, steps } }
}
