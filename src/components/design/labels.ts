import type { RunResult } from '@shared/electrical/evaluate'
import { sizeLabel } from '@shared/electrical/rules/sizes'
import type { CircuitKind, Status } from '@shared/electrical/types'
import { indexNodes, type DesignDocument, type Run, type SystemKind } from '@shared/schemas/design'

/** Trade names of circuit kinds as a plan reviewer reads them. */
export const CIRCUIT_KIND_LABELS: Record<CircuitKind, string> = {
  pv_source: 'PV source circuit',
  pv_output: 'PV output circuit',
  dc_dc_output: 'DC-to-DC converter output',
  inverter_output: 'Inverter output circuit',
  microinverter_branch: 'Microinverter branch',
  ac_combiner_output: 'AC combiner output',
  ess_dc: 'Battery (ESS) DC circuit',
  charge_controller_output: 'Charge controller output',
  dc_load: 'DC load feeder',
  transformer_primary: 'Transformer primary',
  transformer_secondary: 'Transformer secondary',
  service_feeder: 'AC feeder',
}

export const SYSTEM_KIND_LABELS: Record<SystemKind, string> = {
  grid_tied: 'Grid-tied',
  grid_tied_storage: 'Grid-tied with storage',
  off_grid: 'Off-grid (stand-alone)',
  ground_mount_farm: 'Ground-mount farm',
}

export const METHOD_LABELS: Record<Run['method'], string> = {
  EMT: 'EMT',
  PVC40: 'PVC Sch 40',
  PVC80: 'PVC Sch 80',
  RMC: 'RMC',
  FREE_AIR: 'Free air',
  CABLE: 'Cable',
}

/** Element Plus tag type for a result status. */
export const STATUS_TAG: Record<Status, 'success' | 'warning' | 'danger' | 'info'> = {
  pass: 'success',
  warn: 'warning',
  fail: 'danger',
  info: 'info',
}

export const STATUS_WORDS: Record<Status, string> = { pass: 'Pass', warn: 'Check', fail: 'Fail', info: 'Info' }

/** A place a conductor run can start or end, for the from/to choices. */
export interface Endpoint {
  id: string
  label: string
}

/** Every piece of equipment, string and branch a run can connect, labelled with what it is. */
export function runEndpoints(doc: DesignDocument): Endpoint[] {
  const { equipment: e, topology: t } = doc
  const named = (group: string, items: ReadonlyArray<{ id: string; name: string }>) =>
    items.map((item) => ({ id: item.id, label: `${item.id} · ${group}: ${item.name}` }))
  return [
    ...t.strings.map((s) => ({ id: s.id, label: `${s.id} · string of ${s.modulesInSeries} on ${s.arrayId}` })),
    ...t.microBranches.map((b) => ({ id: b.id, label: `${b.id} · microinverter branch of ${b.units}` })),
    ...named('inverter', e.inverters),
    ...named('combiner', e.combiners),
    ...named('disconnect', e.disconnects),
    ...named('charge controller', e.chargeControllers),
    ...named('battery', e.batteries),
    ...named('transformer', e.transformers),
    ...named('panel', e.panels),
    ...named('DC load', e.dcLoads),
    ...named('point of interconnection', e.pointsOfInterconnection),
  ]
}

/** The first `prefix<n>` id not yet used in the document. */
export function freeId(doc: DesignDocument, prefix: string): string {
  const used = indexNodes(doc)
  for (let n = 1; ; n++) if (!used.has(`${prefix}${n}`)) return `${prefix}${n}`
}

/** The conductor a run got: `2 × 3/0 AWG Cu` for parallel sets, `—` when none was chosen. */
export function conductorLabel(run: Pick<RunResult, 'size' | 'parallelSets' | 'material'>): string {
  if (!run.size) return '—'
  return `${run.parallelSets > 1 ? `${run.parallelSets} × ` : ''}${sizeLabel(run.size)} ${run.material}`
}
