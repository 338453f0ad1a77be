/**
 * Which field labels and placards a design needs, with their values filled from the evaluation.
 * Pure: reads the design document for what equipment there is and the evaluation for every
 * computed value; nothing is computed twice. Source: the sections named in
 * `tables/required-labels.ts` (NFPA 70 2017, 2020, 2023; from memory).
 */
import type { DesignDocument, Run } from '../../schemas/design'
import type { AnyDerived, Evaluation } from '../evaluate'
import { fmt } from '../format'
import { necRef } from '../reference'
import { REQUIRED_LABELS, type LabelKind, type LabelKindId, type SignalWord } from '../tables/required-labels'
import type { NecEdition } from '../types'

export interface RequiredLabel {
  /** 1-based, the order the labels are printed in. */
  number: number
  kind: LabelKindId
  signalWord: SignalWord | null
  title: string | null
  /** Body with every value put in; missing values say so in capitals. */
  text: string
  /** Where it goes, naming the design's equipment. */
  location: string
  quantity: number
  /** e.g. "NEC 2023 690.56(C)(1)". */
  reference: string
  sizeIn: { width: number; height: number }
  letterHeightIn?: { title: number; text: number }
  /** Colours or stock the code sets (rapid shutdown labels). */
  stock?: string
  /** Placeholders the evaluation could not fill (invalid or incomplete design). */
  missing: string[]
  /** The code leaves the wording to the installer; this is ours. */
  wordingOurs: boolean
}

/** Printed in place of a value the evaluation does not have. */
export const MISSING_VALUE = '[NOT COMPUTED \u2013 CORRECT THE DESIGN, SEE E-602]'

const PV_DC_KINDS: ReadonlySet<Run['kind']> = new Set(['pv_source', 'pv_output', 'dc_dc_output'])
const PV_AC_KINDS: ReadonlySet<Run['kind']> = new Set(['inverter_output', 'microinverter_branch', 'ac_combiner_output'])
/** Source output circuits at an interconnection, as the engine counts them (evaluate.ts). */
const SOURCE_OUTPUT_KINDS: ReadonlySet<Run['kind']> = new Set(['inverter_output', 'microinverter_branch', 'ac_combiner_output', 'transformer_secondary'])

/** Markings on a DC raceway: one per 10 ft plus one each side of a penetration. // common practice, no source */
const dcMarkingsForLength = (lengthFt: number): number => Math.ceil(lengthFt / 10) + 2

type Values = Record<string, number | string | null>

function fill(template: string, values: Values): { text: string; missing: string[] } {
  const missing: string[] = []
  const text = template.replace(/\{(\w+)\}/g, (_, name: string) => {
    const v = values[name]
    if (v === null || v === undefined || (typeof v === 'number' && !Number.isFinite(v))) {
      missing.push(name)
      return MISSING_VALUE
    }
    return String(v)
  })
  return { text, missing }
}

const volts = (v: number | null) => (v === null ? null : `${fmt(v, 1)} V`)
const amps = (a: number | null) => (a === null ? null : `${fmt(a, 2)} A`)
const maxOf = (xs: (number | null)[]) => {
  const known = xs.filter((x): x is number => x !== null)
  return known.length === 0 ? null : Math.max(...known)
}

class LabelCollector {
  readonly labels: RequiredLabel[] = []
  private readonly derived = new Map<string, AnyDerived>()
  private readonly names = new Map<string, string>()
  readonly edition: NecEdition

  constructor(readonly doc: DesignDocument, readonly evaluation: Evaluation) {
    this.edition = evaluation.edition ?? doc.codeBasis.necEdition
    for (const s of evaluation.sections) for (const d of s.items) this.derived.set(d.key, d)
    const { equipment, topology } = doc
    for (const list of [...Object.values(equipment), topology.arrays]) for (const item of list) this.names.set(item.id, item.name)
  }

  /** A numeric result of the evaluation, or null when it was not computed. */
  value(key: string): number | null {
    const d = this.derived.get(key)
    return d && typeof d.value === 'number' && Number.isFinite(d.value) ? d.value : null
  }

  /** "Generic 7.6 kW string inverter (INV1)". */
  named(id: string): string {
    const name = this.names.get(id)
    return name === undefined ? id : `${name} (${id})`
  }

