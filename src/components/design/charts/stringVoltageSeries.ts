import { maxStringVoltage, STC_CELL_TEMPERATURE_C } from '@shared/electrical/rules/max-voltage'
import { stringVmpAtCellTemperature } from '@shared/electrical/rules/mppt'
import type { DesignDocument, Inverter, PvModule } from '@shared/schemas/design'

export interface StringCurve {
  /** e.g. "12 × MOD400" */
  name: string
  /** [temperature °C, volts] pairs; Voc over the cold side, where it sets the maximum. */
  voc: [number, number][]
  vmp: [number, number][]
  coldVocV: number
  hotVmpV: number
}

export interface StringVoltagePlot {
  inverter: Inverter
  curves: StringCurve[]
  designLowC: number
  hotCellC: number
}

/** Whole degrees from `from` to `to`, both included. */
const span = (from: number, to: number) => Array.from({ length: Math.floor(to) - Math.ceil(from) + 1 }, (_, i) => Math.ceil(from) + i)

/**
 * Points of string Voc and Vmp against temperature for every distinct string on each PV inverter,
 * from the engine's own rules (690.7(A) for Voc, the Vmp model of the hot-day check).
 */
export function stringVoltagePlots(doc: DesignDocument): StringVoltagePlot[] {
  const { codeBasis, equipment, topology } = doc
  const hotCellC = codeBasis.designHighC + codeBasis.cellTemperatureRiseC
  const moduleOfArray = new Map(topology.arrays.map((a) => [a.id, equipment.modules.find((m) => m.id === a.moduleId)]))
  return equipment.inverters
    .filter((inv) => inv.pvInput !== null && inv.kind !== 'microinverter')
    .map((inverter) => {
      const seen = new Map<string, { module: PvModule; n: number }>()
      for (const s of topology.strings) {
        const module = moduleOfArray.get(s.arrayId)
        if (s.inverterId === inverter.id && module) seen.set(`${s.modulesInSeries} × ${module.id}`, { module, n: s.modulesInSeries })
      }
      const curves = [...seen].flatMap(([name, { module, n }]) => {
        const voc = span(codeBasis.designLowC - 5, STC_CELL_TEMPERATURE_C).map((t): [number, number] | null => {
          const v = maxStringVoltage(codeBasis.necEdition, 'plot', module, n, t)
          return v.ok ? [t, v.value.value] : null
        })
        const cold = maxStringVoltage(codeBasis.necEdition, 'plot', module, n, codeBasis.designLowC)
        if (!cold.ok || voc.includes(null)) return []
        const vmp = span(codeBasis.designLowC - 5, hotCellC + 5).map((t): [number, number] => [t, stringVmpAtCellTemperature('plot', '', module, n, t).value])
        const hotVmpV = stringVmpAtCellTemperature('plot', '', module, n, hotCellC).value
        return [{ name, voc: voc as [number, number][], vmp, coldVocV: cold.value.value, hotVmpV }]
      })
      return { inverter, curves, designLowC: codeBasis.designLowC, hotCellC }
    })
    .filter((plot) => plot.curves.length > 0)
}
