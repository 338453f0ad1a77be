/**
 * The design document: one JSON document that describes a PV system completely enough to compute
 * and draw it. Equipment is copied by value from a library so that a stored design never changes
 * when the library does. Field-by-field documentation with units: docs/design-document.md.
 */
import { z } from 'zod'
import {
  CIRCUIT_KINDS,
  CONDUCTOR_SIZES,
  INSULATIONS,
  NEC_EDITIONS,
  WIRING_METHODS,
  type CircuitKind,
  type EngineIssue,
  type Outcome,
} from '../electrical/types'

export const DESIGN_SCHEMA_VERSION = 1

const id = z
  .string()
  .regex(/^[A-Za-z0-9][A-Za-z0-9_.-]{0,39}$/, 'must be 1–40 letters, digits, "_", "." or "-", starting with a letter or digit')
  .describe('Identifier unique within the document, referenced by the topology')
const name = z.string().trim().min(1, 'must not be empty').max(120)
const positive = z.number().positive()
const nonNegative = z.number().nonnegative()
const count = z.number().int().positive()
const phases = z.literal([1, 3])

// ---------------------------------------------------------------------------------------------
// Project and code basis

export const occupancySchema = z.enum(['one_two_family_dwelling', 'other'])

export const projectSchema = z.object({
  name,
  /** Short code used in file names of the submission package. */
  code: z.string().regex(/^[A-Za-z0-9-]{1,24}$/, 'must be 1–24 letters, digits or "-"'),
  owner: name,
  installer: name,
  siteAddress: name,
  city: name,
  jurisdiction: name,
  utility: name,
  occupancy: occupancySchema,
  latitude: z.number().min(-90).max(90).nullable().default(null),
  longitude: z.number().min(-180).max(180).nullable().default(null),
})

export const voltageDropLimitsSchema = z.object({
  // common practice, no source: 2 % on PV DC circuits
  pvDcPercent: z.number().positive().max(10).default(2),
  // 210.19(A) and 215.2(A) informational notes: 3 % for any branch circuit or feeder
  anyCircuitPercent: z.number().positive().max(10).default(3),
  // same informational notes: 5 % total feeder plus branch circuit
  totalPercent: z.number().positive().max(15).default(5),
})

export const codeBasisSchema = z.object({
  necEdition: z.literal(NEC_EDITIONS),
  /** Extreme annual mean minimum design dry bulb [°C]. */
  designLowC: z.number().min(-60).max(40),
  /** 2 % annual design dry bulb [°C]. */
  designHighC: z.number().min(-20).max(60),
  /** Cell temperature rise over ambient for the hot-day Vmp check [°C]. */
  cellTemperatureRiseC: z.number().min(0).max(60).default(25),
  voltageDropLimits: voltageDropLimitsSchema.prefault({}),
  /** Why edition or design temperatures depart from the jurisdiction profile, for the reviewer. */
  overrideReason: z.string().trim().max(500).nullable().default(null),
})

// ---------------------------------------------------------------------------------------------
// Equipment

export const vocCoefficientSchema = z.object({ value: z.number().negative(), unit: z.enum(['%/°C', 'V/°C']) })
export const vmpCoefficientSchema = z.object({ value: z.number().negative(), unit: z.enum(['%/°C', 'V/°C']) })
export const pmaxCoefficientSchema = z.object({ value: z.number().negative(), unit: z.enum(['%/°C', 'W/°C']) })
export const iscCoefficientSchema = z.object({ value: z.number().nonnegative(), unit: z.enum(['%/°C', 'A/°C']) })

export const moduleSchema = z.object({
  id,
  name,
  pmaxW: positive.max(2000),
  vocV: positive.max(1500),
  vmpV: positive.max(1500),
  iscA: positive.max(100),
  impA: positive.max(100),
  /** null: no coefficient given; Table 690.7(A) applies (crystalline silicon only). */
  vocCoefficient: vocCoefficientSchema.nullable(),
  /** null: the Pmax coefficient stands in for it in the hot-day check. */
  vmpCoefficient: vmpCoefficientSchema.nullable().default(null),
  pmaxCoefficient: pmaxCoefficientSchema,
  iscCoefficient: iscCoefficientSchema,
  cells: count.max(500),
  technology: z.enum(['crystalline', 'thin_film']).default('crystalline'),
  maxSeriesFuseA: positive.max(100),
  maxSystemVoltageV: positive.max(1500),
})

