/**
 * G-001 cover: project and site, the system summary from the engine, scope of work, code basis and
 * design temperatures, the index of every page of the set, and the general notes.
 */
import { fmt, type AnyDerived, type Evaluation } from '../../../shared/electrical'
import type { DesignDocument, SystemKind } from '../../../shared/schemas/design'
import { text } from '../fonts'
import type { Box, DrawItem, Sheet } from '../model'
import { notesBlock, notesFromTemplate, notesHeight } from '../notes'
import { frameSheet, type PlanSetContext } from './frame'
import { layoutTable, type TableColumn, type TableRow } from './table'

export interface SheetIndexEntry { id: string; title: string }

const SYSTEM_WORDS: Record<SystemKind, string> = {
  grid_tied: 'grid-tied PV system',
  grid_tied_storage: 'grid-tied PV system with battery energy storage',
  off_grid: 'stand-alone (off-grid) PV system with battery storage',
  ground_mount_farm: 'ground-mounted PV generating system',
}

const GAP = 14
const KEY_VALUE: TableColumn[] = [{ header: 'Item', weight: 2 }, { header: 'Value', weight: 3 }]
const INDEX_COLUMNS: TableColumn[] = [{ header: 'Sheet', weight: 3 }, { header: 'Title', weight: 5 }]

/** "3 × Name, 1 × Other": names with how often they occur. */
function counted(entries: ReadonlyArray<{ name: string; count: number }>): string {
  const totals = new Map<string, number>()
  for (const e of entries) totals.set(e.name, (totals.get(e.name) ?? 0) + e.count)
  return [...totals].map(([name, n]) => `${n} \u00d7 ${name}`).join(', ')
}

/** The engine's summary value by key suffix, printed as the calculation sheet prints it. */
function summaryValue(evaluation: Evaluation, name: string): AnyDerived | undefined {
  return evaluation.summary.find((d) => d.key === `summary.${name}`)
}
const printed = (d: AnyDerived | undefined, decimals = 2) =>
  d === undefined ? 'not computed' : typeof d.value === 'boolean' ? (d.value ? 'yes' : 'no') : fmt(d.value, decimals)

function interconnectionWords(doc: DesignDocument): string {
  const tie = doc.interconnection
  if (tie === null) return ''
  const nameOf = (id: string) => [...doc.equipment.panels, ...doc.equipment.pointsOfInterconnection].find((p) => p.id === id)?.name ?? id
  switch (tie.method) {
    case 'load_side_breaker': return `load-side connection through a backfed breaker in the ${nameOf(tie.panelId)}`
    case 'main_breaker_derate': return `load-side connection in the ${nameOf(tie.panelId)}, main breaker derated to ${fmt(tie.deratedMainBreakerA, 0)} A`
    case 'supply_side': return `supply-side connection at the ${nameOf(tie.pointId)}`
  }
}

function inverterWords(doc: DesignDocument): string {
  const micro = new Map<string, number>()
  for (const b of doc.topology.microBranches) micro.set(b.inverterId, (micro.get(b.inverterId) ?? 0) + b.units)
  const parts = [
    counted(doc.equipment.inverters.map((inv) => ({ name: inv.name, count: inv.kind === 'microinverter' ? micro.get(inv.id) ?? 0 : 1 }))),
    counted(doc.equipment.chargeControllers.map((c) => ({ name: c.name, count: 1 }))),
  ].filter((s) => s !== '')
  return parts.length === 0 ? 'none' : parts.join('; ')
}

/** Scope-of-work paragraphs; every figure is the engine's summary value. */
function scopeOfWork(doc: DesignDocument, evaluation: Evaluation): string[] {
  const p = doc.project
  const moduleTypes = new Set(doc.topology.arrays.map((a) => a.moduleId))
  return notesFromTemplate('scope-of-work', {
    systemDescription: SYSTEM_WORDS[doc.systemKind], dcKw: printed(summaryValue(evaluation, 'dcKw'), 3), acKw: printed(summaryValue(evaluation, 'acKw'), 3),
    siteAddress: p.siteAddress, city: p.city, owner: p.owner,
    moduleCount: printed(summaryValue(evaluation, 'modules'), 0), moduleNames: doc.equipment.modules.filter((m) => moduleTypes.has(m.id)).map((m) => m.name).join(', '),
    arrayCount: doc.topology.arrays.length, strings: summaryValue(evaluation, 'strings')?.value || 0, microBranches: summaryValue(evaluation, 'microBranches')?.value || 0,
    inverterDescription: inverterWords(doc),
    storageKwh: (summaryValue(evaluation, 'storageKwh')?.value || 0) === 0 ? '' : printed(summaryValue(evaluation, 'storageKwh'), 1),
    batteryNames: counted(doc.equipment.batteries.map((b) => ({ name: b.name, count: 1 }))),
    interconnection: interconnectionWords(doc),
    transformers: counted(doc.equipment.transformers.map((t) => ({ name: `${t.name} (${fmt(t.kva)} kVA, ${fmt(t.primaryVoltageV)} V / ${fmt(t.secondaryVoltageV)} V)`, count: 1 }))),
  })
}

