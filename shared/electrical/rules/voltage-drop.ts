import { WIRING_METHODS, type ConductorMaterial, type ConductorSize, type Derived, type Outcome, type VoltageDrop, type VoltageDropInput, type WiringMethod } from '../types'
import { fmt } from '../format'
import { CONDUCTOR_PROPERTIES, CONDUCTOR_PROPERTIES_REF } from '../tables/conductor-properties'
import { AC_IMPEDANCE, AC_IMPEDANCE_REF, IMPEDANCE_CONDUIT_OF, type ImpedanceConduit } from '../tables/ac-impedance'
import {
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
import { sizeLabel } from './sizes'

/** Power factor Table 9's effective-Z columns are printed for. */
const TABLE_9_POWER_FACTOR = 0.85

/**
 * Table 9 column for a wiring method. Cable and free-air runs have no conduit: the PVC
 * (non-magnetic) column stands for them (common practice, no source).
 */
function impedanceConduit(method: WiringMethod): ImpedanceConduit {
  return method === 'CABLE' || method === 'FREE_AIR' ? 'pvc' : IMPEDANCE_CONDUIT_OF[method]
}

/** Conductor resistance or effective impedance per 1000 ft with its derivation. */
interface PerKft {
  ohmPerKft: number
  formula: string
  reference: string
}

/**
 * DC resistance of an uncoated copper or aluminium stranded conductor at 75 °C.
 * Source: NFPA 70 Chapter 9 Table 8 (2017, 2020, 2023).
 * @returns [Ω/kft]
 */
export function dcResistanceOhmPerKft(size: ConductorSize, material: ConductorMaterial): number {
  const row = CONDUCTOR_PROPERTIES[size]
  return material === 'Cu' ? row.copperOhmPerKft : row.aluminumOhmPerKft
}

/**
 * Effective impedance Ze = R × cos θ + XL × sin θ of three single conductors in conduit at 75 °C.
 * Source: NFPA 70 Chapter 9 Table 9 and its Note 2 (2017, 2020, 2023).
 * @returns [Ω/kft], or null where Table 9 has no row for the size and material
 */
export function effectiveImpedanceOhmPerKft(
  size: ConductorSize,
  material: ConductorMaterial,
  method: WiringMethod,
  powerFactor: number,
): PerKft | null {
  const row = AC_IMPEDANCE[size]
  const resistance = row?.resistanceOhmPerKft[material]
  if (!row || !resistance) return null
  const conduit = impedanceConduit(method)
  const r = resistance[conduit]
  const x = row.reactanceOhmPerKft[conduit]
  const sinTheta = Math.sqrt(1 - powerFactor * powerFactor)
  const ohmPerKft = r * powerFactor + x * sinTheta
  return {
    ohmPerKft,
    formula: `Ze = R cos θ + XL sin θ = ${fmt(r, 4)} × ${fmt(powerFactor, 3)} + ${fmt(x, 4)} × ${fmt(sinTheta, 3)} = ${fmt(ohmPerKft, 4)} Ω/kft (${conduit} conduit column)`,
    reference: `${AC_IMPEDANCE_REF}, Note 2`,
  }
}

/**
 * Voltage drop of a circuit: Vd = k × L × I × Z ÷ 1000 ÷ sets with k = 2 for DC and single phase
 * (out and back) and √3 for three phase; Z is the Table 8 DC resistance or the Table 9
 * effective impedance, both at 75 °C. The limit is a design criterion: the NEC makes voltage
 * drop mandatory only for a few circuit types, so exceeding it gives `warn`.
 * Sources: NFPA 70 Chapter 9 Tables 8 and 9 (2017, 2020, 2023).
 */
export function voltageDrop(input: VoltageDropInput): Outcome<VoltageDrop> {
  const shape = checkInputObject(input)
  if (shape) return { ok: false, issues: [shape] }
  const issues = collectIssues(
    checkKey(input.key),
    checkEdition(input.edition),
    checkOneOf('system', input.system, ['dc', 'ac1', 'ac3']),
    checkPositive('currentA', input.currentA, 'A'),
    checkPositive('voltageV', input.voltageV, 'V'),
    checkPositive('lengthFt', input.lengthFt, 'ft'),
    checkSize('size', input.size),
    checkMaterial(input.material),
    checkWholeNumber('parallelSets', input.parallelSets, 1),
    checkOneOf('method', input.method, WIRING_METHODS),
    input.powerFactor === undefined ? null : checkInRange('powerFactor', input.powerFactor, '(cos θ)', 0.01, 1),
    checkInRange('limitPercent', input.limitPercent, '%', 0.01, 100),
  )
  if (issues.length > 0) return { ok: false, issues }

  const { key, system, currentA, voltageV, lengthFt, size, material, parallelSets, limitPercent } = input
  const powerFactor = input.powerFactor ?? TABLE_9_POWER_FACTOR
  let perKft: PerKft
  if (system === 'dc') {
    const r = dcResistanceOhmPerKft(size, material)
    perKft = { ohmPerKft: r, formula: `${sizeLabel(size)} ${material}, stranded, 75 °C: R = ${fmt(r, 5)} Ω/kft`, reference: CONDUCTOR_PROPERTIES_REF }
  } else {
    const z = effectiveImpedanceOhmPerKft(size, material, input.method, powerFactor)
    if (!z) return { ok: false, issues: [inputIssue('size', `${sizeLabel(size)} ${material} has no row in ${AC_IMPEDANCE_REF} for an AC voltage drop`)] }
    perKft = z
  }
  const multiplier = system === 'ac3' ? Math.sqrt(3) : 2
  const multiplierText = system === 'ac3' ? '√3' : '2'
  const dropV = (multiplier * lengthFt * currentA * perKft.ohmPerKft) / 1000 / parallelSets
  const dropPercent = (dropV / voltageV) * 100
  const within = dropPercent <= limitPercent
  const setsText = parallelSets > 1 ? ` ÷ ${parallelSets} sets` : ''
  const steps: Derived[] = [
    {
      key: `${key}.conductorImpedance`,
      label: system === 'dc' ? 'Conductor DC resistance' : 'Conductor effective impedance',
      value: perKft.ohmPerKft,
      unit: 'Ω/kft',
      formula: perKft.formula,
      reference: perKft.reference,
      status: 'info',
      message: system === 'dc' ? 'Uncoated stranded conductor at 75 °C.' : `Power factor ${fmt(powerFactor, 3)}; conductor at 75 °C.`,
    },
    {
      key: `${key}.voltageDrop`,
      label: 'Voltage drop',
      value: dropV,
      unit: 'V',
      formula: `${multiplierText} × ${fmt(lengthFt, 1)} ft × ${fmt(currentA)} A × ${fmt(perKft.ohmPerKft, 5)} Ω/kft ÷ 1000${setsText} = ${fmt(dropV, 3)} V`,
      reference: perKft.reference,
      status: 'info',
      message: `${system === 'ac3' ? 'Three phase' : system === 'ac1' ? 'Single phase, out and back' : 'DC, out and back'} over a one-way length of ${fmt(lengthFt, 1)} ft.`,
    },
    {
      key: `${key}.voltageDropPercent`,
      label: 'Voltage drop',
      value: dropPercent,
      unit: '%',
      formula: `${fmt(dropV, 3)} V ÷ ${fmt(voltageV, 1)} V × 100 = ${fmt(dropPercent)} % ${within ? '≤' : '>'} ${fmt(limitPercent)} %`,
      reference: perKft.reference,
      status: within ? 'pass' : 'warn',
      message: within
        ? `Within the ${fmt(limitPercent)} % design limit.`
        : `Exceeds the ${fmt(limitPercent)} % design limit: consider a larger conductor.`,
    },
  ]
  return { ok: true, value: { dropV, dropPercent, steps } }
}