export const inverterKindSchema = z.enum(['string', 'hybrid', 'microinverter', 'central', 'stand_alone'])

/** The PV (DC) input of an inverter: voltage window and per-MPPT current limits. */
export const pvInputSchema = z.object({
  maxDcVoltageV: positive.max(1500),
  mpptMinV: positive,
  mpptMaxV: positive,
  startVoltageV: positive,
  mpptCount: count.max(24),
  maxInputCurrentPerMpptA: positive,
  maxShortCircuitCurrentPerMpptA: positive,
})

/** A field of an equipment record that cannot be, with the reason. */
export interface SpecProblem<F extends string> {
  field: F
  message: string
}

type PvInputSpec = z.infer<typeof pvInputSchema>

/** An inverter PV input whose voltage window cannot exist. Shared by designs and the equipment library. */
export function impossiblePvInput(pv: PvInputSpec): SpecProblem<keyof PvInputSpec>[] {
  const problems: SpecProblem<keyof PvInputSpec>[] = []
  if (pv.mpptMinV >= pv.mpptMaxV) problems.push({ field: 'mpptMinV', message: `MPPT minimum ${pv.mpptMinV} V must be below the MPPT maximum ${pv.mpptMaxV} V` })
  if (pv.mpptMaxV > pv.maxDcVoltageV) problems.push({ field: 'mpptMaxV', message: `MPPT maximum ${pv.mpptMaxV} V exceeds the maximum DC voltage ${pv.maxDcVoltageV} V` })
  if (pv.startVoltageV > pv.maxDcVoltageV) problems.push({ field: 'startVoltageV', message: `start voltage ${pv.startVoltageV} V exceeds the maximum DC voltage ${pv.maxDcVoltageV} V` })
  return problems
}

/** Module data whose maximum-power point lies outside the I–V curve. Shared by designs and the library. */
export function impossibleModuleCurve(m: { vmpV: number; vocV: number; impA: number; iscA: number }): SpecProblem<'vmpV' | 'impA'>[] {
  const problems: SpecProblem<'vmpV' | 'impA'>[] = []
  if (m.vmpV >= m.vocV) problems.push({ field: 'vmpV', message: `Vmp ${m.vmpV} V must be below Voc ${m.vocV} V` })
  if (m.impA >= m.iscA) problems.push({ field: 'impA', message: `Imp ${m.impA} A must be below Isc ${m.iscA} A` })
  return problems
}

export const inverterSchema = z.object({
  id,
  name,
  kind: inverterKindSchema,
  /** null for a stand-alone (battery-fed) inverter with no PV input. */
  pvInput: pvInputSchema.nullable(),
  acVoltageV: positive.max(1000),
  phases,
  maxContinuousOutputA: positive,
  ratedPowerW: positive,
  /** Backup (protected loads) output of a hybrid or stand-alone inverter [A]; null when none. */
  backupOutputA: positive.nullable().default(null),
  /** Microinverters only: modules per unit and units allowed on one branch. */
  modulesPerUnit: count.max(4).nullable().default(null),
  maxUnitsPerBranch: count.max(40).nullable().default(null),
})

export const optimizerSchema = z.object({
  id,
  name,
  maxOutputVoltageV: positive,
  maxOutputCurrentA: positive,
  maxInputVoltageV: positive,
})

export const chargeControllerSchema = z.object({
  id,
  name,
  maxPvVocV: positive,
  maxPvCurrentA: positive,
  batteryVoltageV: positive,
  maxOutputCurrentA: positive,
})

export const batterySchema = z.object({
  id,
  name,
  nominalVoltageV: positive,
  maxContinuousDischargeA: positive,
  maxContinuousChargeA: positive,
  capacityKwh: positive,
  /** The battery's own disconnecting means, if its listing includes one. */
  integralDisconnect: z.boolean().default(false),
})

export const combinerSchema = z.object({
  id,
  name,
  /** 'dc' combines PV strings; 'ac' is an AC combiner panel for inverter outputs. */
  current: z.enum(['dc', 'ac']),
  maxVoltageV: positive,
  ratingA: positive,
  inputs: count.max(64),
})

export const disconnectSchema = z.object({
  id,
  name,
  current: z.enum(['dc', 'ac']),
  ratingA: positive,
  voltageRatingV: positive,
  /** Fuse rating when fused [A]; null for a non-fused switch. */
  fuseA: positive.nullable().default(null),
})

