/**
 * Automatic single-line-diagram layout: turns a design document and its evaluation into drawing
 * items, once. Power flows left to right in columns (array → conversion → disconnects → service →
 * utility); identical strings and branches are drawn as one group; every conductor run carries a
 * tag keyed to the schedule. Nothing here computes an electrical value: ratings come from the
 * document, conductor data from the evaluation.
 */
import { drawingSizeLabel, fmt, type Evaluation, type RunResult } from '../../../shared/electrical'
import type { DesignDocument, Run } from '../../../shared/schemas/design'
import { text, textWidth, wrap } from '../fonts'
import { type Box, type DrawItem, type GroupItem, type Point } from '../model'
import { breaker, BREAKER_TERMINAL_INSET, drawSymbol, fuse, FUSE_LEAD, SYMBOL_SIZE, type SymbolKind } from '../symbols'

const LABEL_SIZE = 7
const LABEL_LINE = 9.6
const LABEL_MAX_WIDTH = 150
const NODE_GAP = 14
const PORT_PITCH = 20
const TAG_SIZE = 7
const TAG_HEIGHT = 12
const LANE_PITCH = 6
const DUMMY_HEIGHT = 10

/** A box the overlap checks look at; `within` names the box it sits inside by design. */
export interface CollisionBox { id: string; box: Box; within?: string }

/** One line of the conductor, conduit and OCPD schedule, keyed by the tag on the diagram. */
export interface ScheduleLine {
  tag: string
  runIds: string[]
  circuit: string
  /** "S1 → INV1" for one run, "12 circuits" for several. */
  fromTo: string
  conductors: string
  egc: string
  raceway: string
  ocpd: string
  maxCurrent: string
  length: string
  voltageDrop: string
  status: RunResult['status']
}

export interface SingleLineLayout {
  width: number
  height: number
  items: DrawItem[]
  /** Device ids drawn, including the members of each group. */
  deviceIds: string[]
  schedule: ScheduleLine[]
  collisions: CollisionBox[]
}

export interface SingleLineOptions {
  /** Draw only these inverters / charge controllers and what feeds them; shared equipment always. */
  converterIds?: readonly string[]
}

type NodeRole = 'equipment' | 'stringGroup' | 'branchGroup' | 'meter' | 'utility'

interface GraphNode {
  id: string
  role: NodeRole
  symbol: SymbolKind
  /** Device ids this node stands for (a group lists every string or branch). */
  members: string[]
  labels: { text: string; bold: boolean }[]
  fused: boolean
  grounded: boolean
  /** Inverter or charge controller: the unit a split sheet is cut along. */
  converter: boolean
  /** Enclosure devices drawn per input: fuses (DC combiner) or breakers (panel, AC combiner). */
  inputDevice: 'fuse' | 'breaker' | null
  /** Module-level electronics drawn on a PV group's output: microinverters or DC optimisers. */
  electronics: 'moduleElectronics' | 'dcConverter' | null
}

interface Edge {
  from: string
  to: string
  runs: RunResult[]
  /** Schedule signature; edges with the same signature share a tag. Null: no run (utility service). */
  signature: string | null
}

const KIND_LABEL: Record<Run['kind'], string> = {
  pv_source: 'PV source circuit',
  pv_output: 'PV output circuit',
  dc_dc_output: 'DC-to-DC converter output',
  inverter_output: 'Inverter output circuit',
  microinverter_branch: 'Microinverter AC branch',
  ac_combiner_output: 'AC combiner output',
  ess_dc: 'ESS DC circuit',
  charge_controller_output: 'Charge controller output',
  dc_load: 'DC load circuit',
  transformer_primary: 'Transformer primary',
  transformer_secondary: 'Transformer secondary',
  service_feeder: 'Feeder',
}

const plural = (n: number, one: string, many: string) => `(${n}) ${n === 1 ? one : many}`

/** "S1.1–S1.12, S2.1": ids with a common prefix and consecutive trailing numbers written as a range. */
export function compactIds(ids: readonly string[]): string {
  const parts: string[] = []
  let i = 0
  while (i < ids.length) {
    const m = /^(.*?)(\d+)$/.exec(ids[i]!)
    let j = i
    if (m) {
      while (j + 1 < ids.length) {
        const n = /^(.*?)(\d+)$/.exec(ids[j + 1]!)
        if (!n || n[1] !== m[1] || Number(n[2]) !== Number(m[2]) + (j + 1 - i)) break
        j++
      }
    }
    parts.push(j > i ? `${ids[i]}\u2013${ids[j]}` : ids[i]!)
    i = j + 1
  }
  return parts.join(', ')
}