function generalNotes(doc: DesignDocument): string[] {
  return notesFromTemplate('general-notes', {
    edition: doc.codeBasis.necEdition, jurisdiction: doc.project.jurisdiction, utility: doc.project.utility,
    designLowC: doc.codeBasis.designLowC, designHighC: doc.codeBasis.designHighC,
    utilityTied: doc.interconnection !== null, storage: doc.equipment.batteries.length > 0,
  })
}

function projectRows(ctx: PlanSetContext): TableRow[] {
  const p = ctx.doc.project
  return [
    ['Project', p.name], ['Project code', p.code], ['Owner', p.owner], ['Site', `${p.siteAddress}, ${p.city}`],
    ...(p.latitude !== null && p.longitude !== null ? [['Coordinates', `${fmt(p.latitude, 5)}, ${fmt(p.longitude, 5)}`]] : []),
    ['Authority having jurisdiction', p.jurisdiction], ['Utility', p.utility],
    ['Occupancy', p.occupancy === 'one_two_family_dwelling' ? 'One- or two-family dwelling' : 'Other than a dwelling'],
    ['Installer', p.installer], ['Prepared by', ctx.preparedBy],
  ].map((cells) => ({ cells }))
}

/** The summary the engine computed, each row with its unit; counts of zero (no storage, no branches) left out. */
function summaryRows(evaluation: Evaluation, doc: DesignDocument): TableRow[] {
  const rows: TableRow[] = [{ cells: ['System', SYSTEM_WORDS[doc.systemKind]] }]
  for (const d of evaluation.summary) {
    if (typeof d.value === 'number' && d.value === 0 && d.unit !== 'kW') continue
    const decimals = d.unit === 'kW' ? 3 : 2
    rows.push({ cells: [d.label, `${printed(d, decimals)}${d.unit === '-' ? '' : ` ${d.unit}`}`] })
  }
  const used = new Set(doc.topology.arrays.map((a) => a.moduleId))
  rows.push({ cells: ['Module', doc.equipment.modules.filter((m) => used.has(m.id)).map((m) => `${m.name} (${fmt(m.pmaxW)} W)`).join(', ')] })
  rows.push({ cells: ['Power conversion', inverterWords(doc)] })
  return rows
}

function codeBasisRows(doc: DesignDocument): TableRow[] {
  const b = doc.codeBasis
  const rows: TableRow[] = [
    ['Electrical code', `NFPA 70 (NEC) ${b.necEdition}, as adopted by ${doc.project.jurisdiction} with its local amendments`],
    ['Design low temperature', `${fmt(b.designLowC, 1)} \u00b0C (extreme annual mean minimum)`],
    ['Design high temperature', `${fmt(b.designHighC, 1)} \u00b0C (2 % annual design dry bulb)`],
    ['Cell temperature rise', `${fmt(b.cellTemperatureRiseC, 1)} \u00b0C over ambient`],
    ['Voltage-drop targets', `PV DC ${fmt(b.voltageDropLimits.pvDcPercent)} %, any circuit ${fmt(b.voltageDropLimits.anyCircuitPercent)} %, total ${fmt(b.voltageDropLimits.totalPercent)} %`],
  ].map((cells) => ({ cells }))
  if (b.overrideReason !== null) rows.push({ cells: ['Departure from the jurisdiction profile', b.overrideReason] })
  return rows
}

/** A heading and a table stacked from `top`; returns the items and the y below. */
function titledTable(title: string, columns: TableColumn[], rows: TableRow[], x: number, top: number, width: number, height: number, size: number) {
  const page = layoutTable(columns, rows, 0, { x, y: top + 12, width, height: height - 12 }, { size, maxLines: 4 })
  return { items: [text(title.toUpperCase(), x, top + 8, { size: size + 0.5, weight: 'bold' }, width), ...page.items], bottom: top + 12 + page.height, complete: page.rows === rows.length }
}

/** Runs of parts of one sheet (E-602.1 … E-602.40) as one row each: "E-602.1 – E-602.40". */
function compactIndex(index: readonly SheetIndexEntry[]): TableRow[] {
  const rows: TableRow[] = []
  for (let i = 0; i < index.length;) {
    const base = index[i]!.id.split('.')[0]
    let j = i
    while (j + 1 < index.length && index[j + 1]!.title === index[i]!.title && index[j + 1]!.id.split('.')[0] === base) j++
    rows.push(j === i ? { cells: [index[i]!.id, index[i]!.title] } : { cells: [`${index[i]!.id} – ${index[j]!.id}`, `${index[i]!.title} (${j - i + 1} pages)`] })
    i = j + 1
  }
  return rows
}