  add(kindId: LabelKindId, location: string, quantity: number, values: Values = {}): void {
    const kind: LabelKind = REQUIRED_LABELS[kindId]
    const template = typeof kind.text === 'string' ? kind.text : kind.text[this.edition]
    const body = fill(template, values)
    const title = kind.title === null ? null : fill(kind.title, values).text
    this.labels.push({
      number: this.labels.length + 1, kind: kindId, signalWord: kind.signalWord, title, text: body.text, location, quantity,
      reference: necRef(this.edition, kind.reference), sizeIn: kind.sizeIn, missing: body.missing, wordingOurs: kind.wordingOurs ?? false,
      ...(kind.letterHeightIn ? { letterHeightIn: kind.letterHeightIn } : {}),
      ...(kind.stock ? { stock: kind.stock } : {}),
    })
  }

  derivedStatus(key: string): AnyDerived['status'] | null {
    return this.derived.get(key)?.status ?? null
  }

  runsAt(id: string): Run[] {
    return this.doc.topology.runs.filter((r) => r.from === id || r.to === id)
  }

  /** Arrays whose modules feed a node, walking the runs upstream. */
  arraysFeeding(nodeId: string, seen = new Set<string>()): Set<string> {
    const out = new Set<string>()
    if (seen.has(nodeId)) return out
    seen.add(nodeId)
    const { strings } = this.doc.topology
    const string = strings.find((s) => s.id === nodeId)
    if (string) out.add(string.arrayId)
    for (const s of strings) if (s.combinerId === nodeId) out.add(s.arrayId)
    for (const r of this.doc.topology.runs) if (r.to === nodeId) for (const a of this.arraysFeeding(r.from, seen)) out.add(a)
    return out
  }

  onRoof(runs: Run[]): boolean {
    const roofArrays = new Set(this.doc.topology.arrays.filter((a) => a.mount === 'roof').map((a) => a.id))
    return runs.some((r) => [...this.arraysFeeding(r.from)].some((a) => roofArrays.has(a)))
  }
}

/** The disconnects of a design by what they switch. */
function classifyDisconnects(c: LabelCollector) {
  const pvAc: string[] = []
  const pvDc: string[] = []
  const ess: string[] = []
  for (const d of c.doc.equipment.disconnects) {
    const kinds = c.runsAt(d.id).map((r) => r.kind)
    if (kinds.includes('ess_dc')) ess.push(d.id)
    else if (kinds.some((k) => PV_DC_KINDS.has(k))) pvDc.push(d.id)
    else if (kinds.some((k) => PV_AC_KINDS.has(k))) pvAc.push(d.id)
  }
  return { pvAc, pvDc, ess }
}
type DisconnectGroups = ReturnType<typeof classifyDisconnects>

/** Power conversion equipment with PV DC inputs: string, hybrid and central inverters, charge controllers. */
function dcConverters(c: LabelCollector): { id: string; inputKeys: string[]; stringIds: string[] }[] {
  const { equipment, topology } = c.doc
  const out: { id: string; inputKeys: string[]; stringIds: string[] }[] = []
  for (const inv of equipment.inverters) {
    const strings = topology.strings.filter((s) => s.inverterId === inv.id)
    if (inv.kind === 'microinverter' || strings.length === 0) continue
    const mppts = [...new Set(strings.map((s) => s.mppt))]
    out.push({ id: inv.id, inputKeys: mppts.map((m) => `input.${inv.id}.mppt${m}.maxCurrent`), stringIds: strings.map((s) => s.id) })
  }
  for (const cc of equipment.chargeControllers) {
    const strings = topology.strings.filter((s) => s.chargeControllerId === cc.id)
    if (strings.length > 0) out.push({ id: cc.id, inputKeys: [`input.${cc.id}.maxCurrent`], stringIds: strings.map((s) => s.id) })
  }
  return out
}

/** Highest maximum DC voltage of a string's circuit: the converter limit with optimizers, else 690.7 Voc. */
const stringMaxVoltage = (c: LabelCollector, stringId: string) =>
  c.value(`string.${stringId}.converterVoltage`) ?? c.value(`string.${stringId}.vocMax`)

/** 690.56(C): rapid shutdown labels where 690.12 applies, i.e. PV circuits on or in buildings (a roof-mounted array). */
function rapidShutdown(c: LabelCollector, pvAc: string[]) {
  if (!c.doc.topology.arrays.some((a) => a.mount === 'roof')) return
  const services = c.doc.equipment.panels.filter((p) => p.role === 'service')
  c.add('rapidShutdownSystem',
    services.length > 0 ? `At the service equipment: ${services.map((p) => c.named(p.id)).join(', ')}` : 'At an approved readily visible location near the PV system disconnect',
    Math.max(1, services.length))
  const initiator = pvAc[0] ?? services[0]?.id
  c.add('rapidShutdownSwitch',
    initiator === undefined ? 'On the rapid shutdown initiation device (not shown in the design)' : `On or within 3 ft of the rapid shutdown initiation device: ${c.named(initiator)}`, 1)
}