export const transformerSchema = z.object({
  id,
  name,
  kva: positive,
  primaryVoltageV: positive,
  secondaryVoltageV: positive,
  phases,
  impedancePercent: positive.max(20).default(5.75),
})

export const panelSchema = z.object({
  id,
  name,
  role: z.enum(['service', 'subpanel', 'backup_loads', 'ac_loads']),
  busbarA: positive,
  /** null: main-lug panel with no main breaker. */
  mainBreakerA: positive.nullable(),
  voltageV: positive,
  phases,
  feed: z.enum(['end', 'centre']),
})

export const dcLoadSchema = z.object({ id, name, voltageV: positive, currentA: positive })

export const pointOfInterconnectionSchema = z.object({ id, name, voltageV: positive, phases })

export const equipmentSchema = z.object({
  modules: z.array(moduleSchema).min(1, 'a design needs at least one module type'),
  inverters: z.array(inverterSchema).default([]),
  optimizers: z.array(optimizerSchema).default([]),
  chargeControllers: z.array(chargeControllerSchema).default([]),
  batteries: z.array(batterySchema).default([]),
  combiners: z.array(combinerSchema).default([]),
  disconnects: z.array(disconnectSchema).default([]),
  transformers: z.array(transformerSchema).default([]),
  panels: z.array(panelSchema).default([]),
  dcLoads: z.array(dcLoadSchema).default([]),
  pointsOfInterconnection: z.array(pointOfInterconnectionSchema).default([]),
})

// ---------------------------------------------------------------------------------------------
// Interconnection (705.11 / 705.12)

const loadSideBase = {
  panelId: id,
  /** Where the backfed breaker sits: at the busbar end opposite the main, at an end, or elsewhere. */
  breakerPosition: z.enum(['end_opposite_main', 'busbar_end', 'not_at_end']),
  /** Sum of every breaker on the busbar except the main, for the sum rule; null to skip it [A]. */
  sumOfBreakersA: positive.nullable().default(null),
}

export const interconnectionSchema = z.discriminatedUnion('method', [
  z.object({ method: z.literal('load_side_breaker'), ...loadSideBase }),
  z.object({
    method: z.literal('main_breaker_derate'),
    ...loadSideBase,
    /** Main breaker after the derate [A]. */
    deratedMainBreakerA: positive,
  }),
  z.object({
    method: z.literal('supply_side'),
    /** Service panel or point of interconnection the supply-side tap is made at. */
    pointId: id,
    /** Ampacity of the service conductors / rating of the service [A]. */
    serviceRatingA: positive,
  }),
])

// ---------------------------------------------------------------------------------------------
// Topology

export const arraySchema = z.object({
  id,
  name,
  mount: z.enum(['roof', 'ground']),
  moduleId: id,
  moduleCount: count,
  tiltDeg: z.number().min(0).max(90),
  /** Compass azimuth the modules face, 180 = south [°]. */
  azimuthDeg: z.number().min(0).lt(360),
})

export const stringSchema = z.object({
  id,
  arrayId: id,
  modulesInSeries: count.max(100),
  inverterId: id.nullable().default(null),
  /** MPPT input of the inverter, 1-based. */
  mppt: count.nullable().default(null),
  chargeControllerId: id.nullable().default(null),
  combinerId: id.nullable().default(null),
  optimizerId: id.nullable().default(null),
})

export const microBranchSchema = z.object({
  id,
  arrayId: id,
  inverterId: id,
  units: count,
})

export const runSchema = z.object({
  id,
  from: id,
  to: id,
  kind: z.enum(CIRCUIT_KINDS),
  material: z.enum(['Cu', 'Al']),
  insulation: z.enum(INSULATIONS),
  method: z.enum(WIRING_METHODS),
  /** Runs with the same raceway id share one conduit for the fill calculation. */
  racewayId: id.nullable().default(null),
  lengthFt: positive.max(10000),
  /** Height of the raceway or cable above the roof [in]; null when not on a rooftop. */
  rooftopHeightIn: nonNegative.max(120).nullable(),
  currentCarryingConductors: count.max(60),
  /** Circuit conductors of this run, not counting the EGC; null: 2 for DC, 3 single-phase AC, 4 three-phase AC. */
  circuitConductors: count.max(8).nullable().default(null),
  terminalRatingC: z.literal([60, 75, 90]),
  minimumSize: z.enum(CONDUCTOR_SIZES).nullable().default(null),
})