/**
 * The sheet index in as many side-by-side columns of `box` as it needs; a set too long to list
 * page by page lists the parts of each sheet as one range.
 */
function sheetIndex(index: readonly SheetIndexEntry[], box: Box, size: number): DrawItem[] {
  const tableBox = { ...box, y: box.y + 12, height: box.height - 12 }
  const attempt = (rows: TableRow[], columns: number) => {
    const width = (tableBox.width - (columns - 1) * 6) / columns
    const items: DrawItem[] = []
    let start = 0
    for (let c = 0; c < columns && start < rows.length; c++) {
      const page = layoutTable(INDEX_COLUMNS, rows, start, { ...tableBox, x: tableBox.x + c * (width + 6), width }, { size, maxLines: 2 })
      items.push(...page.items)
      start += page.rows
    }
    return start >= rows.length ? items : null
  }
  const full: TableRow[] = index.map((s) => ({ cells: [s.id, s.title] }))
  const items = attempt(full, 1) ?? attempt(full, 2) ?? attempt(compactIndex(index), 1) ?? attempt(compactIndex(index), 2) ?? attempt(compactIndex(index), 3) ?? []
  return [text(`SHEET INDEX (${index.length} pages)`, box.x, box.y + 8, { size: size + 0.5, weight: 'bold' }, box.width), ...items]
}

/** The G-001 cover sheet; `index` lists every page of the set in order, this one included. */
export function coverSheet(ctx: PlanSetContext, evaluation: Evaluation, index: readonly SheetIndexEntry[]): Sheet {
  const frame = frameSheet(ctx, 'G-001', 'Cover sheet', '')
  const c = frame.content
  const large = frame.widthPt > 2000
  // read at arm's length: a size up from the schedules' type
  const size = large ? 9 : 7.5
  const titleSize = large ? 22 : 15
  const { doc } = ctx
  const items: DrawItem[] = [...frame.items]
  items.push(text(doc.project.name, c.x, c.y + titleSize, { size: titleSize, weight: 'bold' }, c.width))
  items.push(text(`Permit plan set \u2014 ${SYSTEM_WORDS[doc.systemKind]} \u2014 ${doc.project.siteAddress}, ${doc.project.city}`, c.x, c.y + titleSize + size * 2.2, { size: size + 1.5 }, c.width))
  const top = c.y + titleSize + size * 2.2 + GAP
  const height = c.y + c.height - top
  const widths = [0.36, 0.37, 0.27].map((f) => f * (c.width - 2 * GAP))
  const lefts = [c.x, c.x + widths[0]! + GAP, c.x + widths[0]! + widths[1]! + 2 * GAP]

  // column 1: project, system summary, code basis
  let y = top
  for (const [title, rows] of [['Project', projectRows(ctx)], ['System summary', summaryRows(evaluation, doc)], ['Code basis and design conditions', codeBasisRows(doc)]] as const) {
    const block = titledTable(title, KEY_VALUE, [...rows], lefts[0]!, y, widths[0]!, top + height - y, size)
    items.push(...block.items)
    y = block.bottom + GAP
  }

  // column 2: scope of work, then the general notes
  const style = { size, numbered: false }
  const scope = scopeOfWork(doc, evaluation)
  items.push(...notesBlock('Scope of work', scope, { x: lefts[1]!, y: top, width: widths[1]!, height }, style))
  const notesTop = top + notesHeight(scope, widths[1]!, style) + GAP
  const general = generalNotes(doc)
  items.push(...notesBlock('General notes', general, { x: lefts[1]!, y: notesTop, width: widths[1]!, height: top + height - notesTop }, { size, numbered: true }))
  if (ctx.ahj.notes.length > 0) {
    // the profile's own notes, as the AHJ wrote them (they carry their own numbering, if any)
    const ahjTop = notesTop + notesHeight(general, widths[1]!, { size, numbered: true }) + GAP
    items.push(...notesBlock(`Notes required by ${doc.project.jurisdiction}`, ctx.ahj.notes, { x: lefts[1]!, y: ahjTop, width: widths[1]!, height: top + height - ahjTop }, style))
  }

  // column 3: the sheet index
  items.push(...sheetIndex(index, { x: lefts[2]!, y: top, width: widths[2]!, height }, size))
  return { id: 'G-001', title: 'Cover sheet', widthPt: frame.widthPt, heightPt: frame.heightPt, items }
}
