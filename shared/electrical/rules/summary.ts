import { fmt } from '../format'
import type { Derived } from '../types'

/** Counts and ratings the system summary is built from. */
export interface SummaryInput {
  /** One entry per module type: STC power [W] and how many are installed. */
  modules: ReadonlyArray<{ pmaxW: number; count: number }>
  /** One entry per inverter model: rated AC power [W] and how many are installed. */
  inverters: ReadonlyArray<{ ratedPowerW: number; count: number }>
  strings: number
  microBranches: number
  /** Usable storage [kWh], 0 when none. */
  storageKwh: number
}

const info = (key: string, label: string, value: number, unit: string, formula: string, message: string): Derived => ({
  key, label, value, unit, formula, reference: '', status: 'info', message,
})

const sumFormula = (terms: string[]) => (terms.length === 0 ? '0' : terms.join(' + '))

/**
 * System summary for the cover sheet: DC size at STC, AC size, DC/AC ratio and counts.
 * Source: definitions only (STC per IEC 60904-3); no code section.
 */
export function systemSummary(key: string, s: SummaryInput): Derived[] {
  const dcKw = s.modules.reduce((t, m) => t + (m.pmaxW * m.count) / 1000, 0)
  const acKw = s.inverters.reduce((t, i) => t + (i.ratedPowerW * i.count) / 1000, 0)
  const moduleCount = s.modules.reduce((t, m) => t + m.count, 0)
  const inverterCount = s.inverters.reduce((t, i) => t + i.count, 0)
  const out = [
    info(`${key}.dcKw`, 'DC system size (STC)', dcKw, 'kW', sumFormula(s.modules.map((m) => `${m.count} × ${fmt(m.pmaxW)} W`)), 'Sum of module nameplate power at STC.'),
    info(`${key}.acKw`, 'AC system size', acKw, 'kW', sumFormula(s.inverters.map((i) => `${i.count} × ${fmt(i.ratedPowerW)} W`)), 'Sum of inverter rated AC power.'),
    info(`${key}.modules`, 'Modules', moduleCount, '-', `${moduleCount}`, 'Modules installed.'),
    info(`${key}.inverters`, 'Inverters', inverterCount, '-', `${inverterCount}`, 'Inverters installed (microinverters counted by unit).'),
    info(`${key}.strings`, 'Strings', s.strings, '-', `${s.strings}`, 'Series strings.'),
    info(`${key}.microBranches`, 'Microinverter branches', s.microBranches, '-', `${s.microBranches}`, 'AC branch circuits of microinverters.'),
    info(`${key}.storageKwh`, 'Energy storage', s.storageKwh, 'kWh', `${fmt(s.storageKwh)} kWh`, 'Sum of battery capacity.'),
  ]
  if (acKw > 0) {
    out.splice(2, 0, info(`${key}.dcAcRatio`, 'DC/AC ratio', dcKw / acKw, '-', `${fmt(dcKw, 3)} kW / ${fmt(acKw, 3)} kW`, 'Array STC power over inverter AC power.'))
  }
  return out
}