const range = (values: number[], decimals: number, unit: string) => {
  const lo = Math.min(...values)
  const hi = Math.max(...values)
  return fmt(lo, decimals) === fmt(hi, decimals) ? `${fmt(hi, decimals)} ${unit}` : `${fmt(lo, decimals)}\u2013${fmt(hi, decimals)} ${unit}`
}

/** What a run's schedule line says, without its length, current and drop (which may vary in a group). */
function runSignature(run: Run, result: RunResult | undefined): string {
  if (!result) return `${run.kind}|uncomputed|${run.id}`
  return [run.kind, result.size, result.parallelSets, run.material, run.insulation, result.egcSize, run.method, result.conduitTradeSize, result.ocpdA, result.circuitConductors].join('|')
}

function scheduleLine(tag: string, runs: RunResult[], docRuns: Map<string, Run>): ScheduleLine {
  const first = runs[0]!
  const run = docRuns.get(first.id)!
  const sized = first.size !== null
  const sets = first.parallelSets > 1 ? `${first.parallelSets} sets of ` : ''
  const count = first.circuitConductors !== null ? `(${first.circuitConductors}) ` : ''
  const conductors = sized ? `${sets}${count}${drawingSizeLabel(first.size!)} ${run.material} ${run.insulation}` : 'not computed, see issues'
  const raceway = run.method === 'FREE_AIR' ? 'free air' : run.method === 'CABLE' ? 'cable' : first.conduitTradeSize !== null
    ? `${first.conduitTradeSize} in ${run.method}, ${range(runs.map((r) => r.conduitFillPercent ?? 0), 1, '%')} fill`
    : run.method
  const drops = runs.map((r) => r.voltageDropPercent).filter((v): v is number => v !== null)
  const currents = runs.map((r) => r.maxCurrentA).filter((v): v is number => v !== null)
  return {
    tag,
    runIds: runs.map((r) => r.id),
    circuit: KIND_LABEL[first.kind],
    fromTo: runs.length === 1 ? `${first.from} \u2192 ${first.to}` : `${runs.length} circuits`,
    conductors,
    egc: first.egcSize !== null ? `${drawingSizeLabel(first.egcSize)} ${run.material}` : '\u2014',
    raceway,
    ocpd: first.ocpdA !== null ? `${fmt(first.ocpdA, 0)} A` : 'none required',
    maxCurrent: currents.length > 0 ? range(currents, 2, 'A') : '\u2014',
    length: range(runs.map((r) => r.lengthFt), 0, 'ft'),
    voltageDrop: drops.length > 0 ? range(drops, 2, '%') : '\u2014',
    status: runs.map((r) => r.status).includes('fail') ? 'fail' : runs.map((r) => r.status).includes('warn') ? 'warn' : first.status,
  }
}

