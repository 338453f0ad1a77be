import { fmt } from '../format'
import type { Derived } from '../types'

/** STC ratings of one module that add up in series and in parallel. */
export interface ModuleStcRatings {
  /** Open-circuit voltage at STC [V]. */
  vocV: number
  /** Maximum-power voltage at STC [V]. */
  vmpV: number
  /** Short-circuit current at STC [A]. */
  iscA: number
  /** Maximum-power current at STC [A]. */
  impA: number
  /** Maximum power at STC [W]. */
  pmaxW: number
}

export interface SeriesStringRatings {
  vocV: Derived
  vmpV: Derived
  iscA: Derived
  impA: Derived
  powerW: Derived
}

const info = (key: string, label: string, value: number, unit: string, formula: string, message: string): Derived => ({
  key, label, value, unit, formula, reference: '', status: 'info', message,
})

/**
 * STC ratings of modules connected in series: voltages add, the current stays that of one module.
 * Source: circuit theory (Kirchhoff's voltage law); no code section. STC = 1000 W/m², 25 °C cell.
 * @param key     result key prefix, e.g. `string.S1`
 * @param module  module STC ratings [V, A, W]
 * @param modules modules in series [-]
 */
export function seriesStringRatings(key: string, module: ModuleStcRatings, modules: number): SeriesStringRatings {
  const times = (v: number, unit: string) => `${modules} × ${fmt(v)} ${unit}`
  return {
    vocV: info(`${key}.vocStc`, 'String Voc at STC', modules * module.vocV, 'V', times(module.vocV, 'V'), 'Series voltages add.'),
    vmpV: info(`${key}.vmpStc`, 'String Vmp at STC', modules * module.vmpV, 'V', times(module.vmpV, 'V'), 'Series voltages add.'),
    iscA: info(`${key}.iscStc`, 'String Isc at STC', module.iscA, 'A', `${fmt(module.iscA)} A`, 'Series current equals one module\u2019s current.'),
    impA: info(`${key}.impStc`, 'String Imp at STC', module.impA, 'A', `${fmt(module.impA)} A`, 'Series current equals one module\u2019s current.'),
    powerW: info(`${key}.powerStc`, 'String power at STC', modules * module.pmaxW, 'W', times(module.pmaxW, 'W'), 'Module powers add.'),
  }
}

/**
 * Sum of circuits joined in parallel: currents (or powers) add, the voltage is common.
 * Source: circuit theory (Kirchhoff's current law); no code section.
 * @param key    result key
 * @param label  human label
 * @param unit   unit of every value [A or W]
 * @param values values being paralleled [unit]
 */
export function parallelSum(key: string, label: string, unit: string, values: readonly number[]): Derived {
  const value = values.reduce((sum, v) => sum + v, 0)
  const formula = values.length === 0 ? `0 ${unit}` : values.map((v) => `${fmt(v)} ${unit}`).join(' + ')
  return info(key, label, value, unit, formula, 'Parallel currents add; the voltage is common.')
}
