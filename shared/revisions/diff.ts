/**
 * What changed between two revisions of a design: the project and code basis, equipment ratings,
 * strings, conductors per run, overcurrent devices, the interconnection and the key results.
 * Pure (no I/O), so the server's report, the client's view and the printed narrative agree.
 * Values are compared as printed (with units), so float noise below the printed precision is no change.
 */
import { drawingSizeLabel, fmt, type AnyDerived, type ConductorSize, type Evaluation, type RunResult } from '../electrical'
import type { DesignDocument } from '../schemas/design'
import { DIFF_AREAS, type DiffArea, type DiffChange, type RevisionDiff } from '../schemas/revision'

export interface RevisionSide {
  number: number
  doc: DesignDocument
  evaluation: Evaluation
}

const AREA_TITLES: Record<DiffArea, string> = {
  project: 'Project',
  code_basis: 'Code basis',
  equipment: 'Equipment',
  strings: 'Arrays, strings and branches',
  conductors: 'Conductors and raceways',
  ocpd: 'Overcurrent protection',
  interconnection: 'Interconnection',
  results: 'Calculation results',
}

/** A field compared on both sides: its name in words and how it prints. */
interface Field<T> { label: string; print: (item: T) => string | null }

const num = (value: number | null | undefined, unit: string, decimals = 2): string | null =>
  value === null || value === undefined ? null : `${fmt(value, decimals)}${unit === '' ? '' : ` ${unit}`}`

const conductorSizeLabel = (size: ConductorSize | null): string | null => (size === null ? null : drawingSizeLabel(size))

const numberField = <T>(label: string, get: (item: T) => number | null | undefined, unit: string, decimals = 2): Field<T> =>
  ({ label, print: (item) => num(get(item), unit, decimals) })
const textField = <T>(label: string, get: (item: T) => string | null | undefined): Field<T> =>
  ({ label, print: (item) => get(item) ?? null })

/** Field-by-field changes of one subject present on both sides. */
function changedFields<T>(subject: string, fields: readonly Field<T>[], before: T, after: T): DiffChange[] {
  const out: DiffChange[] = []
  for (const f of fields) {
    const a = f.print(before)
    const b = f.print(after)
    if (a !== b) out.push({ kind: 'changed', subject, field: f.label, before: a ?? 'none', after: b ?? 'none' })
  }
  return out
}

/**
 * Items matched by id: whole items added or removed, and field changes of those on both sides.
 * `describe` is the one-line text of a whole item added or removed.
 */
function diffById<T extends { id: string }>(
  before: readonly T[], after: readonly T[], subjectOf: (item: T) => string, fields: readonly Field<T>[], describe: (item: T) => string,
): DiffChange[] {
  const out: DiffChange[] = []
  const afterById = new Map(after.map((i) => [i.id, i]))
  const beforeIds = new Set(before.map((i) => i.id))
  for (const item of before) {
    const next = afterById.get(item.id)
    if (!next) out.push({ kind: 'removed', subject: subjectOf(item), field: null, before: describe(item), after: null })
    else out.push(...changedFields(subjectOf(next), fields, item, next))
  }
  for (const item of after) {
    if (!beforeIds.has(item.id)) out.push({ kind: 'added', subject: subjectOf(item), field: null, before: null, after: describe(item) })
  }
  return out
}

type Doc = DesignDocument
type Equipment = Doc['equipment']

const PROJECT_FIELDS: Field<Doc['project']>[] = [
  textField('project name', (p) => p.name), textField('project code', (p) => p.code), textField('owner', (p) => p.owner),
  textField('installer', (p) => p.installer), textField('site address', (p) => p.siteAddress), textField('city', (p) => p.city),
  textField('authority having jurisdiction', (p) => p.jurisdiction), textField('utility', (p) => p.utility),
  textField('occupancy', (p) => (p.occupancy === 'one_two_family_dwelling' ? 'one- and two-family dwelling' : 'other')),
]

const CODE_BASIS_FIELDS: Field<Doc['codeBasis']>[] = [
  numberField('NEC edition', (c) => c.necEdition, '', 0),
  numberField('design low temperature', (c) => c.designLowC, '°C', 1),
  numberField('design high temperature', (c) => c.designHighC, '°C', 1),
  numberField('cell temperature rise', (c) => c.cellTemperatureRiseC, '°C', 1),
  numberField('PV DC voltage-drop limit', (c) => c.voltageDropLimits.pvDcPercent, '%'),
  numberField('circuit voltage-drop limit', (c) => c.voltageDropLimits.anyCircuitPercent, '%'),
  numberField('total voltage-drop limit', (c) => c.voltageDropLimits.totalPercent, '%'),
  textField('reason for departing from the jurisdiction profile', (c) => c.overrideReason),
]

