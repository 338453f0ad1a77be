import { fmt } from '../format'
import type { Derived, NecEdition } from '../types'
import { checkNotAbove, checkNotBelow, type LimitCheck } from './ratings'
import { STC_CELL_TEMPERATURE_C } from './max-voltage'

/** Module data for Vmp at a cell temperature. */
export interface ModuleVmpData {
  vmpV: number
  pmaxW: number
  vmpCoefficient: { value: number; unit: '%/°C' | 'V/°C' } | null
  pmaxCoefficient: { value: number; unit: '%/°C' | 'W/°C' }
}

/** MPPT window and input limits of one inverter input. */
export interface MpptInput {
  mpptMinV: number
  mpptMaxV: number
  startVoltageV: number
  maxInputCurrentPerMpptA: number
  maxShortCircuitCurrentPerMpptA: number
}

/**
 * String Vmp at a cell temperature, linear in temperature from STC. Without a Vmp coefficient the
 * Pmax coefficient stands in for it: Vmp falls with heat about as fast as Pmax does, slightly
 * slower, so the proxy errs low, the safe side for the minimum-voltage check.
 * // common practice, no source (the proxy); linear model per IEC 60891 procedure 1.
 * @param key      result key
 * @param label    human label
 * @param module   Vmp [V], Pmax [W], coefficients [%/°C, V/°C or W/°C]
 * @param modules  modules in series [-]
 * @param cellC    cell temperature [°C]
 */
export function stringVmpAtCellTemperature(
  key: string,
  label: string,
  module: ModuleVmpData,
  modules: number,
  cellC: number,
): Derived {
  const dT = cellC - STC_CELL_TEMPERATURE_C
  const vmp = module.vmpCoefficient
  const proxyPercent = module.pmaxCoefficient.unit === '%/°C' ? module.pmaxCoefficient.value : (module.pmaxCoefficient.value / module.pmaxW) * 100
  const perModule = vmp?.unit === 'V/°C' ? module.vmpV + vmp.value * dT : module.vmpV * (1 + ((vmp?.value ?? proxyPercent) / 100) * dT)
  const coefficientText = vmp ? `${fmt(vmp.value, 4)} ${vmp.unit}` : `${fmt(proxyPercent, 4)} %/°C`
  const formula =
    vmp?.unit === 'V/°C'
      ? `${modules} × (${fmt(module.vmpV)} V + (${coefficientText}) × (${fmt(cellC, 1)} − 25) °C)`
      : `${modules} × ${fmt(module.vmpV)} V × (1 + (${coefficientText}) × (${fmt(cellC, 1)} − 25) °C)`
  return {
    key, label, value: modules * perModule, unit: 'V', formula, reference: '', status: 'info',
    message: vmp ? 'Vmp temperature coefficient from the module datasheet.' : 'No Vmp coefficient given: the Pmax coefficient is used in its place.',
  }
}

/**
 * Hot-day and cold-day string Vmp against an inverter's operating window: below the start voltage
 * the inverter does not start (fail); below the MPPT minimum or above the MPPT maximum it loses
 * energy (warn). A manufacturer's window, not a code limit.
 * @param vmpHotV  string Vmp at the hot-day cell temperature [V]
 * @param vmpColdV string Vmp at the design low temperature [V]
 */
export function checkMpptWindow(edition: NecEdition, key: string, vmpHotV: number, vmpColdV: number, input: MpptInput): Derived[] {
  const limit = (suffix: string, label: string, value: number, limitV: number, limitName: string, whenCrossed: 'fail' | 'warn', advice: string): LimitCheck => ({
    edition, key: `${key}.${suffix}`, label, value, unit: 'V', limit: limitV, limitName, section: null, whenCrossed, advice,
  })
  return [
    checkNotBelow(limit('startVoltage', 'Hot-day Vmp vs start voltage', vmpHotV, input.startVoltageV, 'inverter start voltage', 'fail', 'add modules in series so the inverter starts on hot days.')),
    checkNotBelow(limit('mpptMin', 'Hot-day Vmp vs MPPT minimum', vmpHotV, input.mpptMinV, 'MPPT minimum voltage', 'warn', 'energy is lost on hot days; consider a longer string.')),
    checkNotAbove(limit('mpptMax', 'Cold-day Vmp vs MPPT maximum', vmpColdV, input.mpptMaxV, 'MPPT maximum voltage', 'warn', 'the inverter limits power on cold days; consider a shorter string.')),
  ]
}

/**
 * Current into one MPPT input: the 690.8(A) maximum current (125 % of the parallel Isc) against the
 * inverter's maximum short-circuit current rating (110.3(B), fail), and the summed Imp against the
 * maximum usable input current (energy clipped, warn).
 * @param maxCurrentA 690.8(A) maximum current of the paralleled strings [A]
 * @param impSumA     sum of string Imp at STC [A]
 */
export function checkMpptCurrent(edition: NecEdition, key: string, maxCurrentA: number, impSumA: number, input: MpptInput): Derived[] {
  return [
    checkNotAbove({
      edition, key: `${key}.iscLimit`, label: 'Maximum circuit current vs inverter short-circuit rating', value: maxCurrentA, unit: 'A',
      limit: input.maxShortCircuitCurrentPerMpptA, limitName: 'inverter maximum short-circuit current per MPPT', section: '110.3(B)',
      whenCrossed: 'fail', advice: 'put fewer strings in parallel on this input.',
    }),
    checkNotAbove({
      edition, key: `${key}.inputCurrent`, label: 'Operating current vs inverter input current', value: impSumA, unit: 'A',
      limit: input.maxInputCurrentPerMpptA, limitName: 'inverter maximum input current per MPPT', section: null,
      whenCrossed: 'warn', advice: 'the inverter clips the excess current.',
    }),
  ]
}
