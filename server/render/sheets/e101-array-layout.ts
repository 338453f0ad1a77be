/**
 * E-101 array layout: one schematic block per array (roof face or ground row) with its modules
 * drawn as rectangles, one row group per string or microinverter branch labelled with its id, the
 * tilt, the azimuth as a compass arrow pointing the way the modules face, and the mount. Blocks are
 * packed left to right, top to bottom; a set too large for one sheet continues on E-101.1, E-101.2 …
 * and an array too long for one sheet continues in a block marked "continued".
 */
import { fmt, type Evaluation } from '../../../shared/electrical'
import type { DesignDocument, PvArray } from '../../../shared/schemas/design'
import { text } from '../fonts'
import type { Box, DrawItem, Sheet } from '../model'
import { notesBlock, notesHeight } from '../notes'
import { frameSheet, type PlanSetContext } from './frame'

/** One row group of an array: a series string or a microinverter branch, with its modules. */
export interface ModuleGroup { id: string; kind: 'string' | 'branch'; modules: number; label: string; /** second label line, e.g. the engine's maximum string voltage */ detail: string }

/** A block of one array placed on a sheet; `part` > 1 continues the array from an earlier block. */
export interface PlacedArrayBlock { arrayId: string; part: number; parts: number; box: Box; groups: ModuleGroup[]; perRow: number }

export interface ArrayLayoutPage { blocks: PlacedArrayBlock[]; content: Box; notes: Box; metrics: Metrics }

const COMPASS_WORDS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW']
/** Compass point of an azimuth (clockwise from north) [°]. */
export const compassPoint = (azimuthDeg: number): string => COMPASS_WORDS[Math.round(azimuthDeg / 45) % 8]!

export interface Metrics { moduleW: number; moduleH: number; gap: number; labelW: number; headerH: number; groupGap: number; pad: number; text: number; compass: number; blockGap: number }

/**
 * Sizes at a module scale; text grows more slowly than the modules so that a small residential
 * array fills the sheet without shouting. `base` is 1.3 on large sheets, read from further away.
 */
function metrics(base: number, zoom: number): Metrics {
  const s = base * zoom
  const t = base * Math.min(zoom, 1.5)
  return { moduleW: 10 * s, moduleH: 16 * s, gap: 1.5 * s, labelW: 62 * t, headerH: 48 * t, groupGap: 4 * s, pad: 6 * t, text: 6.5 * t, compass: 13 * t, blockGap: 16 * t }
}

/** Module scales tried, largest first, until every block fits on one sheet; else 1 over several sheets. */
const ZOOMS = [3, 2.5, 2, 1.6, 1.3]

/** The groups of an array in document order: its strings, then its microinverter branches. */
function groupsOf(doc: DesignDocument, evaluation: Evaluation, array: PvArray): ModuleGroup[] {
  const derived = (key: string) => evaluation.sections.find((s) => s.id === key.split('.').slice(0, 2).join('.'))?.items.find((d) => d.key === key)
  const groups: ModuleGroup[] = doc.topology.strings.filter((s) => s.arrayId === array.id).map((s) => {
    const vocMax = derived(`string.${s.id}.vocMax`)
    return {
      id: s.id, kind: 'string' as const, modules: s.modulesInSeries,
      label: `${s.id}: ${s.modulesInSeries} in series${s.optimizerId !== null ? ', optimizers' : ''}`,
      detail: typeof vocMax?.value === 'number' ? `Voc max ${fmt(vocMax.value, 1)} V` : '',
    }
  })
  for (const b of doc.topology.microBranches.filter((m) => m.arrayId === array.id)) {
    const perUnit = doc.equipment.inverters.find((i) => i.id === b.inverterId)?.modulesPerUnit ?? 1
    groups.push({ id: b.id, kind: 'branch', modules: b.units * perUnit, label: `${b.id}: branch`, detail: `${b.units} microinverters` })
  }
  return groups
}

const noteStyle = (m: Metrics) => ({ size: Math.min(m.text, 8.5), numbered: true })
const MOUNT_WORDS = { roof: 'Roof mount', ground: 'Ground mount' } as const

/** Modules per drawn row of a block: the longest group, limited to what the widest block can hold. */
function modulesPerRow(groups: ModuleGroup[], maxWidth: number, m: Metrics): number {
  const fit = Math.max(1, Math.floor((maxWidth - 2 * m.pad - m.labelW + m.gap) / (m.moduleW + m.gap)))
  return Math.max(1, Math.min(fit, Math.max(1, ...groups.map((g) => g.modules))))
}

/** Rows of modules, or the two label lines where they are taller. */
const groupHeight = (g: ModuleGroup, perRow: number, m: Metrics) => Math.max(Math.ceil(g.modules / perRow) * (m.moduleH + m.gap) - m.gap, m.text * 2.8) + m.groupGap