const name = <T extends { name: string }>(): Field<T> => textField('name', (i) => i.name)

/** Each equipment list with its word and the ratings a plan reviewer checks. */
const EQUIPMENT_KINDS: { [K in keyof Equipment]: { word: string; fields: Field<Equipment[K][number]>[] } } = {
  modules: { word: 'Module', fields: [name(), numberField('Pmax', (m) => m.pmaxW, 'W'), numberField('Voc', (m) => m.vocV, 'V'), numberField('Vmp', (m) => m.vmpV, 'V'), numberField('Isc', (m) => m.iscA, 'A'), numberField('Imp', (m) => m.impA, 'A'), numberField('maximum series fuse', (m) => m.maxSeriesFuseA, 'A'), numberField('maximum system voltage', (m) => m.maxSystemVoltageV, 'V')] },
  inverters: { word: 'Inverter', fields: [name(), numberField('rated power', (i) => i.ratedPowerW, 'W'), numberField('AC voltage', (i) => i.acVoltageV, 'V'), numberField('phases', (i) => i.phases, ''), numberField('maximum continuous output current', (i) => i.maxContinuousOutputA, 'A'), numberField('maximum DC input voltage', (i) => i.pvInput?.maxDcVoltageV, 'V'), numberField('MPPT window minimum', (i) => i.pvInput?.mpptMinV, 'V'), numberField('MPPT window maximum', (i) => i.pvInput?.mpptMaxV, 'V'), numberField('MPPT inputs', (i) => i.pvInput?.mpptCount, ''), numberField('backup output current', (i) => i.backupOutputA, 'A')] },
  optimizers: { word: 'DC optimiser', fields: [name(), numberField('maximum output voltage', (o) => o.maxOutputVoltageV, 'V'), numberField('maximum output current', (o) => o.maxOutputCurrentA, 'A'), numberField('maximum input voltage', (o) => o.maxInputVoltageV, 'V')] },
  chargeControllers: { word: 'Charge controller', fields: [name(), numberField('maximum PV Voc', (c) => c.maxPvVocV, 'V'), numberField('maximum PV current', (c) => c.maxPvCurrentA, 'A'), numberField('battery voltage', (c) => c.batteryVoltageV, 'V'), numberField('maximum output current', (c) => c.maxOutputCurrentA, 'A')] },
  batteries: { word: 'Battery', fields: [name(), numberField('nominal voltage', (b) => b.nominalVoltageV, 'V'), numberField('capacity', (b) => b.capacityKwh, 'kWh'), numberField('maximum continuous discharge', (b) => b.maxContinuousDischargeA, 'A'), numberField('maximum continuous charge', (b) => b.maxContinuousChargeA, 'A')] },
  combiners: { word: 'Combiner', fields: [name(), textField('current', (c) => c.current.toUpperCase()), numberField('rating', (c) => c.ratingA, 'A'), numberField('maximum voltage', (c) => c.maxVoltageV, 'V'), numberField('inputs', (c) => c.inputs, '')] },
  disconnects: { word: 'Disconnect', fields: [name(), textField('current', (d) => d.current.toUpperCase()), numberField('rating', (d) => d.ratingA, 'A'), numberField('voltage rating', (d) => d.voltageRatingV, 'V'), { label: 'fuses', print: (d) => num(d.fuseA, 'A') ?? 'non-fused' }] },
  transformers: { word: 'Transformer', fields: [name(), numberField('rating', (t) => t.kva, 'kVA'), numberField('primary voltage', (t) => t.primaryVoltageV, 'V'), numberField('secondary voltage', (t) => t.secondaryVoltageV, 'V'), numberField('impedance', (t) => t.impedancePercent, '%')] },
  panels: { word: 'Panelboard', fields: [name(), numberField('busbar rating', (p) => p.busbarA, 'A'), { label: 'main breaker', print: (p) => num(p.mainBreakerA, 'A') ?? 'main lugs only' }, numberField('voltage', (p) => p.voltageV, 'V'), textField('feed', (p) => p.feed)] },
  dcLoads: { word: 'DC load', fields: [name(), numberField('voltage', (l) => l.voltageV, 'V'), numberField('current', (l) => l.currentA, 'A')] },
  pointsOfInterconnection: { word: 'Point of interconnection', fields: [name(), numberField('voltage', (p) => p.voltageV, 'V'), numberField('phases', (p) => p.phases, '')] },
}

function equipmentChanges(a: Equipment, b: Equipment): DiffChange[] {
  return (Object.keys(EQUIPMENT_KINDS) as (keyof Equipment)[]).flatMap((kind) => {
    const { word, fields } = EQUIPMENT_KINDS[kind] as { word: string; fields: Field<{ id: string; name: string }>[] }
    return diffById<{ id: string; name: string }>(a[kind], b[kind], (i) => `${word} ${i.id}`, fields, (i) => i.name)
  })
}