/** Builds the graph: equipment nodes, string and branch groups, the utility service, and edges. */
function buildGraph(doc: DesignDocument, evaluation: Evaluation) {
  const { equipment, topology } = doc
  const results = new Map(evaluation.runs.map((r) => [r.id, r]))
  const nodes = new Map<string, GraphNode>()
  const edges: Edge[] = []
  const add = (n: Omit<GraphNode, 'fused' | 'grounded' | 'converter' | 'inputDevice' | 'electronics'> & Partial<GraphNode>) =>
    nodes.set(n.id, { fused: false, grounded: false, converter: false, inputDevice: null, electronics: null, ...n })
  const eq = (id: string, symbol: SymbolKind, name: string, rating: string, extra: Partial<GraphNode> = {}) =>
    add({ id, role: 'equipment', symbol, members: [id], labels: [{ text: id, bold: true }, { text: name, bold: false }, { text: rating, bold: false }], ...extra })

  const endpoints = new Set(topology.runs.flatMap((r) => [r.from, r.to]))
  const phase = (p: 1 | 3) => (p === 3 ? '3-ph' : '1-ph')
  for (const inv of equipment.inverters) {
    if (inv.kind === 'microinverter') continue
    eq(inv.id, 'inverter', inv.name, `${fmt(inv.ratedPowerW / 1000, 2)} kW, ${fmt(inv.acVoltageV, 0)} V ${phase(inv.phases)}`, { converter: true })
  }
  for (const cc of equipment.chargeControllers) eq(cc.id, 'chargeController', cc.name, `${fmt(cc.maxOutputCurrentA, 0)} A, ${fmt(cc.batteryVoltageV, 0)} V battery`, { converter: true })
  for (const b of equipment.batteries) eq(b.id, 'battery', b.name, `${fmt(b.capacityKwh, 1)} kWh, ${fmt(b.nominalVoltageV, 1)} V`)
  for (const c of equipment.combiners) {
    eq(c.id, 'combiner', c.name, `${c.inputs} inputs, ${fmt(c.ratingA, 0)} A, ${fmt(c.maxVoltageV, 0)} V`, { inputDevice: c.current === 'dc' ? 'fuse' : 'breaker' })
  }
  for (const d of equipment.disconnects) {
    eq(d.id, 'disconnect', d.name, `${fmt(d.ratingA, 0)} A, ${fmt(d.voltageRatingV, 0)} V ${d.current.toUpperCase()}${d.fuseA !== null ? `, ${fmt(d.fuseA, 0)} A fuses` : ''}`, { fused: d.fuseA !== null })
  }
  for (const p of equipment.panels) {
    eq(p.id, 'panelboard', p.name, `${fmt(p.busbarA, 0)} A bus, ${p.mainBreakerA === null ? 'main lugs' : `${fmt(p.mainBreakerA, 0)} A main`}, ${fmt(p.voltageV, 0)} V`, {
      inputDevice: 'breaker', grounded: p.role === 'service',
    })
  }
  for (const t of equipment.transformers) {
    eq(t.id, 'transformer', t.name, `${fmt(t.kva, 0)} kVA, ${fmt(t.primaryVoltageV, 0)} V : ${fmt(t.secondaryVoltageV, 0)} V`, { grounded: true })
  }
  for (const l of equipment.dcLoads) eq(l.id, 'load', l.name, `${fmt(l.voltageV, 0)} V, ${fmt(l.currentA, 2)} A`)
  for (const poi of equipment.pointsOfInterconnection) eq(poi.id, 'utility', poi.name, `${fmt(poi.voltageV, 0)} V ${phase(poi.phases)}, point of interconnection`)
  // equipment nobody wires to stays off the diagram
  for (const id of [...nodes.keys()]) if (!endpoints.has(id)) nodes.delete(id)

  const runFrom = new Map<string, Run[]>()
  for (const run of topology.runs) runFrom.set(run.from, [...(runFrom.get(run.from) ?? []), run])
  const docRuns = new Map(topology.runs.map((r) => [r.id, r]))

  // identical strings (same target, input, array, length and conductor) are one group
  const moduleName = (arrayId: string) => {
    const array = topology.arrays.find((a) => a.id === arrayId)
    return equipment.modules.find((m) => m.id === array?.moduleId)?.name ?? ''
  }
  const vocMax = new Map<string, number>()
  for (const s of evaluation.sections) for (const d of s.items) if (d.key.endsWith('.vocMax') && typeof d.value === 'number') vocMax.set(d.key, d.value)
  const groups = new Map<string, { ids: string[]; run: Run[]; target: string; arrayId: string; size: number; optimizerId: string | null; branch: boolean; inverterId: string }>()
  for (const s of topology.strings) {
    const run = runFrom.get(s.id)?.[0]
    const target = run?.to ?? s.combinerId ?? s.inverterId ?? s.chargeControllerId ?? ''
    const key = ['s', target, s.mppt, s.arrayId, s.modulesInSeries, s.optimizerId, run ? runSignature(run, results.get(run.id)) : 'no run'].join('#')
    const g = groups.get(key) ?? { ids: [], run: [], target, arrayId: s.arrayId, size: s.modulesInSeries, optimizerId: s.optimizerId, branch: false, inverterId: '' }
    g.ids.push(s.id)
    if (run) g.run.push(run)
    groups.set(key, g)
  }
  for (const b of topology.microBranches) {
    const run = runFrom.get(b.id)?.[0]
    const target = run?.to ?? ''
    const key = ['b', target, b.arrayId, b.inverterId, b.units, run ? runSignature(run, results.get(run.id)) : 'no run'].join('#')
    const g = groups.get(key) ?? { ids: [], run: [], target, arrayId: b.arrayId, size: b.units, optimizerId: null, branch: true, inverterId: b.inverterId }
    g.ids.push(b.id)
    if (run) g.run.push(run)
    groups.set(key, g)
  }
  let groupNo = 0
  for (const g of groups.values()) {
    const id = `group:${++groupNo}`
    const n = g.ids.length
    const labels = g.branch
      ? [
          { text: `${plural(n, 'branch', 'branches')} of ${g.size} microinverters`, bold: true },
          { text: equipment.inverters.find((i) => i.id === g.inverterId)?.name ?? g.inverterId, bold: false },
          { text: moduleName(g.arrayId), bold: false },
        ]
      : [
          { text: `${plural(n, 'string', 'strings')} of ${g.size} modules`, bold: true },
          { text: moduleName(g.arrayId), bold: false },
          ...(g.optimizerId !== null ? [{ text: `optimizers: ${equipment.optimizers.find((o) => o.id === g.optimizerId)?.name ?? g.optimizerId}`, bold: false }] : []),
        ]
    const vocs = g.ids.map((s) => vocMax.get(`string.${s}.vocMax`)).filter((v): v is number => v !== undefined)
    if (vocs.length > 0) labels.push({ text: `Voc max ${fmt(Math.max(...vocs), 1)} V`, bold: false })
    labels.push({ text: compactIds(g.ids), bold: false })
    const electronics = g.branch ? 'moduleElectronics' : g.optimizerId !== null ? 'dcConverter' : null
    add({ id, role: g.branch ? 'branchGroup' : 'stringGroup', symbol: 'pv', members: g.ids, labels, electronics })
    if (nodes.has(g.target)) {
      const runs = g.run.map((r) => results.get(r.id)).filter((r): r is RunResult => r !== undefined)
      edges.push({ from: id, to: g.target, runs, signature: g.run[0] ? runSignature(g.run[0], results.get(g.run[0].id)) : null })
    }
  }

  for (const run of topology.runs) {
    if (!nodes.has(run.from) || !nodes.has(run.to) || nodes.get(run.from)!.role !== 'equipment') continue
    const result = results.get(run.id)
    edges.push({ from: run.from, to: run.to, runs: result ? [result] : [], signature: runSignature(run, result) })
  }

  // the utility service beyond the point of connection: meter and utility source, not a design run
  const tie = doc.interconnection
  const servicePanelId = tie === null ? null : tie.method === 'supply_side' ? tie.pointId : tie.panelId
  if (servicePanelId !== null && nodes.get(servicePanelId)?.symbol === 'panelboard') {
    add({ id: 'service:meter', role: 'meter', symbol: 'meter', members: [], labels: [{ text: 'Utility meter', bold: true }, { text: 'existing, by the utility', bold: false }] })
    add({ id: 'service:utility', role: 'utility', symbol: 'utility', members: [], labels: [{ text: 'Utility grid', bold: true }, { text: doc.project.utility, bold: false }] })
    edges.push({ from: servicePanelId, to: 'service:meter', runs: [], signature: null }, { from: 'service:meter', to: 'service:utility', runs: [], signature: null })
  }
  return { nodes, edges, docRuns }
}