/** Where every array block goes, sheet by sheet. Pure layout: the test checks these boxes for overlaps. */
export function planArrayLayout(ctx: PlanSetContext, evaluation: Evaluation): ArrayLayoutPage[] {
  const base = frameSheet(ctx, 'E-101', 'Array layout', '').widthPt > 2000 ? 1.3 : 1
  for (const zoom of ZOOMS) {
    const pages = planAt(ctx, evaluation, metrics(base, zoom))
    if (pages.length === 1) return pages
  }
  return planAt(ctx, evaluation, metrics(base, 1))
}

function planAt(ctx: PlanSetContext, evaluation: Evaluation, m: Metrics): ArrayLayoutPage[] {
  const probe = frameSheet(ctx, 'E-101', 'Array layout', '')
  const notes = sheetNotes(ctx.doc)
  const notesH = notesHeight(notes, probe.content.width, noteStyle(m))
  const area: Box = { ...probe.content, y: probe.content.y + 14, height: probe.content.height - 14 - notesH - m.blockGap }
  const notesBox: Box = { x: probe.content.x, y: area.y + area.height + m.blockGap, width: probe.content.width, height: notesH }

  // cut each array into blocks no taller than the area
  const blocks: Omit<PlacedArrayBlock, 'box'>[] = []
  const sizes: { width: number; height: number }[] = []
  for (const array of ctx.doc.topology.arrays) {
    const groups = groupsOf(ctx.doc, evaluation, array)
    const perRow = modulesPerRow(groups, area.width, m)
    const width = 2 * m.pad + m.labelW + perRow * (m.moduleW + m.gap) - m.gap
    const chunks: ModuleGroup[][] = [[]]
    let height = m.headerH
    for (const g of groups) {
      const h = groupHeight(g, perRow, m)
      if (height + h + m.pad > area.height && chunks.at(-1)!.length > 0) {
        chunks.push([])
        height = m.headerH
      }
      chunks.at(-1)!.push(g)
      height += h
    }
    chunks.forEach((chunk, k) => {
      blocks.push({ arrayId: array.id, part: k + 1, parts: chunks.length, groups: chunk, perRow })
      sizes.push({ width: Math.max(width, 150 * (m.text / 6.5)), height: m.headerH + chunk.reduce((t, g) => t + groupHeight(g, perRow, m), 0) + m.pad })
    })
  }

  // shelf packing, left to right then down; a new sheet when the area is full
  const pages: ArrayLayoutPage[] = [{ blocks: [], content: area, notes: notesBox, metrics: m }]
  let x = area.x
  let y = area.y
  let shelf = 0
  blocks.forEach((b, k) => {
    const size = sizes[k]!
    const width = Math.min(size.width, area.width)
    if (x > area.x && x + width > area.x + area.width) {
      x = area.x
      y += shelf + m.blockGap
      shelf = 0
    }
    if (y > area.y && y + size.height > area.y + area.height) {
      pages.push({ blocks: [], content: area, notes: notesBox, metrics: m })
      x = area.x
      y = area.y
      shelf = 0
    }
    pages.at(-1)!.blocks.push({ ...b, box: { x, y, width, height: size.height } })
    x += width + m.blockGap
    shelf = Math.max(shelf, size.height)
  })
  return pages
}

function sheetNotes(doc: DesignDocument): string[] {
  const roof = doc.topology.arrays.some((a) => a.mount === 'roof')
  const ground = doc.topology.arrays.some((a) => a.mount === 'ground')
  return [
    'Schematic, not to scale. Each rectangle is one module; a row group is one series string or microinverter branch, labelled with its id. Module positions on site follow the installer\u2019s field layout.',
    'The arrow in each compass points the way the modules face (azimuth clockwise from true north); tilt is measured from horizontal.',
    ...(roof ? ['Roof access pathways, setbacks from ridges, edges and valleys, and the structural attachment of the racking follow the adopted fire and building codes and the AHJ; confirm them on the structural and site plans before installation.'] : []),
    ...(ground ? ['Ground-mount foundations, row spacing, fencing and working clearances follow the adopted building code, the geotechnical data for the site and the AHJ.'] : []),
  ]
}

