import type { StringingLayout } from '@shared/electrical/rules/stringing'
import type { DesignDocument, PvString, Run } from '@shared/schemas/design'
import { freeId } from './labels'

/**
 * Replaces the strings of one array with a picked layout on one inverter, spread over its MPPT
 * inputs in turn. Runs of the replaced strings are rebuilt for the new ones from the first
 * replaced run, so lengths, raceway and method the designer set are kept.
 */
export function applyStringingLayout(doc: DesignDocument, arrayId: string, inverterId: string, layout: StringingLayout): void {
  const inverter = doc.equipment.inverters.find((inv) => inv.id === inverterId)
  const mppts = inverter?.pvInput?.mpptCount ?? 1
  const replaced = doc.topology.strings.filter((s) => s.arrayId === arrayId)
  const replacedIds = new Set(replaced.map((s) => s.id))
  const template = replaced[0]
  const runTemplate = doc.topology.runs.find((run) => replacedIds.has(run.from))

  doc.topology.strings = doc.topology.strings.filter((s) => !replacedIds.has(s.id))
  doc.topology.runs = doc.topology.runs.filter((run) => !replacedIds.has(run.from) && !replacedIds.has(run.to))

  for (let n = 0; n < layout.strings; n++) {
    const string: PvString = {
      id: freeId(doc, `${arrayId}-S`),
      arrayId,
      modulesInSeries: layout.modulesPerString,
      inverterId,
      mppt: (n % mppts) + 1,
      chargeControllerId: null,
      combinerId: template?.combinerId ?? null,
      optimizerId: template?.optimizerId ?? null,
    }
    doc.topology.strings.push(string)
    if (runTemplate) {
      const run: Run = { ...runTemplate, id: freeId(doc, 'R'), from: string.id, to: string.combinerId ?? inverterId }
      doc.topology.runs.push(run)
    }
  }
}