/** Keeps the chosen converters, what feeds them and what no converter feeds (shared equipment). */
function keepOnly(nodes: Map<string, GraphNode>, edges: Edge[], converterIds: readonly string[]) {
  const out = new Map<string, string[]>()
  for (const e of edges) out.set(e.from, [...(out.get(e.from) ?? []), e.to])
  const feeds = new Map<string, Set<string>>()
  const converterSet = (id: string, seen = new Set<string>()): Set<string> => {
    const known = feeds.get(id)
    if (known) return known
    const set = new Set<string>()
    if (seen.has(id)) return set
    seen.add(id)
    if (nodes.get(id)?.converter) set.add(id)
    for (const next of out.get(id) ?? []) for (const c of converterSet(next, seen)) set.add(c)
    feeds.set(id, set)
    return set
  }
  const chosen = new Set(converterIds)
  for (const id of [...nodes.keys()]) {
    const set = converterSet(id)
    if (set.size > 0 && ![...set].some((c) => chosen.has(c))) nodes.delete(id)
  }
  return edges.filter((e) => nodes.has(e.from) && nodes.has(e.to))
}

/** Column of each node: longest path from the sources, then sources pulled next to what they feed. */
function assignColumns(ids: string[], edges: Edge[]): Map<string, number> {
  const into = new Map<string, string[]>()
  const out = new Map<string, string[]>()
  for (const e of edges) {
    into.set(e.to, [...(into.get(e.to) ?? []), e.from])
    out.set(e.from, [...(out.get(e.from) ?? []), e.to])
  }
  const column = new Map<string, number>()
  const visiting = new Set<string>()
  const depth = (id: string): number => {
    const known = column.get(id)
    if (known !== undefined) return known
    if (visiting.has(id)) return 0 // a loop in the topology: draw it, do not recurse for ever
    visiting.add(id)
    const c = Math.max(-1, ...(into.get(id) ?? []).map(depth)) + 1
    visiting.delete(id)
    column.set(id, c)
    return c
  }
  ids.forEach(depth)
  for (const id of [...ids].sort((a, b) => column.get(b)! - column.get(a)!)) {
    if ((into.get(id) ?? []).length > 0) continue
    const next = (out.get(id) ?? []).map((t) => column.get(t)!)
    if (next.length > 0) column.set(id, Math.min(...next) - 1)
  }
  const min = Math.min(...column.values())
  for (const [id, c] of column) column.set(id, c - min)
  return column
}