export const topologySchema = z.object({
  arrays: z.array(arraySchema).min(1, 'a design needs at least one array'),
  strings: z.array(stringSchema).default([]),
  microBranches: z.array(microBranchSchema).default([]),
  runs: z.array(runSchema).default([]),
})

export const systemKindSchema = z.enum(['grid_tied', 'grid_tied_storage', 'off_grid', 'ground_mount_farm'])

const designDocumentObject = z.object({
  schemaVersion: z.literal(DESIGN_SCHEMA_VERSION),
  systemKind: systemKindSchema,
  project: projectSchema,
  codeBasis: codeBasisSchema,
  equipment: equipmentSchema,
  interconnection: interconnectionSchema.nullable(),
  topology: topologySchema,
})

export type DesignDocument = z.infer<typeof designDocumentObject>
export type DesignDocumentInput = z.input<typeof designDocumentObject>
export type PvModule = DesignDocument['equipment']['modules'][number]
export type Inverter = DesignDocument['equipment']['inverters'][number]
export type PvInput = NonNullable<Inverter['pvInput']>
export type Optimizer = DesignDocument['equipment']['optimizers'][number]
export type ChargeController = DesignDocument['equipment']['chargeControllers'][number]
export type Battery = DesignDocument['equipment']['batteries'][number]
export type Combiner = DesignDocument['equipment']['combiners'][number]
export type Disconnect = DesignDocument['equipment']['disconnects'][number]
export type Transformer = DesignDocument['equipment']['transformers'][number]
export type Panel = DesignDocument['equipment']['panels'][number]
export type DcLoad = DesignDocument['equipment']['dcLoads'][number]
export type PointOfInterconnection = DesignDocument['equipment']['pointsOfInterconnection'][number]
export type Interconnection = NonNullable<DesignDocument['interconnection']>
export type PvArray = DesignDocument['topology']['arrays'][number]
export type PvString = DesignDocument['topology']['strings'][number]
export type MicroBranch = DesignDocument['topology']['microBranches'][number]
export type Run = DesignDocument['topology']['runs'][number]
export type CodeBasis = DesignDocument['codeBasis']
export type SystemKind = DesignDocument['systemKind']

// ---------------------------------------------------------------------------------------------
// Cross-reference checks

/** What a node id names; run endpoints may be any of these. */
export type NodeKind =
  | 'module' | 'inverter' | 'optimizer' | 'chargeController' | 'battery' | 'combiner' | 'disconnect'
  | 'transformer' | 'panel' | 'dcLoad' | 'pointOfInterconnection' | 'array' | 'string' | 'microBranch' | 'run'

export interface NodeEntry {
  kind: NodeKind
  /** JSON path of the element, e.g. `equipment.inverters[0]`. */
  path: string
  index: number
}

const COLLECTIONS: ReadonlyArray<[NodeKind, (d: DesignDocument) => ReadonlyArray<{ id: string }>, string]> = [
  ['module', (d) => d.equipment.modules, 'equipment.modules'],
  ['inverter', (d) => d.equipment.inverters, 'equipment.inverters'],
  ['optimizer', (d) => d.equipment.optimizers, 'equipment.optimizers'],
  ['chargeController', (d) => d.equipment.chargeControllers, 'equipment.chargeControllers'],
  ['battery', (d) => d.equipment.batteries, 'equipment.batteries'],
  ['combiner', (d) => d.equipment.combiners, 'equipment.combiners'],
  ['disconnect', (d) => d.equipment.disconnects, 'equipment.disconnects'],
  ['transformer', (d) => d.equipment.transformers, 'equipment.transformers'],
  ['panel', (d) => d.equipment.panels, 'equipment.panels'],
  ['dcLoad', (d) => d.equipment.dcLoads, 'equipment.dcLoads'],
  ['pointOfInterconnection', (d) => d.equipment.pointsOfInterconnection, 'equipment.pointsOfInterconnection'],
  ['array', (d) => d.topology.arrays, 'topology.arrays'],
  ['string', (d) => d.topology.strings, 'topology.strings'],
  ['microBranch', (d) => d.topology.microBranches, 'topology.microBranches'],
  ['run', (d) => d.topology.runs, 'topology.runs'],
]

