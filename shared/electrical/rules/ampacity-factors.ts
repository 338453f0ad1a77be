import type { Derived, Insulation, NecEdition, Outcome, TemperatureColumn, WiringMethod } from '../types'
import { necRef } from '../reference'
import { fmt } from '../format'
import {
  ROOFTOP_ADDER_C,
  ROOFTOP_ADDER_EXEMPT_INSULATION,
  ROOFTOP_ADDER_MAX_HEIGHT_IN,
  ROOFTOP_ADDER_REF,
} from '../tables/rooftop-adder'
import { TEMPERATURE_CORRECTION_REF, temperatureCorrectionRow } from '../tables/temperature-correction'
import { ADJUSTMENT_FACTORS_REF, adjustmentFactorRow } from '../tables/adjustment-factors'
import { inputIssue } from './input-checks'

/**
 * Rooftop temperature adder for raceways and cables in direct sunlight.
 * Source: NFPA 70-2017 310.15(B)(3)(c); 2020 and 2023 310.15(B)(2), with the XHHW-2 exception.
 * Conductors in free air are not a raceway or cable, so the adder does not apply to them.
 * @param rooftopHeightIn height of the bottom of the raceway or cable above the roof [in]; null off the roof
 * @returns adder [°C]
 */
export function rooftopAdder(
  key: string,
  edition: NecEdition,
  insulation: Insulation,
  method: WiringMethod,
  rooftopHeightIn: number | null,
): Derived {
  const reference = necRef(edition, ROOFTOP_ADDER_REF)
  const base = { key: `${key}.rooftopAdder`, label: 'Rooftop temperature adder', unit: '°C', reference, status: 'info' as const }
  if (rooftopHeightIn === null) return { ...base, value: 0, formula: 'not on a rooftop → 0 °C', message: 'Not installed on a rooftop.' }
  if (method === 'FREE_AIR') {
    return { ...base, value: 0, formula: 'conductors in free air → 0 °C', message: 'The adder applies to raceways and cables; conductors in free air are neither.' }
  }
  if (insulation === ROOFTOP_ADDER_EXEMPT_INSULATION) {
    return { ...base, value: 0, formula: 'XHHW-2 → 0 °C (exception)', message: 'Type XHHW-2 conductors are not subject to the rooftop adder (exception).' }
  }
  if (rooftopHeightIn >= ROOFTOP_ADDER_MAX_HEIGHT_IN) {
    return {
      ...base,
      value: 0,
      formula: `${fmt(rooftopHeightIn, 3)} in ≥ 7/8 in → 0 °C`,
      message: 'At least 7/8 in above the roof: no adder.',
    }
  }
  return {
    ...base,
    value: ROOFTOP_ADDER_C,
    formula: `${fmt(rooftopHeightIn, 3)} in < 7/8 in → ${ROOFTOP_ADDER_C} °C`,
    message: `Less than 7/8 in above the roof: ${ROOFTOP_ADDER_C} °C (60 °F) is added to the outdoor ambient.`,
  }
}

/**
 * Ambient temperature correction factor for the conductor's insulation column.
 * Source: NFPA 70-2020 and 2023 Table 310.15(B)(1); 2017 Table 310.15(B)(2)(a).
 * @param ambientC design high ambient before the rooftop adder [°C]
 * @param adderC rooftop adder [°C]
 * @param column insulation temperature column [°C]
 * @returns correction factor [-], or an issue on `ambientC` when the table has no factor
 */
export function temperatureCorrection(
  key: string,
  edition: NecEdition,
  ambientC: number,
  adderC: number,
  column: TemperatureColumn,
): Outcome<Derived> {
  const effectiveC = ambientC + adderC
  const ambientText = adderC > 0 ? `${fmt(ambientC, 1)} °C + ${fmt(adderC, 1)} °C = ${fmt(effectiveC, 1)} °C` : `${fmt(effectiveC, 1)} °C`
  const found = temperatureCorrectionRow(effectiveC, column)
  if (!found) {
    return {
      ok: false,
      issues: [
        inputIssue(
        'ambientC',
        `ambient ${ambientText} is above the last band with a factor in the ${column} °C column of ${necRef(edition, TEMPERATURE_CORRECTION_REF)}: no ${column} °C conductor may be used there`,
        ),
      ],
    }
  }
  return {
    ok: true,
    value: {
      key: `${key}.temperatureCorrection`,
      label: 'Ambient temperature correction factor',
      value: found.factor,
      unit: '-',
      formula: `${ambientText}; ${column} °C column, band ${found.row.band} °C → ${fmt(found.factor)}`,
      reference: necRef(edition, TEMPERATURE_CORRECTION_REF),
      status: 'info',
      message: `Correction for a ${fmt(effectiveC, 1)} °C ambient against the tables' 30 °C basis.`,
    },
  }
}

/**
 * Adjustment factor for more than three current-carrying conductors.
 * Source: NFPA 70-2020 and 2023 Table 310.15(C)(1); 2017 Table 310.15(B)(3)(a).
 * @param currentCarryingConductors current-carrying conductors in the raceway or cable, or bundled in free air [-]
 * @returns adjustment factor [-], or an issue on `currentCarryingConductors`
 */
export function adjustmentFactor(
  key: string,
  edition: NecEdition,
  currentCarryingConductors: number,
): Outcome<Derived> {
  const found = adjustmentFactorRow(currentCarryingConductors)
  if (!found) return { ok: false, issues: [inputIssue('currentCarryingConductors', 'must be a whole number of at least 1')] }
  return {
    ok: true,
    value: {
      key: `${key}.adjustmentFactor`,
      label: 'Adjustment factor for current-carrying conductors',
      value: found.factor,
      unit: '-',
      formula: `${currentCarryingConductors} current-carrying conductors, band ${found.band} → ${fmt(found.factor)}`,
      reference: necRef(edition, ADJUSTMENT_FACTORS_REF),
      status: 'info',
      message: found.factor === 1 ? 'Three or fewer current-carrying conductors: no adjustment.' : `More than three current-carrying conductors: ${fmt(found.factor * 100, 0)} % of the table ampacity.`,
    },
  }
}