/** 690.13(B): each PV system disconnect, with the line/load warning where both sides can be live. */
function disconnectLabels(c: LabelCollector, groups: DisconnectGroups) {
  const interactive = c.doc.interconnection !== null
  for (const id of [...groups.pvDc, ...groups.pvAc]) {
    const d = c.doc.equipment.disconnects.find((x) => x.id === id)!
    const served = c.runsAt(id).map((r) => (r.from === id ? r.to : r.from)).filter((n) => n !== id)
    c.add('pvSystemDisconnect', `On ${c.named(id)}`, 1, { current: d.current.toUpperCase(), equipment: served.map((n) => c.named(n)).join(' AND ') })
    // An AC disconnect of an interactive system has the utility on one side and the inverter on the other.
    if (d.current === 'ac' && interactive) c.add('lineLoadEnergized', `On ${c.named(id)}`, 1)
  }
  for (const id of integralDcDisconnects(c, groups)) c.add('pvSystemDisconnect', `On the DC disconnect integral to ${c.named(id)}`, 1, { current: 'DC', equipment: c.named(id) })
}

/**
 * Converters whose PV input has no separate DC disconnect in the design: they use the one integral
 * to the equipment. // common practice, no source
 */
const integralDcDisconnects = (c: LabelCollector, groups: DisconnectGroups): string[] =>
  dcConverters(c).map((conv) => conv.id).filter((id) => !c.doc.topology.runs.some((r) => r.to === id && groups.pvDc.includes(r.from)))

/** 690.53 maximum DC voltage per conversion equipment; 690.31 DC circuit markings on the building. */
function dcLabels(c: LabelCollector) {
  for (const conv of dcConverters(c)) {
    const maxVoltage = maxOf(conv.stringIds.map((s) => stringMaxVoltage(c, s)))
    const maxCurrent = maxOf(conv.inputKeys.map((k) => c.value(k)))
    c.add('dcMaxVoltage', `At the DC PV disconnecting means of ${c.named(conv.id)} (${conv.stringIds.length > 4 ? `${conv.stringIds.length} strings` : `strings ${conv.stringIds.join(', ')}`})`, 1,
      { maxVoltage: volts(maxVoltage), maxCurrent: amps(maxCurrent) })
  }
  // One marking set per raceway (or per run not in a shared raceway), for circuits on or in a building.
  const groups = new Map<string, Run[]>()
  for (const r of c.doc.topology.runs) {
    if (!PV_DC_KINDS.has(r.kind) || !c.onRoof([r])) continue
    const key = r.racewayId ?? `run ${r.id}`
    groups.set(key, [...(groups.get(key) ?? []), r])
  }
  for (const [key, runs] of groups) {
    const what = runs[0]!.racewayId === null ? `Run ${runs[0]!.id}` : `Raceway ${key} (runs ${runs.map((r) => r.id).join(', ')})`
    const longest = Math.max(...runs.map((r) => r.lengthFt))
    c.add('dcConductorMarking', `${what}, ${fmt(longest, 0)} ft to ${c.named(runs[0]!.to)}: every 10 ft, at turns, above and below penetrations`, dcMarkingsForLength(longest))
  }
}