/** Compass: circle, north mark, and an arrow from the centre the way the modules face. */
function compass(cx: number, cy: number, r: number, azimuthDeg: number, size: number): DrawItem[] {
  const rad = (azimuthDeg * Math.PI) / 180
  const ux = Math.sin(rad)
  const uy = -Math.cos(rad)
  const tip = { x: cx + ux * r * 0.95, y: cy + uy * r * 0.95 }
  const base = { x: cx + ux * r * 0.45, y: cy + uy * r * 0.45 }
  const side = { x: -uy * r * 0.25, y: ux * r * 0.25 }
  const head = `M ${fmt(tip.x, 2)} ${fmt(tip.y, 2)} L ${fmt(base.x + side.x, 2)} ${fmt(base.y + side.y, 2)} L ${fmt(base.x - side.x, 2)} ${fmt(base.y - side.y, 2)} Z`
  return [
    { kind: 'circle', centre: { x: cx, y: cy }, radius: r, strokeWidth: 0.6 },
    { kind: 'polyline', points: [{ x: cx, y: cy - r }, { x: cx, y: cy - r - 2 }], strokeWidth: 0.6 },
    text('N', cx, cy - r - 3, { size: size * 0.9, weight: 'bold', anchor: 'middle' }),
    { kind: 'polyline', points: [{ x: cx, y: cy }, base], strokeWidth: 1 },
    { kind: 'path', d: head, fill: 'black', strokeWidth: 0 },
  ]
}

function drawBlock(doc: DesignDocument, block: PlacedArrayBlock, m: Metrics): DrawItem {
  const array = doc.topology.arrays.find((a) => a.id === block.arrayId)!
  const module = doc.equipment.modules.find((mod) => mod.id === array.moduleId)
  const { box } = block
    const x = box.x + m.pad
  const compassX = box.x + box.width - m.pad - m.compass
  const textWidth = compassX - m.compass - 4 - x
  const cont = block.parts > 1 ? ` (part ${block.part} of ${block.parts}${block.part > 1 ? ', continued' : ''})` : ''
  const items: DrawItem[] = [
    { kind: 'rect', box, strokeWidth: 0.8 },
    text(`${array.id} \u2014 ${array.name}${cont}`, x, box.y + m.pad + m.text, { size: m.text + 0.5, weight: 'bold' }, textWidth),
    text(`${array.moduleCount} \u00d7 ${module?.name ?? array.moduleId}`, x, box.y + m.pad + m.text * 2.4, { size: m.text }, textWidth),
    text(`${MOUNT_WORDS[array.mount]}, tilt ${fmt(array.tiltDeg, 1)}\u00b0, azimuth ${fmt(array.azimuthDeg, 1)}\u00b0 (${compassPoint(array.azimuthDeg)})`, x, box.y + m.pad + m.text * 3.8, { size: m.text }, textWidth),
    ...compass(compassX, box.y + m.pad + m.text * 1.4 + m.compass, m.compass, array.azimuthDeg, m.text),
  ]
  const { perRow } = block
  let y = box.y + m.headerH
  for (const g of block.groups) {
    items.push(text(g.label, x, y + m.text, { size: m.text }, m.labelW - 4))
    if (g.detail !== '') items.push(text(g.detail, x, y + m.text * 2.4, { size: m.text * 0.9 }, m.labelW - 4))
    for (let k = 0; k < g.modules; k++) {
      const col = k % perRow
      const row = Math.floor(k / perRow)
      items.push({ kind: 'rect', box: { x: x + m.labelW + col * (m.moduleW + m.gap), y: y + row * (m.moduleH + m.gap), width: m.moduleW, height: m.moduleH }, fill: g.kind === 'branch' ? 'shade' : 'none', strokeWidth: 0.5 })
    }
    y += groupHeight(g, perRow, m)
  }
  return { kind: 'group', role: 'device', data: { array: block.arrayId, part: String(block.part) }, items }
}

/** The E-101 pages: `E-101`, or `E-101.1` … when the arrays need several sheets. */
export function arrayLayoutSheets(ctx: PlanSetContext, evaluation: Evaluation): Sheet[] {
  const pages = planArrayLayout(ctx, evaluation)
  const notes = sheetNotes(ctx.doc)
  return pages.map((page, k) => {
    const id = pages.length === 1 ? 'E-101' : `E-101.${k + 1}`
    const frame = frameSheet(ctx, id, 'Array layout', pages.length === 1 ? '' : `page ${k + 1} of ${pages.length}`)
    const m = page.metrics
    const modules = ctx.doc.topology.arrays.reduce((t, a) => t + a.moduleCount, 0)
    const heading = `ARRAY LAYOUT (SCHEMATIC, NOT TO SCALE) \u2014 ${ctx.doc.topology.arrays.length} array(s), ${modules} modules`
    return {
      id, title: 'Array layout', widthPt: frame.widthPt, heightPt: frame.heightPt,
      items: [
        ...frame.items,
        text(heading, frame.content.x, frame.content.y + 8, { size: 8, weight: 'bold' }, frame.content.width),
        ...page.blocks.map((b) => drawBlock(ctx.doc, b, m)),
        ...notesBlock('Array layout notes', notes, page.notes, noteStyle(m)),
      ],
    }
  })
}
