/**
 * The frame every sheet shares: border, and a title block down the right edge with the project,
 * the preparer, the revision table, an empty box for the reviewer's stamp, the caution and the
 * sheet identifier. Returns the drawing area left for the sheet's content.
 */
import { SAFETY_CAUTION } from '../../../shared/electrical'
import type { DesignDocument } from '../../../shared/schemas/design'
import { text, wrap } from '../fonts'
import type { Box, DrawItem } from '../model'
import { sheetSize, type SheetSizeName } from '../sheet-sizes'

/** One row of the revision table. */
export interface RevisionEntry {
  number: number
  /** ISO date, e.g. 2026-12-01. */
  date: string
  description: string
}

/** What every sheet of one plan set shares. */
export interface PlanSetContext {
  doc: DesignDocument
  size: SheetSizeName
  /** Oldest first; the table prints the latest rows that fit. */
  revisions: readonly RevisionEntry[]
  /** Person who prepared the set, printed with the installer. */
  preparedBy: string
  /** What the jurisdiction profile adds to every set it receives. */
  ahj: AhjRequirements
}

/** From the jurisdiction profile: notes for the cover and the NEC sections whose labels it requires. */
export interface AhjRequirements {
  /** General notes, already filled in for this project; printed after ours on G-001. */
  notes: readonly string[]
  /** Sections such as `690.56(C)`; E-603 shows which label answers each. */
  requiredLabelSections: readonly string[]
}

const MARGIN = 36
const BLOCK_PAD = 6

export interface FramedSheet { widthPt: number; heightPt: number; items: DrawItem[]; content: Box }

/** Lines of wrapped text from a top edge; returns the items and the y below them. */
function paragraph(raw: string, x: number, top: number, width: number, size: number, weight: 'regular' | 'bold', maxLines = 20) {
  const items: DrawItem[] = []
  let y = top
  for (const line of wrap(raw, size, weight, width, maxLines)) {
    y += size * 1.25
    items.push(text(line, x, y - size * 0.28, { size, weight }))
  }
  return { items, bottom: y }
}

