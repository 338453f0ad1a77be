/**
 * E-601: the single-line diagram with its conductor, conduit and OCPD schedule and general notes.
 * A diagram too large to stay legible on one sheet is split by inverter (or charge controller);
 * shared equipment downstream repeats on each part so every sheet reads from array to grid.
 */
import type { Evaluation } from '../../../shared/electrical'
import { text, wrap } from '../fonts'
import { compactIds, layoutSingleLine, type ScheduleLine, type SingleLineLayout } from '../layout/sld'
import type { Box, DrawItem, Sheet } from '../model'
import { notesFromTemplate } from '../notes'
import { frameSheet, type PlanSetContext } from './frame'
import { layoutTable, type TableColumn, type TableRow } from './table'

/** Smallest scale the diagram is printed at: 7 pt labels stay at least 5.6 pt on paper. */
export const MIN_DIAGRAM_SCALE = 0.8
const MAX_DIAGRAM_SCALE = 1.6
const GAP = 14

const SCHEDULE_COLUMNS: TableColumn[] = [
  { header: 'Tag', weight: 3 }, { header: 'Circuit', weight: 11 }, { header: 'Runs', weight: 12 }, { header: 'From / to', weight: 9 },
  { header: 'Conductors', weight: 16 }, { header: 'EGC', weight: 8 }, { header: 'Raceway and fill', weight: 13 }, { header: 'OCPD', weight: 6 },
  { header: 'Max current', weight: 8 }, { header: 'Length', weight: 7 }, { header: 'Voltage drop', weight: 8 },
]

const scheduleRows = (lines: ScheduleLine[]): TableRow[] => lines.map((l) => ({
  cells: [l.tag, l.circuit, compactIds(l.runIds), l.fromTo, l.conductors, l.egc, l.raceway, l.ocpd, l.maxCurrent, l.length, l.voltageDrop],
}))

interface Arrangement { diagram: Box; schedule: Box; notes: Box; scale: number }

/** Places diagram, schedule and notes in the content area, the schedule beside or below, whichever prints the diagram larger. */
function arrange(content: Box, layout: SingleLineLayout, scheduleHeight: (width: number) => number, notesHeight: (width: number) => number): Arrangement {
  const fit = (box: Box) => Math.min(MAX_DIAGRAM_SCALE, box.width / Math.max(layout.width, 1), box.height / Math.max(layout.height, 1))
  const besideWidth = Math.min(620, content.width * 0.55)
  const beside = (() => {
    const side = { x: content.x + content.width - besideWidth, width: besideWidth }
    const sh = scheduleHeight(besideWidth)
    const nh = notesHeight(besideWidth)
    const diagram = { x: content.x, y: content.y, width: content.width - besideWidth - GAP, height: content.height }
    return { diagram, schedule: { ...side, y: content.y, height: sh }, notes: { ...side, y: content.y + sh + GAP, height: nh }, scale: sh + nh + GAP <= content.height ? fit(diagram) : 0 }
  })()
  const below = (() => {
    const sh = scheduleHeight(content.width)
    const nh = notesHeight(content.width)
    const diagram = { x: content.x, y: content.y, width: content.width, height: content.height - sh - nh - 2 * GAP }
    return {
      diagram, schedule: { x: content.x, y: diagram.y + diagram.height + GAP, width: content.width, height: sh },
      notes: { x: content.x, y: diagram.y + diagram.height + sh + 2 * GAP, width: content.width, height: nh }, scale: diagram.height > 0 ? fit(diagram) : 0,
    }
  })()
  return below.scale >= beside.scale ? below : beside
}

const NOTE_SIZE = 6.5

function notesBlock(notes: string[], box: Box): DrawItem[] {
  const items: DrawItem[] = [text('GENERAL NOTES', box.x, box.y + 8, { size: 7, weight: 'bold' })]
  let y = box.y + 10
  notes.forEach((note, k) => {
    wrap(`${k + 1}. ${note}`, NOTE_SIZE, 'regular', box.width).forEach((line) => {
      y += NOTE_SIZE * 1.3
      items.push(text(line, box.x, y, { size: NOTE_SIZE }))
    })
  })
  return [{ kind: 'group', role: 'note', data: {}, items }]
}
const notesHeightFor = (notes: string[], width: number) =>
  12 + notes.reduce((t, n, k) => t + wrap(`${k + 1}. ${n}`, NOTE_SIZE, 'regular', width).length, 0) * NOTE_SIZE * 1.3