/**
 * Every id of the document with what it names; ids are unique across the whole document.
 * `onDuplicate` hears of each id met a second time (the first one is kept).
 */
export function indexNodes(
  doc: DesignDocument,
  onDuplicate: (path: (string | number)[], first: NodeEntry, id: string) => void = () => {},
): Map<string, NodeEntry> {
  const nodes = new Map<string, NodeEntry>()
  for (const [kind, items, path] of COLLECTIONS) {
    items(doc).forEach((item, index) => {
      const seen = nodes.get(item.id)
      if (seen) onDuplicate([...path.split('.'), index, 'id'], seen, item.id)
      else nodes.set(item.id, { kind, path: `${path}[${index}]`, index })
    })
  }
  return nodes
}

/** Node kinds a run of each circuit kind must start (`from`) and end (`to`) at; null: any equipment. */
const RUN_ENDPOINTS: Record<CircuitKind, { from: NodeKind[] | null; to: NodeKind[] | null }> = {
  pv_source: { from: ['string'], to: ['inverter', 'combiner', 'chargeController', 'disconnect'] },
  pv_output: { from: ['combiner', 'disconnect'], to: ['inverter', 'chargeController', 'disconnect', 'combiner'] },
  dc_dc_output: { from: ['string'], to: ['inverter', 'combiner', 'disconnect'] },
  inverter_output: { from: ['inverter', 'disconnect'], to: null },
  microinverter_branch: { from: ['microBranch'], to: ['combiner', 'panel', 'disconnect'] },
  ac_combiner_output: { from: ['combiner', 'disconnect'], to: null },
  ess_dc: { from: ['battery', 'disconnect'], to: ['inverter', 'chargeController', 'disconnect', 'dcLoad', 'combiner'] },
  charge_controller_output: { from: ['chargeController'], to: ['battery', 'disconnect'] },
  dc_load: { from: ['battery', 'chargeController', 'disconnect'], to: ['dcLoad'] },
  transformer_primary: { from: null, to: ['transformer'] },
  transformer_secondary: { from: ['transformer'], to: null },
  service_feeder: { from: null, to: null },
}

/** Node kinds that are not equipment and may never be a run endpoint except where listed. */
const NOT_ENDPOINTS: NodeKind[] = ['module', 'optimizer', 'array', 'run']

type IssueSink = (path: (string | number)[], message: string) => void