export function frameSheet(ctx: PlanSetContext, sheetId: string, sheetTitle: string, pageNote: string): FramedSheet {
  const { widthPt, heightPt } = sheetSize(ctx.size)
  const large = widthPt > 2000
  const blockWidth = large ? 270 : 190
  const scale = large ? 1.3 : 1
  const items: DrawItem[] = []
  const border: Box = { x: MARGIN, y: MARGIN, width: widthPt - 2 * MARGIN, height: heightPt - 2 * MARGIN }
  items.push({ kind: 'rect', box: border, strokeWidth: 1.4 })
  const bx = border.x + border.width - blockWidth
  items.push({ kind: 'polyline', points: [{ x: bx, y: border.y }, { x: bx, y: border.y + border.height }], strokeWidth: 1.2 })
  const inner = blockWidth - 2 * BLOCK_PAD
  const x = bx + BLOCK_PAD
  const rule = (y: number) => items.push({ kind: 'polyline', points: [{ x: bx, y }, { x: bx + blockWidth, y }], strokeWidth: 0.6 })
  const caption = (label: string, y: number) => items.push(text(label.toUpperCase(), x, y + 7 * scale, { size: 5.5 * scale, weight: 'bold' }))

  const p = ctx.doc.project
  let y = border.y + BLOCK_PAD
  caption('Project', y)
  let block = paragraph(p.name, x, y + 10 * scale, inner, 9 * scale, 'bold', 2)
  items.push(...block.items)
  for (const line of [p.siteAddress, p.city, `Owner: ${p.owner}`, `AHJ: ${p.jurisdiction}`, `Utility: ${p.utility}`, `Code basis: NFPA 70 (NEC) ${ctx.doc.codeBasis.necEdition} as adopted`, `Project code: ${p.code}`]) {
    block = paragraph(line, x, block.bottom, inner, 6.5 * scale, 'regular', 2)
    items.push(...block.items)
  }
  y = block.bottom + BLOCK_PAD
  rule(y)
  caption('Prepared by', y + 2)
  block = paragraph(p.installer, x, y + 10 * scale, inner, 7 * scale, 'bold', 2)
  items.push(...block.items)
  block = paragraph(ctx.preparedBy, x, block.bottom, inner, 6.5 * scale, 'regular', 2)
  items.push(...block.items)
  y = block.bottom + BLOCK_PAD
  rule(y)

  // revision table: number, date, description; latest rows that fit
  caption('Revisions', y + 2)
  const rowH = 9 * scale
  const cols = [x, x + 18 * scale, x + 62 * scale]
  y += 11 * scale
  ;['Rev', 'Date', 'Description'].forEach((h, k) => items.push(text(h, cols[k]!, y + 6.5 * scale, { size: 6 * scale, weight: 'bold' })))
  y += rowH
  const shown = ctx.revisions.slice(-5)
  for (const r of shown) {
    items.push(text(String(r.number), cols[0]!, y + 6.5 * scale, { size: 6 * scale }), text(r.date, cols[1]!, y + 6.5 * scale, { size: 6 * scale }))
    items.push(text(r.description, cols[2]!, y + 6.5 * scale, { size: 6 * scale }, bx + blockWidth - BLOCK_PAD - cols[2]!))
    y += rowH
  }
  if (shown.length === 0) {
    items.push(text('not yet issued', cols[0]!, y + 6.5 * scale, { size: 6 * scale }))
    y += rowH
  }
  y += BLOCK_PAD
  rule(y)

  // sheet identifier at the foot; above it the caution, above that the stamp box fills what is left
  const foot = border.y + border.height
  const idSize = 20 * scale
  const idTop = foot - BLOCK_PAD - idSize * 1.2 - 9 * scale * 2.6
  const idItems = [
    text(sheetTitle.toUpperCase(), x, idTop + 9 * scale, { size: 7.5 * scale, weight: 'bold' }, inner),
    text(sheetId, x, idTop + 9 * scale + idSize * 1.15, { size: idSize, weight: 'bold' }),
    text(pageNote, bx + blockWidth - BLOCK_PAD, idTop + 9 * scale + idSize * 1.15, { size: 6.5 * scale, anchor: 'end' }),
  ]
  const caution = wrap(SAFETY_CAUTION, 6.5 * scale, 'bold', inner)
  const cautionTop = idTop - BLOCK_PAD - caution.length * 6.5 * scale * 1.25 - 2
  rule(idTop - 2)
  items.push(...idItems)
  caution.forEach((line, k) => items.push(text(line, x, cautionTop + (k + 1) * 6.5 * scale * 1.25 - 2, { size: 6.5 * scale, weight: 'bold' })))
  rule(cautionTop - BLOCK_PAD / 2)
  const stampTop = y + 2
  const stampBottom = cautionTop - BLOCK_PAD - 12 * scale
  caption("Reviewer's stamp and signature", stampTop)
  const stampHeight = Math.max(40, stampBottom - (stampTop + 10 * scale))
  // marked, so that stamping later finds the box on the published page
  items.push({ kind: 'group', role: 'stamp-box', data: { sheet: sheetId }, items: [{ kind: 'rect', box: { x, y: stampTop + 10 * scale, width: inner, height: stampHeight }, strokeWidth: 0.6, dash: [3, 2] }] })
  items.push(text('Reviewed by: ____________________  Date: __________', x, stampBottom + 9 * scale, { size: 6 * scale }, inner))

  const content: Box = { x: border.x + 12, y: border.y + 12, width: bx - border.x - 24, height: border.height - 24 }
  return { widthPt, heightPt, items: [{ kind: 'group', role: 'frame', data: { sheet: sheetId }, items }], content }
}