interface Slot {
  /** Node id, or `via:<edge>:<column>` for a wire passing through a column. */
  id: string
  node: GraphNode | null
  column: number
  width: number
  height: number
  symbolWidth: number
  symbolHeight: number
  /** Symbol top offset within the slot (labels are above it). */
  symbolTop: number
  inPorts: Segment[]
  outPorts: Segment[]
  y: number
  x: number
  labelLines: { text: string; bold: boolean }[]
}

interface Segment { edge: number; from: Slot; to: Slot }

/** Lays out the single-line diagram of a design. */
export function layoutSingleLine(doc: DesignDocument, evaluation: Evaluation, options: SingleLineOptions = {}): SingleLineLayout {
  const graph = buildGraph(doc, evaluation)
  const nodes = graph.nodes
  const edges = options.converterIds ? keepOnly(nodes, graph.edges, options.converterIds) : graph.edges
  const ids = [...nodes.keys()]
  const column = assignColumns(ids, edges)
  const columnCount = Math.max(0, ...column.values()) + 1

  // slots per column: nodes, plus pass-through slots for wires that skip columns
  const columns: Slot[][] = Array.from({ length: columnCount }, () => [])
  const slots = new Map<string, Slot>()
  const newSlot = (id: string, node: GraphNode | null, c: number): Slot => {
    const slot: Slot = { id, node, column: c, width: 0, height: DUMMY_HEIGHT, symbolWidth: 0, symbolHeight: DUMMY_HEIGHT, symbolTop: 0, inPorts: [], outPorts: [], y: 0, x: 0, labelLines: [] }
    columns[c]!.push(slot)
    slots.set(id, slot)
    return slot
  }
  for (const id of ids) newSlot(id, nodes.get(id)!, column.get(id)!)
  const segments: Segment[][] = edges.map(() => [])
  edges.forEach((e, i) => {
    let prev = slots.get(e.from)!
    const end = slots.get(e.to)!
    for (let c = prev.column + 1; c < end.column; c++) {
      const via = newSlot(`via:${i}:${c}`, null, c)
      segments[i]!.push({ edge: i, from: prev, to: via })
      prev = via
    }
    segments[i]!.push({ edge: i, from: prev, to: end })
  })
  for (const list of segments) for (const s of list) {
    s.from.outPorts.push(s)
    s.to.inPorts.push(s)
  }

  // order within columns: barycentre of the neighbours, swept right then left
  const position = new Map<Slot, number>()
  const renumber = (c: number) => columns[c]!.forEach((s, i) => position.set(s, i))
  for (let c = 0; c < columnCount; c++) renumber(c)
  const bary = (s: Slot, side: 'in' | 'out') => {
    const ports = side === 'in' ? s.inPorts.map((p) => p.from) : s.outPorts.map((p) => p.to)
    return ports.length === 0 ? position.get(s)! : ports.reduce((t, o) => t + position.get(o)!, 0) / ports.length
  }
  for (let pass = 0; pass < 2; pass++) {
    for (let c = 1; c < columnCount; c++) {
      columns[c]!.sort((a, b) => bary(a, 'in') - bary(b, 'in'))
      renumber(c)
    }
    for (let c = columnCount - 2; c >= 0; c--) {
      columns[c]!.sort((a, b) => bary(a, 'out') - bary(b, 'out'))
      renumber(c)
    }
  }
  for (const s of slots.values()) {
    s.inPorts.sort((a, b) => position.get(a.from)! - position.get(b.from)!)
    s.outPorts.sort((a, b) => position.get(a.to)! - position.get(b.to)!)
  }

  // sizes: labels above the symbol, the ground below it
  for (const s of slots.values()) {
    const node = s.node
    if (!node) continue
    const natural = SYMBOL_SIZE[node.symbol]
    const ports = Math.max(s.inPorts.length, s.outPorts.length, 1)
    const enclosure = node.symbol === 'combiner' || node.symbol === 'panelboard'
    s.symbolWidth = natural.width + (node.electronics !== null ? SYMBOL_SIZE.moduleElectronics.width + 4 : 0)
    s.symbolHeight = Math.max(natural.height, enclosure ? ports * PORT_PITCH + 8 : ports * PORT_PITCH)
    s.labelLines = node.labels.flatMap((l) => wrap(l.text, LABEL_SIZE, l.bold ? 'bold' : 'regular', LABEL_MAX_WIDTH, 1).map((t) => ({ text: t, bold: l.bold })))
    const labelWidth = Math.max(0, ...s.labelLines.map((l) => textWidth(l.text, LABEL_SIZE, l.bold ? 'bold' : 'regular')))
    s.width = Math.max(s.symbolWidth, labelWidth)
    s.symbolTop = s.labelLines.length * LABEL_LINE + 4
    s.height = s.symbolTop + s.symbolHeight + (node.grounded ? 6 + SYMBOL_SIZE.ground.height + 6 : 0)
  }
  const portOffset = (s: Slot, seg: Segment, side: 'in' | 'out') => {
    const list = side === 'in' ? s.inPorts : s.outPorts
    if (!s.node) return s.height / 2
    const n = list.length
    const k = list.indexOf(seg)
    return s.symbolTop + (s.symbolHeight * (k + 1)) / (n + 1)
  }

  // vertical positions: stack, then pull each slot toward its neighbours' ports without overlap
  const stack = (c: number, desired: (s: Slot) => number | null) => {
    let bottom = -Infinity
    for (const s of columns[c]!) {
      const want = desired(s)
      s.y = Math.max(want ?? (bottom === -Infinity ? 0 : bottom + NODE_GAP), bottom === -Infinity ? -Infinity : bottom + NODE_GAP)
      bottom = s.y + s.height
    }
  }
  for (let c = 0; c < columnCount; c++) stack(c, () => null)
  const mean = (xs: number[]) => (xs.length === 0 ? null : xs.reduce((t, x) => t + x, 0) / xs.length)
  const fromLeft = (s: Slot) => mean(s.inPorts.map((p) => p.from.y + portOffset(p.from, p, 'out') - portOffset(s, p, 'in')))
  const fromRight = (s: Slot) => mean(s.outPorts.map((p) => p.to.y + portOffset(p.to, p, 'in') - portOffset(s, p, 'out')))
  for (let pass = 0; pass < 3; pass++) {
    for (let c = 1; c < columnCount; c++) stack(c, fromLeft)
    for (let c = columnCount - 2; c >= 0; c--) stack(c, (s) => (s.inPorts.length === 0 ? fromRight(s) : mean([fromRight(s), fromLeft(s)].filter((v): v is number => v !== null))))
  }
  for (let c = 1; c < columnCount; c++) stack(c, fromLeft)
  const top = Math.min(...[...slots.values()].map((s) => s.y))
  for (const s of slots.values()) s.y -= top

  // horizontal positions: columns, each gap holding the tags then one lane per bent wire
  const straight = (seg: Segment) => Math.abs(seg.from.y + portOffset(seg.from, seg, 'out') - (seg.to.y + portOffset(seg.to, seg, 'in'))) < 0.5
  const signatures = [...new Set(edges.map((e) => e.signature).filter((s): s is string => s !== null))]
  const tagName = new Map<string, string>()
  const tagWidth = (label: string) => textWidth(label, TAG_SIZE, 'bold') + 8
  const columnX: number[] = []
  const gapLanes: Segment[][] = Array.from({ length: columnCount }, () => [])
  for (const list of segments) for (const seg of list) if (!straight(seg)) gapLanes[seg.from.column]!.push(seg)
  for (const lanes of gapLanes) lanes.sort((a, b) => a.from.y + portOffset(a.from, a, 'out') - (b.from.y + portOffset(b.from, b, 'out')))
  const maxTagWidth = tagWidth(String(Math.max(1, signatures.length)))
  let x = 0
  for (let c = 0; c < columnCount; c++) {
    columnX.push(x)
    const width = Math.max(10, ...columns[c]!.map((s) => s.width))
    for (const s of columns[c]!) {
      s.width = s.node ? s.width : width
      s.x = s.node ? x + (width - s.width) / 2 : x
    }
    x += width + 10 + maxTagWidth + 8 + gapLanes[c]!.length * LANE_PITCH + 14
  }
  const width = x - (10 + maxTagWidth + 8 + 14)
  const height = Math.max(0, ...[...slots.values()].map((s) => s.y + s.height))
  const columnRight = (c: number) => columnX[c]! + Math.max(10, ...columns[c]!.map((s) => s.width))

  // number tags left to right, top to bottom, as a reader meets them
  const tagged = edges
    .map((e, i) => ({ e, i, from: slots.get(e.from)! }))
    .filter((t) => t.e.signature !== null)
    .sort((a, b) => a.from.column - b.from.column || a.from.y + portOffset(a.from, segments[a.i]![0]!, 'out') - (b.from.y + portOffset(b.from, segments[b.i]![0]!, 'out')))
  for (const t of tagged) if (!tagName.has(t.e.signature!)) tagName.set(t.e.signature!, String(tagName.size + 1))

  const items: DrawItem[] = []
  const collisions: CollisionBox[] = []
  const symbolBoxOf = (s: Slot): Box => ({ x: s.x + (s.width - s.symbolWidth) / 2, y: s.y + s.symbolTop, width: s.symbolWidth, height: s.symbolHeight })

  // wires first, so symbols and tags draw over them
  edges.forEach((e, i) => {
    const points: Point[] = []
    for (const seg of segments[i]!) {
      const fromBox = seg.from.node ? symbolBoxOf(seg.from) : { x: seg.from.x, y: seg.from.y, width: seg.from.width, height: seg.from.height }
      const toBox = seg.to.node ? symbolBoxOf(seg.to) : { x: seg.to.x, y: seg.to.y, width: seg.to.width, height: seg.to.height }
      const y1 = seg.from.y + portOffset(seg.from, seg, 'out')
      const y2 = seg.to.y + portOffset(seg.to, seg, 'in')
      const startX = fromBox.x + fromBox.width
      points.push({ x: startX, y: y1 })
      if (!straight(seg)) {
        const lane = columnRight(seg.from.column) + 10 + maxTagWidth + 8 + gapLanes[seg.from.column]!.indexOf(seg) * LANE_PITCH
        points.push({ x: lane, y: y1 }, { x: lane, y: y2 })
      }
      points.push({ x: toBox.x, y: y2 })
    }
    const runIds = e.runs.map((r) => r.id)
    const data: Record<string, string> = { from: e.from, to: e.to }
    if (runIds.length > 0) data.runs = runIds.join(' ')
    items.push({ kind: 'group', role: 'wire', data, items: [{ kind: 'polyline', points, strokeWidth: 0.9 }] })
    if (e.signature === null) return
    const label = tagName.get(e.signature)!
    const first = segments[i]![0]!
    const y = first.from.y + portOffset(first.from, first, 'out')
    const w = tagWidth(label)
    const box: Box = { x: columnRight(first.from.column) + 10 + (maxTagWidth - w) / 2, y: y - TAG_HEIGHT / 2, width: w, height: TAG_HEIGHT }
    const r = TAG_HEIGHT / 2
    const tagText = text(label, box.x + w / 2, y + TAG_SIZE * 0.36, { size: TAG_SIZE, weight: 'bold', anchor: 'middle' })
    items.push({
      kind: 'group', role: 'tag', data: { tag: label, runs: runIds.join(' ') },
      items: [
        { kind: 'path', d: `M ${box.x + r} ${box.y} L ${box.x + w - r} ${box.y} A ${r} ${r} 0 0 1 ${box.x + w - r} ${box.y + TAG_HEIGHT} L ${box.x + r} ${box.y + TAG_HEIGHT} A ${r} ${r} 0 0 1 ${box.x + r} ${box.y} Z`, strokeWidth: 0.8, fill: 'white' },
        tagText,
      ],
    })
    collisions.push({ id: `tag:${i}`, box }, { id: `tag-text:${i}`, box: tagText.bounds, within: `tag:${i}` })
  })

  for (const s of slots.values()) {
    const node = s.node
    if (!node) continue
    const group: GroupItem = { kind: 'group', role: 'device', data: { device: node.id, members: node.members.join(' ') }, items: [] }
    const sym = symbolBoxOf(s)
    const pvWidth = SYMBOL_SIZE.pv.width
    if (node.electronics !== null) {
      // PV source with module-level electronics: the module, then the converter mark on its output
      const pv = { x: sym.x, y: sym.y + (sym.height - SYMBOL_SIZE.pv.height) / 2, width: pvWidth, height: SYMBOL_SIZE.pv.height }
      const mle = SYMBOL_SIZE.moduleElectronics
      const mleBox = { x: sym.x + pvWidth + 4, y: sym.y + (sym.height - mle.height) / 2, width: mle.width, height: mle.height }
      group.items.push(...drawSymbol('pv', pv), ...drawSymbol(node.electronics, mleBox))
      group.items.push({ kind: 'polyline', points: [{ x: pv.x + pv.width, y: mleBox.y + mle.height / 2 }, { x: mleBox.x, y: mleBox.y + mle.height / 2 }], strokeWidth: 0.9 })
    } else {
      const natural = SYMBOL_SIZE[node.symbol]
      const enclosure = node.symbol === 'combiner' || node.symbol === 'panelboard'
      const box = enclosure ? sym : { x: sym.x + (sym.width - natural.width) / 2, y: sym.y + (sym.height - natural.height) / 2, width: natural.width, height: natural.height }
      group.items.push(...drawSymbol(node.symbol, box, { fused: node.fused }))
      if (enclosure) group.items.push(...enclosureDevices(s, node, sym, edges, portOffset, collisions))
      if (!enclosure && sym.height > natural.height) {
        // ports spread over a taller slot: short leads from the symbol's edge to each port
        for (const p of s.inPorts) group.items.push({ kind: 'polyline', points: [{ x: sym.x, y: s.y + portOffset(s, p, 'in') }, { x: box.x, y: s.y + portOffset(s, p, 'in') }], strokeWidth: 0.9 })
        for (const p of s.outPorts) group.items.push({ kind: 'polyline', points: [{ x: box.x + box.width, y: s.y + portOffset(s, p, 'out') }, { x: sym.x + sym.width, y: s.y + portOffset(s, p, 'out') }], strokeWidth: 0.9 })
      }
    }
    collisions.push({ id: `symbol:${node.id}`, box: sym })
    s.labelLines.forEach((l, k) => {
      const t = text(l.text, s.x + s.width / 2, s.y + (k + 1) * LABEL_LINE - 2, { size: LABEL_SIZE, weight: l.bold ? 'bold' : 'regular', anchor: 'middle' })
      group.items.push(t)
      collisions.push({ id: `label:${node.id}:${k}`, box: t.bounds })
    })
    if (node.grounded) {
      const g = SYMBOL_SIZE.ground
      const gx = sym.x + sym.width / 2
      const gy = sym.y + sym.height + 6
      group.items.push({ kind: 'polyline', points: [{ x: gx, y: sym.y + sym.height }, { x: gx, y: gy }], strokeWidth: 0.9 }, ...drawSymbol('ground', { x: gx - g.width / 2, y: gy, width: g.width, height: g.height }))
      collisions.push({ id: `ground:${node.id}`, box: { x: gx - g.width / 2, y: gy, width: g.width, height: g.height } })
    }
    items.push(group)
  }

  const schedule = tagged
    .filter((t, k) => tagged.findIndex((u) => u.e.signature === t.e.signature) === k)
    .map((t) => scheduleLine(tagName.get(t.e.signature!)!, edges.filter((e) => e.signature === t.e.signature).flatMap((e) => e.runs), graph.docRuns))
    .filter((line) => line.runIds.length > 0)
  const deviceIds = [...nodes.values()].flatMap((n) => (n.role === 'meter' || n.role === 'utility' ? [] : n.members))
  return { width: Math.max(width, 0), height, items, deviceIds, schedule, collisions }
}