type Topology = Doc['topology']
const ARRAY_FIELDS: Field<Topology['arrays'][number]>[] = [
  name(), textField('module', (a) => a.moduleId), numberField('module count', (a) => a.moduleCount, 'modules', 0),
  textField('mount', (a) => a.mount), numberField('tilt', (a) => a.tiltDeg, '°', 1), numberField('azimuth', (a) => a.azimuthDeg, '°', 1),
]
const stringTarget = (s: Topology['strings'][number]): string | null =>
  s.inverterId ? `${s.inverterId}${s.mppt === null ? '' : ` MPPT ${s.mppt}`}` : s.chargeControllerId
const STRING_FIELDS: Field<Topology['strings'][number]>[] = [
  textField('array', (s) => s.arrayId), numberField('modules in series', (s) => s.modulesInSeries, 'modules', 0),
  textField('inverter / MPPT or charge controller', stringTarget), textField('combiner', (s) => s.combinerId), textField('optimiser', (s) => s.optimizerId),
]
const BRANCH_FIELDS: Field<Topology['microBranches'][number]>[] = [
  textField('array', (m) => m.arrayId), textField('microinverter', (m) => m.inverterId), numberField('units on the branch', (m) => m.units, 'units', 0),
]

function stringChanges(a: Topology, b: Topology): DiffChange[] {
  return [
    ...diffById(a.arrays, b.arrays, (x) => `Array ${x.id}`, ARRAY_FIELDS, (x) => `${x.name}: ${x.moduleCount} × ${x.moduleId}`),
    ...diffById(a.strings, b.strings, (s) => `String ${s.id}`, STRING_FIELDS, (s) => `${s.modulesInSeries} modules in series on array ${s.arrayId}${stringTarget(s) ? `, to ${stringTarget(s)}` : ''}`),
    ...diffById(a.microBranches, b.microBranches, (m) => `Branch ${m.id}`, BRANCH_FIELDS, (m) => `${m.units} units of ${m.inverterId} on array ${m.arrayId}`),
  ]
}

const runSubject = (r: RunResult) => `Run ${r.id} (${r.from} \u2192 ${r.to})`
const conductor = (r: RunResult): string | null => {
  const size = conductorSizeLabel(r.size)
  return size === null ? null : r.parallelSets > 1 ? `${r.parallelSets} sets of ${size}` : size
}
const conduit = (r: RunResult): string => (r.conduitTradeSize === null ? r.method : `${r.conduitTradeSize} in ${r.method}`)
const CONDUCTOR_FIELDS: Field<RunResult>[] = [
  { label: 'conductor size', print: conductor }, textField('material', (r) => r.material), textField('insulation', (r) => r.insulation),
  numberField('length', (r) => r.lengthFt, 'ft', 1), { label: 'raceway', print: conduit }, { label: 'EGC', print: (r) => conductorSizeLabel(r.egcSize) },
]
const OCPD_FIELDS: Field<RunResult>[] = [{ label: 'OCPD rating', print: (r) => num(r.ocpdA, 'A', 0) ?? 'none' }]
const describeRun = (r: RunResult) => [conductor(r) ?? 'conductor not sized', r.material, r.insulation, num(r.lengthFt, 'ft', 1), conduit(r)].join(', ')

const INTERCONNECTION_WORDS = { load_side_breaker: 'load-side breaker', main_breaker_derate: 'load-side breaker with main breaker derate', supply_side: 'supply-side connection' } as const
type Connection = Doc['interconnection']
const INTERCONNECTION_FIELDS: Field<Connection>[] = [
  textField('method', (c) => (c ? INTERCONNECTION_WORDS[c.method] : 'none')),
  textField('panel or point', (c) => (c === null ? null : c.method === 'supply_side' ? c.pointId : c.panelId)),
  textField('breaker position', (c) => (c && c.method !== 'supply_side' ? c.breakerPosition.replaceAll('_', ' ') : null)),
  numberField('sum of breakers', (c) => (c && c.method !== 'supply_side' ? c.sumOfBreakersA : null), 'A', 0),
  numberField('derated main breaker', (c) => (c?.method === 'main_breaker_derate' ? c.deratedMainBreakerA : null), 'A', 0),
  numberField('service rating', (c) => (c?.method === 'supply_side' ? c.serviceRatingA : null), 'A', 0),
]

/** Results a reviewer follows between submittals: the system summary, cold Voc, voltage drop, the interconnection. */
const KEY_RESULT = /^(summary\.|string\.[^.]+\.vocMax$|path\.[^.]+\.voltageDrop$|interconnection\.)/
const STATUS_WORD = { pass: 'pass', warn: 'warning', fail: 'fail', info: 'information only' } as const

