import { fmt } from '../format'
import { necRef } from '../reference'
import { vocCorrectionFactor690_7A } from '../tables/voc-correction-690-7a'
import type { Derived, NecEdition, Outcome } from '../types'
import { checkNotAbove } from './ratings'

/** Module data the 690.7(A) calculation needs. */
export interface ModuleVocData {
  /** Open-circuit voltage at STC [V]. */
  vocV: number
  /** Manufacturer's Voc temperature coefficient, or null when the datasheet gives none. */
  vocCoefficient: { value: number; unit: '%/°C' | 'V/°C' } | null
  technology: 'crystalline' | 'thin_film'
}

/** STC cell temperature [°C] (IEC 61215 / IEC 60904-3 reference conditions). */
export const STC_CELL_TEMPERATURE_C = 25

/** One- and two-family dwellings may have PV DC circuits up to 600 V: 690.7 (2017, 2020, 2023). */
export const DWELLING_DC_LIMIT_V = 600

/**
 * Maximum PV string voltage: modules in series times module Voc corrected to the design low
 * temperature, with the manufacturer's coefficient (690.7(A)(1)) or, for crystalline silicon
 * without one, the factor of Table 690.7(A) (690.7(A)(2)). Never less than the STC value.
 * Source: NFPA 70 690.7(A)(1) and (A)(2), same numbering in 2017, 2020 and 2023 (numbering from memory).
 * @param key      result key, e.g. `string.S1.vocMax`
 * @param module   module Voc [V], coefficient [%/°C or V/°C], technology
 * @param modules  modules in series [-]
 * @param lowC     design low ambient temperature, extreme annual mean minimum [°C]
 */
export function maxStringVoltage(
  edition: NecEdition,
  key: string,
  module: ModuleVocData,
  modules: number,
  lowC: number,
): Outcome<Derived> {
  const dT = lowC - STC_CELL_TEMPERATURE_C
  const label = 'Maximum string voltage (cold Voc)'
  const coefficient = module.vocCoefficient
  if (coefficient) {
    const perModule =
      coefficient.unit === 'V/°C' ? module.vocV + coefficient.value * dT : module.vocV * (1 + (coefficient.value / 100) * dT)
    const formula =
      coefficient.unit === 'V/°C'
        ? `${modules} × (${fmt(module.vocV)} V + (${fmt(coefficient.value, 4)} V/°C) × (${fmt(lowC, 1)} − 25) °C)`
        : `${modules} × ${fmt(module.vocV)} V × (1 + (${fmt(coefficient.value, 4)} %/°C) × (${fmt(lowC, 1)} − 25) °C)`
    const value = modules * Math.max(perModule, module.vocV)
    return {
      ok: true,
      value: {
        key, label, value, unit: 'V', formula, reference: necRef(edition, '690.7(A)(1)'), status: 'info',
        message: perModule < module.vocV
          ? 'Design low is above 25 °C; the STC Voc is kept as the maximum.'
          : 'Corrected with the manufacturer\u2019s Voc temperature coefficient.',
      },
    }
  }
  if (module.technology !== 'crystalline') {
    return { ok: false, issues: [{ field: 'equipment.modules.vocCoefficient', severity: 'error', message: 'Table 690.7(A) covers crystalline silicon only; a thin-film module needs its Voc temperature coefficient' }] }
  }
  const factor = lowC >= STC_CELL_TEMPERATURE_C ? 1 : vocCorrectionFactor690_7A(lowC)
  if (factor === null) {
    return { ok: false, issues: [{ field: 'codeBasis.designLowC', severity: 'error', message: `Table 690.7(A) ends at −40 °C; at ${fmt(lowC, 1)} °C give the module\u2019s Voc temperature coefficient` }] }
  }
  return {
    ok: true,
    value: {
      key, label, value: modules * module.vocV * factor, unit: 'V',
      formula: `${modules} × ${fmt(module.vocV)} V × ${fmt(factor)}`,
      reference: necRef(edition, '690.7(A)(2)'),
      status: 'info',
      message: `No coefficient given: Table 690.7(A) factor ${fmt(factor)} for ${fmt(lowC, 1)} °C.`,
    },
  }
}

/**
 * Checks the maximum PV voltage against one limit: an equipment rating (110.3(B)) or the 600 V
 * dwelling limit of 690.7. Passes at or below the limit.
 * Source: NFPA 70 690.7 and 110.3(B) (2017, 2020, 2023).
 * @param key       result key
 * @param vocMaxV   maximum PV system voltage [V]
 * @param limitV    the limit [V]
 * @param limitName what the limit is, e.g. "inverter maximum DC input voltage"
 * @param section   code section that makes the limit binding
 */
export function checkVoltageLimit(
  edition: NecEdition,
  key: string,
  vocMaxV: number,
  limitV: number,
  limitName: string,
  section: string,
): Derived {
  return checkNotAbove({
    edition, key, label: `Maximum voltage vs ${limitName}`, value: vocMaxV, unit: 'V', limit: limitV, limitName, section,
    whenCrossed: 'fail', advice: 'use fewer modules in series.',
  })
}

/**
 * Maximum voltage of a circuit of DC-to-DC converters (optimisers) in series: the sum of their
 * rated maximum output voltages.
 * Source: NFPA 70 690.7(B) (2017, 2020, 2023; from memory).
 * @param maxOutputV rated maximum output voltage of one converter [V]
 * @param converters converters in series [-]
 */
export function converterStringVoltage(edition: NecEdition, key: string, maxOutputV: number, converters: number): Derived {
  return {
    key, label: 'Maximum DC-to-DC converter circuit voltage', value: maxOutputV * converters, unit: 'V',
    formula: `${converters} × ${fmt(maxOutputV)} V`, reference: necRef(edition, '690.7(B)'), status: 'info',
    message: 'Sum of the converters\u2019 rated maximum output voltages.',
  }
}