/** Fuses or breakers on each input of a combiner or panel, the main breaker on its output. */
function enclosureDevices(
  s: Slot,
  node: GraphNode,
  sym: Box,
  edges: Edge[],
  portOffset: (s: Slot, seg: Segment, side: 'in' | 'out') => number,
  collisions: CollisionBox[],
): DrawItem[] {
  const items: DrawItem[] = []
  const busX = sym.x + sym.width - 8
  const lead = (x1: number, x2: number, y: number) => items.push({ kind: 'polyline', points: [{ x: x1, y }, { x: x2, y }], strokeWidth: 0.9 })
  for (const p of s.inPorts) {
    const y = s.y + portOffset(s, p, 'in')
    const ocpd = edges[p.edge]!.runs[0]?.ocpdA ?? null
    if (ocpd === null) {
      lead(sym.x, busX, y)
      continue
    }
    // input lead, the device on the port's line, then on to the bus
    const kind = node.inputDevice ?? 'breaker'
    const { width: w, height: h } = SYMBOL_SIZE[kind]
    const x = sym.x + 6
    if (kind === 'fuse') {
      items.push(...fuse({ x, y: y - h / 2, width: w, height: h }))
      lead(sym.x, x - FUSE_LEAD, y)
      lead(x + w + FUSE_LEAD, busX, y)
    } else {
      items.push(...breaker({ x, y: y - h + BREAKER_TERMINAL_INSET, width: w, height: h }))
      lead(sym.x, x + BREAKER_TERMINAL_INSET, y)
      lead(x + w - BREAKER_TERMINAL_INSET, busX, y)
    }
    const t = text(`${fmt(ocpd, 0)} A`, x + w / 2, y - h - 1.5, { size: 5.5, anchor: 'middle' })
    items.push(t)
    collisions.push({ id: `rating:${node.id}:in${p.edge}`, box: t.bounds, within: `symbol:${node.id}` })
  }
  for (const p of s.outPorts) {
    const y = s.y + portOffset(s, p, 'out')
    items.push({ kind: 'polyline', points: [{ x: busX, y }, { x: sym.x + sym.width, y }], strokeWidth: 0.9 })
  }
  return items
}