/** Converters (inverters, charge controllers) in the order the diagram meets them. */
function converterIds(ctx: PlanSetContext): string[] {
  const { equipment } = ctx.doc
  return [...equipment.inverters.filter((i) => i.kind !== 'microinverter').map((i) => i.id), ...equipment.chargeControllers.map((c) => c.id)]
}

/** The E-601 sheets of a design: one, or one per part when split. */
export function singleLineSheets(ctx: PlanSetContext, evaluation: Evaluation): Sheet[] {
  const notes = notesFromTemplate('single-line-notes', {
    edition: ctx.doc.codeBasis.necEdition, jurisdiction: ctx.doc.project.jurisdiction, utility: ctx.doc.project.utility,
    designLowC: ctx.doc.codeBasis.designLowC, designHighC: ctx.doc.codeBasis.designHighC, utilityService: ctx.doc.interconnection !== null,
  })
  const probe = frameSheet(ctx, 'E-601', 'Single-line diagram', '')
  // a D-size sheet is read from further away: a larger schedule type
  const tableStyle = { size: probe.widthPt > 2000 ? 7.5 : 6.5, maxLines: 3 }
  const plan = (layout: SingleLineLayout, partNotes: string[]) => {
    const rows = scheduleRows(layout.schedule)
    const tableHeight = (width: number) => layoutTable(SCHEDULE_COLUMNS, rows, 0, { x: 0, y: 0, width, height: Infinity }, tableStyle).height
    return { rows, notes: partNotes, arrangement: arrange(probe.content, layout, tableHeight, (w) => notesHeightFor(partNotes, w)) }
  }

  // split into as few parts as keep the diagram legible
  const converters = converterIds(ctx)
  let parts: { layout: SingleLineLayout; plan: ReturnType<typeof plan> }[] = []
  for (let count = 1; count <= Math.max(1, converters.length); count++) {
    const size = Math.ceil(converters.length / count)
    const chunks = count === 1 ? [undefined] : Array.from({ length: count }, (_, k) => converters.slice(k * size, (k + 1) * size)).filter((c) => c.length > 0)
    parts = chunks.map((chunk, k) => {
      const layout = layoutSingleLine(ctx.doc, evaluation, chunk ? { converterIds: chunk } : {})
      const partNotes = chunk ? [...notes, `Part ${k + 1} of ${chunks.length} of the diagram (${chunk.join(', ')}); equipment shared by several parts is repeated on each.`] : notes
      return { layout, plan: plan(layout, partNotes) }
    })
    if (parts.every((p) => p.plan.arrangement.scale >= MIN_DIAGRAM_SCALE)) break
  }

  return parts.map(({ layout, plan: { rows, notes: partNotes, arrangement } }, k) => {
    const id = parts.length === 1 ? 'E-601' : `E-601.${k + 1}`
    const frame = frameSheet(ctx, id, 'Single-line diagram', parts.length === 1 ? '' : `part ${k + 1} of ${parts.length}`)
    const { diagram, scale } = arrangement
    const dx = diagram.x + (diagram.width - layout.width * scale) / 2
    const dy = diagram.y + Math.max(0, (diagram.height - layout.height * scale) / 2)
    const items: DrawItem[] = [...frame.items, { kind: 'group', role: 'device', data: { diagram: id }, transform: { dx, dy, scale }, items: layout.items }]
    const table = layoutTable(SCHEDULE_COLUMNS, rows, 0, arrangement.schedule, tableStyle)
    items.push(text('CONDUCTOR, CONDUIT AND OCPD SCHEDULE', arrangement.schedule.x, arrangement.schedule.y - 3, { size: 7, weight: 'bold' }), ...table.items)
    items.push(...notesBlock(partNotes, arrangement.notes))
    return { id, title: 'Single-line diagram', widthPt: frame.widthPt, heightPt: frame.heightPt, items }
  })
}