const printedResult = (d: AnyDerived): string =>
  typeof d.value === 'boolean' ? (d.value ? 'yes' : 'no') : `${fmt(d.value, 2)}${d.unit === '-' ? '' : ` ${d.unit}`}`

function resultChanges(a: Evaluation, b: Evaluation): DiffChange[] {
  const out: DiffChange[] = []
  if (a.status !== b.status) out.push({ kind: 'changed', subject: 'Overall evaluation', field: 'status', before: STATUS_WORD[a.status], after: STATUS_WORD[b.status] })
  const sectionFields: Field<Evaluation['sections'][number]>[] = [textField('status', (s) => STATUS_WORD[s.status])]
  out.push(...diffById(a.sections, b.sections, (s) => s.title, sectionFields, (s) => STATUS_WORD[s.status]))
  const keyItems = (e: Evaluation) => e.sections.flatMap((s) => s.items).concat(e.summary).filter((d) => KEY_RESULT.test(d.key))
  const byKey = (e: Evaluation) => [...new Map(keyItems(e).map((d) => [d.key, { ...d, id: d.key }])).values()]
  out.push(...diffById(byKey(a), byKey(b), (d) => d.label, [{ label: 'value', print: printedResult }], printedResult))
  const runsB = new Map(b.runs.map((r) => [r.id, r]))
  for (const r of a.runs) {
    const next = runsB.get(r.id)
    if (next) out.push(...changedFields(runSubject(next), [numberField<RunResult>('voltage drop', (x) => x.voltageDropPercent, '%')], r, next))
  }
  return out
}

/** The changes from revision `a` to revision `b`, grouped by area, with a summary paragraph. */
export function diffRevisions(a: RevisionSide, b: RevisionSide): RevisionDiff {
  const changes: Record<DiffArea, DiffChange[]> = {
    project: changedFields('Project', PROJECT_FIELDS, a.doc.project, b.doc.project),
    code_basis: changedFields('Code basis', CODE_BASIS_FIELDS, a.doc.codeBasis, b.doc.codeBasis),
    equipment: equipmentChanges(a.doc.equipment, b.doc.equipment),
    strings: stringChanges(a.doc.topology, b.doc.topology),
    conductors: diffById(a.evaluation.runs, b.evaluation.runs, runSubject, CONDUCTOR_FIELDS, describeRun),
    ocpd: diffById(a.evaluation.runs.filter((r) => r.ocpdA !== null), b.evaluation.runs.filter((r) => r.ocpdA !== null), runSubject, OCPD_FIELDS, (r) => num(r.ocpdA, 'A', 0)!),
    interconnection: changedFields('Interconnection', INTERCONNECTION_FIELDS, a.doc.interconnection, b.doc.interconnection),
    results: resultChanges(a.evaluation, b.evaluation),
  }
  const groups = DIFF_AREAS.filter((area) => changes[area].length > 0).map((area) => ({ area, title: AREA_TITLES[area], changes: changes[area] }))
  return { from: a.number, to: b.number, summary: summarise(a.number, b.number, groups), groups }
}

/** One line for a change, as the summary and the narrative print it. */
export function describeChange(c: DiffChange): string {
  if (c.kind === 'added') return `${c.subject} added${c.after ? ` (${c.after})` : ''}`
  if (c.kind === 'removed') return `${c.subject} removed${c.before ? ` (was ${c.before})` : ''}`
  return `${c.subject}: ${c.field} changed from ${c.before} to ${c.after}`
}

/** Areas whose changes the summary names one by one; results follow from them and are only counted. */
const DESIGN_AREAS: ReadonlySet<DiffArea> = new Set(DIFF_AREAS.filter((a) => a !== 'results'))
const NAMED_IN_SUMMARY = 6

function summarise(from: number, to: number, groups: RevisionDiff['groups']): string {
  if (groups.length === 0) return `No changes between revision ${from} and revision ${to}.`
  const design = groups.filter((g) => DESIGN_AREAS.has(g.area)).flatMap((g) => g.changes)
  const results = groups.find((g) => g.area === 'results')?.changes.length ?? 0
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`
  const parts: string[] = []
  if (design.length > 0) {
    const named = design.slice(0, NAMED_IN_SUMMARY).map(describeChange)
    const more = design.length - named.length
    parts.push(`Revision ${to} makes ${plural(design.length, 'design change')} to revision ${from}: ${named.join('; ')}${more > 0 ? `; and ${more} more` : ''}.`)
  } else {
    parts.push(`Revision ${to} makes no design changes to revision ${from}.`)
  }
  if (results > 0) parts.push(`As a result, ${plural(results, 'calculated result')} changed, listed under ${AREA_TITLES.results.toLowerCase()}.`)
  return parts.join(' ')
}
