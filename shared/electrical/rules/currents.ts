import { fmt } from '../format'
import { necRef, type SectionByEdition } from '../reference'
import type { Derived, NecEdition } from '../types'

/**
 * 690.8(A) section numbers per edition (numbering from memory): the 2017 list (A)(1)–(A)(6) was
 * regrouped under (A)(1)(a)–(e) in 2020 and under (A)(1) PV system circuits and (A)(2) circuits on
 * the output of electronic power converters in 2023.
 */
export const SECTION_690_8_A = {
  pvSource: { 2017: '690.8(A)(1)', 2020: '690.8(A)(1)(a)', 2023: '690.8(A)(1)(a)' },
  pvOutput: { 2017: '690.8(A)(2)', 2020: '690.8(A)(1)(b)', 2023: '690.8(A)(1)(a)' },
  dcDcConverter: { 2017: '690.8(A)(5)', 2020: '690.8(A)(1)(c)', 2023: '690.8(A)(2)' },
  inverterOutput: { 2017: '690.8(A)(3)', 2020: '690.8(A)(1)(d)', 2023: '690.8(A)(2)' },
} as const satisfies Record<string, SectionByEdition>

/** Multiplier on Isc for the maximum PV circuit current in 690.8(A)(1) [-]. */
export const PV_ISC_MULTIPLIER = 1.25

/**
 * Maximum PV source (string) circuit current: 125 % of the sum of parallel-connected module Isc.
 * Source: NFPA 70 690.8(A)(1) (2017), 690.8(A)(1)(a)(1) (2020, 2023).
 * @param iscA              module short-circuit current at STC [A]
 * @param parallelModules   modules in parallel within the circuit, usually 1 [-]
 */
export function pvSourceMaxCurrent(edition: NecEdition, key: string, iscA: number, parallelModules = 1): Derived {
  const value = PV_ISC_MULTIPLIER * iscA * parallelModules
  return {
    key, label: 'Maximum PV source circuit current', value, unit: 'A',
    formula: parallelModules === 1 ? `1.25 × ${fmt(iscA)} A` : `1.25 × ${parallelModules} × ${fmt(iscA)} A`,
    reference: necRef(edition, SECTION_690_8_A.pvSource), status: 'info',
    message: '125 % of the module short-circuit current (irradiance above 1000 W/m²).',
  }
}

/**
 * Maximum PV output circuit current: the sum of the parallel source circuit maximum currents.
 * Source: NFPA 70 690.8(A)(2) (2017), 690.8(A)(1)(b) (2020), 690.8(A)(1)(a) (2023).
 * @param sourceMaxCurrentsA 690.8(A) maximum current of each paralleled source circuit [A]
 */
export function pvOutputMaxCurrent(edition: NecEdition, key: string, sourceMaxCurrentsA: readonly number[]): Derived {
  return {
    key, label: 'Maximum PV output circuit current',
    value: sourceMaxCurrentsA.reduce((s, a) => s + a, 0), unit: 'A',
    formula: sourceMaxCurrentsA.length === 0 ? '0 A' : sourceMaxCurrentsA.map((a) => `${fmt(a)} A`).join(' + '),
    reference: necRef(edition, SECTION_690_8_A.pvOutput), status: 'info',
    message: `Sum of ${sourceMaxCurrentsA.length} paralleled source circuit currents.`,
  }
}

/** Electronic power converters whose output circuit current is their continuous output rating. */
export type ConverterKind = 'inverter' | 'dc_dc_converter' | 'charge_controller'

const CONVERTER_LABEL: Record<ConverterKind, string> = {
  inverter: 'inverter',
  dc_dc_converter: 'DC-to-DC converter',
  charge_controller: 'charge controller',
}

/**
 * Maximum output circuit current of inverters, DC-to-DC converters (optimisers) and charge
 * controllers: the continuous output current rating, times the units in parallel on the circuit.
 * Source: NFPA 70 690.8(A)(3) and (A)(5) (2017), 690.8(A)(1)(c)/(d) (2020), 690.8(A)(2) (2023).
 * @param ratingA continuous output current rating of one unit [A]
 * @param units   units whose outputs are paralleled on this circuit (microinverters on a branch,
 *                inverters into an AC combiner) [-]
 */
export function converterOutputCurrent(edition: NecEdition, key: string, kind: ConverterKind, ratingA: number, units = 1): Derived {
  const section = kind === 'inverter' ? SECTION_690_8_A.inverterOutput : SECTION_690_8_A.dcDcConverter
  const name = CONVERTER_LABEL[kind]
  return {
    key, label: `Maximum ${name} output circuit current`, value: ratingA * units, unit: 'A',
    formula: units === 1 ? `${fmt(ratingA)} A` : `${units} × ${fmt(ratingA)} A`,
    reference: necRef(edition, section), status: 'info',
    message: `Continuous output current rating of the ${name}${units === 1 ? '' : `, ${units} units`}.`,
  }
}

/**
 * Sum of currents from several sources into one circuit, e.g. inverter outputs into an AC combiner
 * panel: the output circuit carries their sum.
 * Source: NFPA 70 690.8(A)(3) (2017), 690.8(A)(1)(d) (2020), 690.8(A)(2) (2023).
 * @param currentsA maximum current of each source circuit [A]
 */
export function combinedOutputCurrent(edition: NecEdition, key: string, currentsA: readonly number[]): Derived {
  return {
    key, label: 'Maximum combined output circuit current', value: currentsA.reduce((s, a) => s + a, 0), unit: 'A',
    formula: currentsA.length === 0 ? '0 A' : currentsA.map((a) => `${fmt(a)} A`).join(' + '),
    reference: necRef(edition, SECTION_690_8_A.inverterOutput), status: 'info',
    message: `Sum of the continuous output currents of ${currentsA.length} source circuit(s).`,
  }
}

/**
 * Current of a feeder or load circuit taken from the nameplate of the equipment it serves.
 * Source: NFPA 70 110.3(B) (listing and labelling, all editions); for loads, Article 220 load
 * calculations by the designer may govern instead.
 * @param currentA nameplate current [A]
 * @param what     what the nameplate belongs to
 */
export function nameplateCurrent(edition: NecEdition, key: string, currentA: number, what: string): Derived {
  return {
    key, label: 'Circuit current (nameplate)', value: currentA, unit: 'A', formula: `${fmt(currentA)} A`,
    reference: necRef(edition, '110.3(B)'), status: 'info', message: `Nameplate current of ${what}.`,
  }
}