/** 690.54 at the point of interconnection; 705.11 supply side or 705.12 load side markings. */
function interconnectionLabels(c: LabelCollector, pvAc: string[]) {
  const tie = c.doc.interconnection
  if (!tie) return
  const { doc, evaluation } = c
  const pointId = tie.method === 'supply_side' ? tie.pointId : tie.panelId
  const sourceRuns = evaluation.runs.filter((r) => r.to === pointId && SOURCE_OUTPUT_KINDS.has(r.kind))
  const nominal = maxOf(sourceRuns.map((r) => r.voltageV))
  c.add('powerSourceOutput', `At the point of interconnection: ${c.named(pointId)}`, 1,
    { ratedCurrent: amps(c.value('interconnection.sourceCurrent')), nominalVoltage: volts(nominal) })
  for (const id of pvAc) {
    const out = evaluation.runs.find((r) => r.from === id)
    c.add('powerSourceOutput', `On ${c.named(id)}`, 1, { ratedCurrent: amps(out?.maxCurrentA ?? null), nominalVoltage: volts(out?.voltageV ?? null) })
  }
  if (tie.method === 'supply_side') {
    c.add('supplySideDisconnect', `On the power source disconnecting means feeding ${c.named(pointId)} and at the service equipment`, 2, { point: c.named(pointId) })
    return
  }
  c.add('multipleSources', `On ${c.named(tie.panelId)}`, 1, { storage: doc.equipment.batteries.length > 0 ? ' AND AN ENERGY STORAGE SYSTEM' : '' })
  // The busbar allowance the design relies on: the first that passes, as the engine judged it.
  const governing = ['interconnection.busbar100', 'interconnection.busbar120', 'interconnection.busbarSum'].find((k) => c.derivedStatus(k) === 'pass')
  const at = `On ${c.named(tie.panelId)}, adjacent to the back-fed breaker`
  if (governing === 'interconnection.busbar120') c.add('backfedBreakerFixed', at, 1)
  if (governing === 'interconnection.busbarSum') c.add('busbarSumRule', `On ${c.named(tie.panelId)}`, 1)
}

/** 706.15(C) (706.7(D) in 2017): the marking of each ESS disconnecting means. */
function storageLabels(c: LabelCollector, essDisconnects: string[]) {
  for (const b of c.doc.equipment.batteries) {
    const mine = essDisconnects.filter((d) => c.runsAt(d).some((r) => r.from === b.id || r.to === b.id))
    const values = { nominalVoltage: volts(b.nominalVoltageV) }
    for (const d of mine) c.add('essDisconnect', `On ${c.named(d)}`, 1, values)
    if (b.integralDisconnect) c.add('essDisconnect', `On the disconnect integral to ${c.named(b.id)}`, 1, values)
    if (mine.length === 0 && !b.integralDisconnect) c.add('essDisconnect', `On the ESS disconnecting means of ${c.named(b.id)} \u2013 NONE SHOWN IN THE DESIGN, SEE E-602`, 1, values)
  }
}

/** The disconnecting means a 705.10 directory or a 710.10 plaque lists. */
function sourceList(c: LabelCollector, groups: DisconnectGroups): string {
  const { doc } = c
  const entries = [
    ...[...groups.pvAc, ...groups.pvDc].map((id) => `PV SYSTEM \u2013 ${c.named(id)}`),
    ...integralDcDisconnects(c, groups).map((id) => `PV DC \u2013 disconnect integral to ${c.named(id)}`),
    ...groups.ess.map((id) => `ENERGY STORAGE \u2013 ${c.named(id)}`),
    ...doc.equipment.batteries.filter((b) => b.integralDisconnect).map((b) => `ENERGY STORAGE \u2013 ${c.named(b.id)}`),
  ]
  if (entries.length === 0 && doc.interconnection) entries.push(`PV SYSTEM \u2013 at ${c.named(doc.interconnection.method === 'supply_side' ? doc.interconnection.pointId : doc.interconnection.panelId)}`)
  return entries.join('; ')
}

/**
 * The labels and placards the design needs, in the order a crew would fit them: array and
 * rapid shutdown, disconnects, DC circuits, interconnection, storage, directory.
 * @param doc         the validated design document (equipment names and ids for the locations)
 * @param evaluation  the engine's results for it; every printed value comes from here
 */
export function requiredLabels(doc: DesignDocument, evaluation: Evaluation): RequiredLabel[] {
  const c = new LabelCollector(doc, evaluation)
  const groups = classifyDisconnects(c)
  rapidShutdown(c, groups.pvAc)
  disconnectLabels(c, groups)
  dcLabels(c)
  interconnectionLabels(c, groups.pvAc)
  storageLabels(c, groups.ess)
  const sources = sourceList(c, groups)
  if (doc.systemKind === 'off_grid') {
    c.add('standAloneSystem', 'On the exterior of the building or structure, readily visible', 1, { sources })
  } else if (doc.interconnection) {
    const services = doc.equipment.panels.filter((p) => p.role === 'service').map((p) => p.id)
    const producers = doc.equipment.inverters.filter((i) => i.kind !== 'microinverter').map((i) => i.id)
    const tie = doc.interconnection
    const point = tie.method === 'supply_side' ? tie.pointId : tie.panelId
    const places = [...new Set([...services, point, ...producers, ...doc.equipment.batteries.map((b) => b.id)])]
    c.add('sourceDirectory', `At ${places.map((id) => c.named(id)).join(', ')}`, places.length, { sources })
  }
  return c.labels
}