function checkCrossReferences(doc: DesignDocument, report: IssueSink): void {
  const nodes = indexNodes(doc, (path, first, dup) => report(path, `id "${dup}" is already used by ${first.path}`))
  const find = (ref: string, kind: NodeKind) => {
    const node = nodes.get(ref)
    return node?.kind === kind ? node : undefined
  }
  const { equipment, topology } = doc

  topology.arrays.forEach((array, i) => {
    if (!find(array.moduleId, 'module')) report(['topology', 'arrays', i, 'moduleId'], `unknown module "${array.moduleId}"`)
  })

  const modulesPlaced = new Map<string, number>()
  const place = (arrayId: string, n: number) => modulesPlaced.set(arrayId, (modulesPlaced.get(arrayId) ?? 0) + n)

  topology.strings.forEach((s, i) => {
    const at = (field: string) => ['topology', 'strings', i, field]
    if (!find(s.arrayId, 'array')) report(at('arrayId'), `unknown array "${s.arrayId}"`)
    place(s.arrayId, s.modulesInSeries)
    const targets = [s.inverterId, s.chargeControllerId].filter((t) => t !== null)
    if (targets.length !== 1) report(at('inverterId'), 'a string must name exactly one of inverterId or chargeControllerId')
    if (s.inverterId !== null) {
      const node = find(s.inverterId, 'inverter')
      const inverter = node ? equipment.inverters[node.index] : undefined
      if (!inverter) report(at('inverterId'), `unknown inverter "${s.inverterId}"`)
      else if (inverter.kind === 'microinverter') report(at('inverterId'), `"${s.inverterId}" is a microinverter; use a microinverter branch`)
      else if (inverter.pvInput === null) report(at('inverterId'), `"${s.inverterId}" has no PV input`)
      else if (s.mppt === null) report(at('mppt'), `required: which MPPT input of "${s.inverterId}" the string lands on`)
      else if (s.mppt > inverter.pvInput.mpptCount) report(at('mppt'), `MPPT ${s.mppt} is beyond the ${inverter.pvInput.mpptCount} MPPT input(s) of "${s.inverterId}"`)
    } else if (s.mppt !== null) report(at('mppt'), 'an MPPT index needs an inverterId')
    if (s.chargeControllerId !== null && !find(s.chargeControllerId, 'chargeController')) {
      report(at('chargeControllerId'), `unknown charge controller "${s.chargeControllerId}"`)
    }
    if (s.combinerId !== null) {
      const node = find(s.combinerId, 'combiner')
      if (!node) report(at('combinerId'), `unknown combiner "${s.combinerId}"`)
      else if (equipment.combiners[node.index]?.current !== 'dc') report(at('combinerId'), `"${s.combinerId}" is an AC combiner; strings need a DC combiner`)
    }
    if (s.optimizerId !== null && !find(s.optimizerId, 'optimizer')) report(at('optimizerId'), `unknown optimizer "${s.optimizerId}"`)
  })

  // All strings of one combiner must land on the same inverter input or charge controller.
  const combinerTarget = new Map<string, string>()
  topology.strings.forEach((s, i) => {
    if (s.combinerId === null) return
    const target = s.inverterId !== null ? `${s.inverterId} MPPT ${s.mppt}` : `${s.chargeControllerId}`
    const first = combinerTarget.get(s.combinerId)
    if (first === undefined) combinerTarget.set(s.combinerId, target)
    else if (first !== target) report(['topology', 'strings', i, 'combinerId'], `strings of combiner "${s.combinerId}" must share one input; this one goes to ${target}, another to ${first}`)
  })

  topology.microBranches.forEach((b, i) => {
    if (!find(b.arrayId, 'array')) report(['topology', 'microBranches', i, 'arrayId'], `unknown array "${b.arrayId}"`)
    const node = find(b.inverterId, 'inverter')
    const inverter = node ? equipment.inverters[node.index] : undefined
    if (!inverter) report(['topology', 'microBranches', i, 'inverterId'], `unknown inverter "${b.inverterId}"`)
    else if (inverter.kind !== 'microinverter') report(['topology', 'microBranches', i, 'inverterId'], `"${b.inverterId}" is not a microinverter`)
    else place(b.arrayId, b.units * (inverter.modulesPerUnit ?? 1))
  })

  topology.arrays.forEach((array, i) => {
    const placed = modulesPlaced.get(array.id) ?? 0
    if (placed !== array.moduleCount) {
      report(['topology', 'arrays', i, 'moduleCount'], `${array.moduleCount} modules declared but strings and branches place ${placed}`)
    }
  })

  equipment.inverters.forEach((inv, i) => {
    const at = (field: string) => ['equipment', 'inverters', i, field]
    if (inv.kind === 'microinverter') {
      if (inv.modulesPerUnit === null) report(at('modulesPerUnit'), 'required for a microinverter')
      if (inv.maxUnitsPerBranch === null) report(at('maxUnitsPerBranch'), 'required for a microinverter')
    }
    const pv = inv.pvInput
    if (pv === null) {
      if (inv.kind !== 'stand_alone') report(at('pvInput'), `required for a ${inv.kind} inverter`)
      return
    }
    for (const p of impossiblePvInput(pv)) report(['equipment', 'inverters', i, 'pvInput', p.field], p.message)
  })

  equipment.modules.forEach((m, i) => {
    for (const p of impossibleModuleCurve(m)) report(['equipment', 'modules', i, p.field], p.message)
  })

  if (doc.codeBasis.designLowC >= doc.codeBasis.designHighC) {
    report(['codeBasis', 'designLowC'], `design low ${doc.codeBasis.designLowC} °C must be below design high ${doc.codeBasis.designHighC} °C`)
  }

  const raceways = new Map<string, string>()
  topology.runs.forEach((run, i) => {
    const at = (field: string) => ['topology', 'runs', i, field]
    const allowed = RUN_ENDPOINTS[run.kind]
    for (const end of ['from', 'to'] as const) {
      const node = nodes.get(run[end])
      if (!node) report(at(end), `unknown node "${run[end]}"`)
      else if (NOT_ENDPOINTS.includes(node.kind)) report(at(end), `"${run[end]}" is a ${node.kind}, not a place a conductor can end`)
      else if (allowed[end] && !allowed[end].includes(node.kind)) {
        report(at(end), `a ${run.kind} run cannot ${end === 'from' ? 'start' : 'end'} at a ${node.kind} ("${run[end]}"); expected ${allowed[end].join(' or ')}`)
      }
    }
    if (run.from === run.to) report(at('to'), 'a run must end somewhere other than where it starts')
    const fromString = find(run.from, 'string')
    if (fromString) {
      const hasOptimizer = topology.strings[fromString.index]?.optimizerId !== null
      if (hasOptimizer && run.kind === 'pv_source') report(at('kind'), `string "${run.from}" has optimizers: its circuit is dc_dc_output`)
      if (!hasOptimizer && run.kind === 'dc_dc_output') report(at('kind'), `string "${run.from}" has no optimizer: its circuit is pv_source`)
    }
    if (run.racewayId !== null) {
      const method = raceways.get(run.racewayId)
      if (method === undefined) raceways.set(run.racewayId, run.method)
      else if (method !== run.method) report(at('method'), `raceway "${run.racewayId}" is ${method} on another run`)
      if (run.method === 'FREE_AIR' || run.method === 'CABLE') report(at('racewayId'), `a ${run.method} run is not in a raceway`)
    }
  })

  const tie = doc.interconnection
  if (tie?.method === 'supply_side') {
    if (!find(tie.pointId, 'panel') && !find(tie.pointId, 'pointOfInterconnection')) {
      report(['interconnection', 'pointId'], `unknown panel or point of interconnection "${tie.pointId}"`)
    }
  } else if (tie) {
    const node = find(tie.panelId, 'panel')
    if (!node) report(['interconnection', 'panelId'], `unknown panel "${tie.panelId}"`)
    else if (equipment.panels[node.index]?.mainBreakerA === null) {
      report(['equipment', 'panels', node.index, 'mainBreakerA'], 'a load-side connection needs the rating of the main breaker protecting the busbar')
    }
  }

  const needs = (ok: boolean, path: (string | number)[], message: string) => ok || report(path, message)
  switch (doc.systemKind) {
    case 'grid_tied':
      needs(doc.interconnection !== null, ['interconnection'], 'a grid-tied system needs an interconnection')
      break
    case 'grid_tied_storage':
      needs(doc.interconnection !== null, ['interconnection'], 'a grid-tied system needs an interconnection')
      needs(equipment.batteries.length > 0, ['equipment', 'batteries'], 'a storage system needs at least one battery')
      needs(equipment.inverters.some((inv) => inv.kind === 'hybrid'), ['equipment', 'inverters'], 'a storage system needs a hybrid inverter')
      break
    case 'off_grid':
      needs(doc.interconnection === null, ['interconnection'], 'an off-grid system has no utility interconnection; set null')
      needs(equipment.batteries.length > 0, ['equipment', 'batteries'], 'an off-grid system needs at least one battery')
      needs(equipment.chargeControllers.length > 0, ['equipment', 'chargeControllers'], 'an off-grid system needs a charge controller')
      break
    case 'ground_mount_farm':
      needs(doc.interconnection !== null, ['interconnection'], 'a ground-mount farm needs an interconnection')
      needs(equipment.transformers.length > 0, ['equipment', 'transformers'], 'a ground-mount farm needs a step-up transformer')
      break
  }
}

export const designDocumentSchema = designDocumentObject.superRefine((doc, ctx) => {
  checkCrossReferences(doc, (path, message) => ctx.addIssue({ code: 'custom', path, message }))
})

/** `topology.runs[2].from`: the field path printed in errors. */
export function formatFieldPath(path: ReadonlyArray<PropertyKey>): string {
  let out = ''
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`
    else out += out === '' ? String(part) : `.${String(part)}`
  }
  return out === '' ? '(document)' : out
}

/** Validates and fills defaults; every problem names its field. */
export function parseDesign(input: unknown): Outcome<DesignDocument> {
  const parsed = designDocumentSchema.safeParse(input)
  if (parsed.success) return { ok: true, value: parsed.data }
  const issues: EngineIssue[] = parsed.error.issues.map((issue) => ({
    field: formatFieldPath(issue.path),
    message: issue.message,
    severity: 'error',
  }))
  return { ok: false, issues }
}

/** JSON Schema (draft 2020-12) of what a client may submit: defaulted fields are optional. */
export function designDocumentJsonSchema(): Record<string, unknown> {
  return z.toJSONSchema(designDocumentObject, { io: 'input', target: 'draft-2020-12' }) as Record<string, unknown>
}
