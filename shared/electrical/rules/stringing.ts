import { fmt } from '../format'
import type { EngineIssue, NecEdition, Outcome } from '../types'
import { PV_ISC_MULTIPLIER } from './currents'
import { DWELLING_DC_LIMIT_V, maxStringVoltage, type ModuleVocData } from './max-voltage'
import { stringVmpAtCellTemperature, type ModuleVmpData, type MpptInput } from './mppt'

export interface StringingModule extends ModuleVocData, ModuleVmpData {
  iscA: number
  impA: number
  maxSystemVoltageV: number
}

/** An inverter as the design document holds it: its PV input and rated AC power. */
export interface StringingInverter {
  pvInput: MpptInput & { maxDcVoltageV: number; mpptCount: number }
  ratedPowerW: number
}

export interface StringingRequest {
  edition: NecEdition
  module: StringingModule
  inverter: StringingInverter
  /** Modules to place, all of them [-]. */
  moduleCount: number
  /** Design low and high ambient temperatures and hot-day cell rise [°C]. */
  designLowC: number
  designHighC: number
  cellTemperatureRiseC: number
  /** One- and two-family dwelling: the 600 V limit of 690.7 applies. */
  dwelling: boolean
  /** DC/AC ratio the ranking prefers [-]. */
  targetDcAcRatio?: number
  /** Layouts outside this DC/AC band are left out [-]. */
  minDcAcRatio?: number
  maxDcAcRatio?: number
}

export interface StringingLayout {
  modulesPerString: number
  strings: number
  /** Identical inverters sharing the strings equally [-]. */
  inverters: number
  /** Most strings on any one MPPT input [-]. */
  stringsPerMppt: number
  /** MPPT inputs in use on each inverter [-]. */
  mpptsUsed: number
  dcAcRatio: number
  /** Cold-day maximum string voltage and the limit it is held to [V]. */
  vocMaxV: number
  voltageLimitV: number
  /** Hot-day string Vmp and the lower edge of the window (max of MPPT minimum and start) [V]. */
  vmpHotV: number
  windowMinV: number
  /** Smaller of the two voltage margins [V]. */
  windowMarginV: number
  /** Summed Imp exceeds the MPPT input current: the inverter clips. */
  clips: boolean
  /** One line saying why this layout is where it is. */
  note: string
}

// common practice, no source: DC/AC ratios of about 1.1–1.3 are usual; 1.25 is the default target
const DEFAULT_TARGET_RATIO = 1.25
const DEFAULT_MIN_RATIO = 0.8
const DEFAULT_MAX_RATIO = 1.6

/**
 * Every valid way to string N modules into identical inverters: modules per string, strings, and
 * inverters sharing them equally, such that the cold Voc stays within every voltage limit
 * (690.7(A), 110.3(B), 600 V for dwellings), the hot-day Vmp stays at or above the MPPT minimum and
 * start voltage, and 125 % of the paralleled Isc stays within the input's short-circuit rating.
 * Ranked by closeness to the target DC/AC ratio, then by the wider voltage margin.
 * Source: NFPA 70 690.7(A), 690.8(A)(1), 110.3(B) (2017, 2020, 2023); ranking is common practice, no source.
 */
export function stringingLayouts(req: StringingRequest): Outcome<StringingLayout[]> {
  const target = req.targetDcAcRatio ?? DEFAULT_TARGET_RATIO
  const minRatio = req.minDcAcRatio ?? DEFAULT_MIN_RATIO
  const maxRatio = req.maxDcAcRatio ?? DEFAULT_MAX_RATIO
  const issues: EngineIssue[] = []
  if (!Number.isInteger(req.moduleCount) || req.moduleCount < 1) issues.push({ field: 'moduleCount', message: 'must be a whole number of at least 1', severity: 'error' })
  if (!(minRatio > 0 && minRatio <= target && target <= maxRatio)) issues.push({ field: 'targetDcAcRatio', message: 'need 0 < minDcAcRatio ≤ targetDcAcRatio ≤ maxDcAcRatio', severity: 'error' })
  if (issues.length > 0) return { ok: false, issues }

  const { module } = req
  const inverter = { ...req.inverter.pvInput, ratedPowerW: req.inverter.ratedPowerW }
  const voltageLimitV = Math.min(inverter.maxDcVoltageV, module.maxSystemVoltageV, req.dwelling ? DWELLING_DC_LIMIT_V : Infinity)
  const windowMinV = Math.max(inverter.mpptMinV, inverter.startVoltageV)
  const cellHotC = req.designHighC + req.cellTemperatureRiseC
  const layouts: StringingLayout[] = []

  for (let perString = 1; perString <= req.moduleCount; perString++) {
    if (req.moduleCount % perString !== 0) continue
    const voc = maxStringVoltage(req.edition, 'stringing.vocMax', module, perString, req.designLowC)
    if (!voc.ok) return voc
    const vocMaxV = voc.value.value
    if (vocMaxV > voltageLimitV) break // longer strings only get worse
    const vmpHotV = stringVmpAtCellTemperature('stringing.vmpHot', '', module, perString, cellHotC).value
    if (vmpHotV < windowMinV) continue
    const strings = req.moduleCount / perString
    for (let inverters = 1; inverters <= strings; inverters++) {
      if (strings % inverters !== 0) continue
      const dcAcRatio = (req.moduleCount * module.pmaxW) / (inverters * inverter.ratedPowerW)
      if (dcAcRatio > maxRatio) continue
      if (dcAcRatio < minRatio) break // more inverters only lower the ratio
      const perInverter = strings / inverters
      const stringsPerMppt = Math.ceil(perInverter / inverter.mpptCount)
      if (stringsPerMppt * PV_ISC_MULTIPLIER * module.iscA > inverter.maxShortCircuitCurrentPerMpptA) continue
      const windowMarginV = Math.min(voltageLimitV - vocMaxV, vmpHotV - windowMinV)
      const clips = stringsPerMppt * module.impA > inverter.maxInputCurrentPerMpptA
      layouts.push({
        modulesPerString: perString, strings, inverters, stringsPerMppt, mpptsUsed: Math.min(perInverter, inverter.mpptCount),
        dcAcRatio, vocMaxV, voltageLimitV, vmpHotV, windowMinV, windowMarginV, clips,
        note: `${strings} × ${perString} on ${inverters} inverter(s): DC/AC ${fmt(dcAcRatio)}, ${fmt(vocMaxV, 1)} V of ${fmt(voltageLimitV)} V, hot Vmp ${fmt(vmpHotV, 1)} V${clips ? ', clips' : ''}`,
      })
    }
  }
  layouts.sort((a, b) => Math.abs(a.dcAcRatio - target) - Math.abs(b.dcAcRatio - target) || b.windowMarginV - a.windowMarginV)
  return { ok: true, value: layouts }
}
