/**
 * labels.pdf: every label of E-603 drawn at its printed size, as many copies as the system needs,
 * on US Letter pages with cut marks, the signal word reversed out of a black band with the safety
 * alert symbol (ANSI Z535.4), and a foot line with the project code and the caution. Built from
 * drawing-model items and `sheetsToPdf`, so it stays vector with the embedded Open Sans.
 */
import { SAFETY_CAUTION, type Evaluation } from '../../shared/electrical'
import { requiredLabels, type RequiredLabel } from '../../shared/electrical/rules/labels'
import { lineHeight, text, textWidth, wrap } from './fonts'
import type { DrawItem, Sheet } from './model'
import { sheetsToPdf } from './pdf'
import type { PlanSetContext } from './sheets/frame'

const PT_PER_IN = 72
/** US Letter, portrait [pt]. */
const PAGE = { width: 8.5 * PT_PER_IN, height: 11 * PT_PER_IN }
const MARGIN = 0.5 * PT_PER_IN
/** Space between labels, room for the cut marks and the caption [pt]. */
const GAP = 0.3 * PT_PER_IN
const HEAD = 30
const FOOT_SIZE = 6
/** Cut marks start this far from the corner and run this long [pt]. */
const MARK_OFFSET = 3
const MARK_LENGTH = 7
const PAD = 6
const BAND = 0.34 * PT_PER_IN
const BAND_SIZE = 13
/** Open Sans capital height (OS/2 sCapHeight 1462 / 2048 em): converts a code letter height to a font size. */
const CAP_HEIGHT_EM = 0.714
/** Font sizes tried for a label without code letter heights, largest first [pt]. // common practice, no source */
const BODY_SIZES = [14, 13, 12, 11, 10, 9, 8, 7]

interface LabelLayout { widthPt: number; heightPt: number; titleSize: number; bodySize: number; titleLines: string[]; bodyLines: string[] }

function contentHeight(l: RequiredLabel, titleLines: string[], bodyLines: string[], titleSize: number, bodySize: number): number {
  const band = l.signalWord === null ? 0 : BAND
  const gap = titleLines.length > 0 && bodyLines.length > 0 ? bodySize * 0.5 : 0
  return 2 * PAD + band + titleLines.length * lineHeight(titleSize) + gap + bodyLines.length * lineHeight(bodySize)
}

/** Font sizes and lines of one label; it grows taller than its nominal size only when the text needs it. */
function layoutLabel(l: RequiredLabel): LabelLayout {
  const widthPt = Math.min(l.sizeIn.width * PT_PER_IN, PAGE.width - 2 * MARGIN)
  const nominal = l.sizeIn.height * PT_PER_IN
  const inner = widthPt - 2 * PAD
  const lines = (titleSize: number, bodySize: number) => ({
    titleLines: l.title === null ? [] : wrap(l.title, titleSize, 'bold', inner),
    bodyLines: l.text === '' ? [] : wrap(l.text, bodySize, 'regular', inner),
  })
  const sized = (titleSize: number, bodySize: number): LabelLayout => {
    const { titleLines, bodyLines } = lines(titleSize, bodySize)
    const heightPt = Math.max(nominal, contentHeight(l, titleLines, bodyLines, titleSize, bodySize))
    return { widthPt, heightPt, titleSize, bodySize, titleLines, bodyLines }
  }
  // Code letter heights are minimums: never shrink below them.
  if (l.letterHeightIn) return sized((l.letterHeightIn.title * PT_PER_IN) / CAP_HEIGHT_EM, (l.letterHeightIn.text * PT_PER_IN) / CAP_HEIGHT_EM)
  for (const size of BODY_SIZES) {
    const layout = sized(size * 1.15, size)
    if (layout.heightPt <= nominal) return layout
  }
  const smallest = BODY_SIZES[BODY_SIZES.length - 1]!
  return sized(smallest * 1.15, smallest)
}

/** The safety alert symbol: a white triangle with a black exclamation mark, `h` high, left edge at x. */
function alertSymbol(x: number, baseline: number, h: number): DrawItem[] {
  const w = h * 1.15
  const top = baseline - h
  return [
    { kind: 'path', d: `M ${x + w / 2} ${top} L ${x + w} ${baseline} L ${x} ${baseline} Z`, fill: 'white', strokeWidth: 0 },
    text('!', x + w / 2, baseline - h * 0.1, { size: h * 0.78, weight: 'bold', anchor: 'middle' }),
  ]
}

/** One copy of a label with its top-left corner at (x, y). */
function drawLabel(l: RequiredLabel, layout: LabelLayout, x: number, y: number): DrawItem[] {
  const { widthPt, heightPt } = layout
  const items: DrawItem[] = [{ kind: 'rect', box: { x, y, width: widthPt, height: heightPt }, strokeWidth: 0.75 }]
  let top = y + PAD
  if (l.signalWord !== null) {
    items.push({ kind: 'rect', box: { x: x + PAD, y: top, width: widthPt - 2 * PAD, height: BAND }, fill: 'black', strokeWidth: 0 })
    const symbolH = BAND_SIZE * 0.95
    const wordW = textWidth(l.signalWord, BAND_SIZE, 'bold')
    const total = symbolH * 1.15 + 5 + wordW
    const left = x + widthPt / 2 - total / 2
    const baseline = top + BAND / 2 + BAND_SIZE * 0.36
    items.push(...alertSymbol(left, baseline, symbolH), { ...text(l.signalWord, left + symbolH * 1.15 + 5, baseline, { size: BAND_SIZE, weight: 'bold' }), fill: 'white' })
    top += BAND
  }
  // Text block centred in the space left under the band.
  const block = contentHeight(l, layout.titleLines, layout.bodyLines, layout.titleSize, layout.bodySize) - 2 * PAD - (l.signalWord === null ? 0 : BAND)
  let cursor = top + (y + heightPt - PAD - top - block) / 2
  const centre = x + widthPt / 2
  const put = (lines: string[], size: number, weight: 'regular' | 'bold') => {
    for (const line of lines) {
      cursor += lineHeight(size)
      items.push(text(line, centre, cursor - size * 0.293, { size, weight, anchor: 'middle' }))
    }
  }
  put(layout.titleLines, layout.titleSize, 'bold')
  if (layout.titleLines.length > 0 && layout.bodyLines.length > 0) cursor += layout.bodySize * 0.5
  put(layout.bodyLines, layout.bodySize, 'regular')
  return items
}

/** Corner cut marks just outside the label's edge. */
function cutMarks(x: number, y: number, w: number, h: number): DrawItem[] {
  const marks: DrawItem[] = []
  for (const [cx, sx] of [[x, -1], [x + w, 1]] as const) {
    for (const [cy, sy] of [[y, -1], [y + h, 1]] as const) {
      marks.push(
        { kind: 'polyline', points: [{ x: cx + sx * MARK_OFFSET, y: cy }, { x: cx + sx * (MARK_OFFSET + MARK_LENGTH), y: cy }], strokeWidth: 0.4 },
        { kind: 'polyline', points: [{ x: cx, y: cy + sy * MARK_OFFSET }, { x: cx, y: cy + sy * (MARK_OFFSET + MARK_LENGTH) }], strokeWidth: 0.4 },
      )
    }
  }
  return marks
}

interface Placed { label: RequiredLabel; layout: LabelLayout; copy: number; x: number; y: number }

/** Shelf packing: labels left to right in rows, rows top to bottom, a new page when full. */
function placeCopies(labels: RequiredLabel[], footHeight: number): Placed[][] {
  const pages: Placed[][] = [[]]
  // the caption under the last row needs the gap too
  const bottom = PAGE.height - MARGIN - footHeight - GAP
  let x = MARGIN
  let y = MARGIN + HEAD
  let rowHeight = 0
  for (const label of labels) {
    const layout = layoutLabel(label)
    for (let copy = 1; copy <= label.quantity; copy++) {
      if (x + layout.widthPt > PAGE.width - MARGIN + 0.01) {
        x = MARGIN
        y += rowHeight + GAP
        rowHeight = 0
      }
      if (y + layout.heightPt > bottom + 0.01 && pages[pages.length - 1]!.length > 0) {
        pages.push([])
        x = MARGIN
        y = MARGIN + HEAD
        rowHeight = 0
      }
      pages[pages.length - 1]!.push({ label, layout, copy, x, y })
      x += layout.widthPt + GAP
      rowHeight = Math.max(rowHeight, layout.heightPt)
    }
  }
  return pages
}

/** The label pages as drawing-model sheets (`LBL-1` …), for the PDF and for checks. */
export function labelPages(ctx: PlanSetContext, evaluation: Evaluation): Sheet[] {
  const labels = requiredLabels(ctx.doc, evaluation)
  const { project } = ctx.doc
  const footWidth = PAGE.width - 2 * MARGIN
  const cautionLines = wrap(SAFETY_CAUTION, FOOT_SIZE, 'regular', footWidth)
  const footHeight = (cautionLines.length + 1) * FOOT_SIZE * 1.3 + 6
  const pages = placeCopies(labels, footHeight)
  return pages.map((placed, k) => {
    const items: DrawItem[] = []
    const edition = evaluation.edition ?? ctx.doc.codeBasis.necEdition
    items.push(text(`Field labels \u2014 ${project.name} (${project.code}) \u2014 NEC ${edition} \u2014 numbers refer to sheet E-603`, MARGIN, MARGIN + 9, { size: 8, weight: 'bold' }, footWidth - 90))
    items.push(text('Print at 100 % (actual size). This bar is 1 in:', MARGIN, MARGIN + 20, { size: 6 }))
    const barX = MARGIN + textWidth('Print at 100 % (actual size). This bar is 1 in:', 6) + 6
    items.push({ kind: 'rect', box: { x: barX, y: MARGIN + 16, width: PT_PER_IN, height: 4 }, fill: 'black', strokeWidth: 0 })
    if (placed.length === 0) items.push(text('No labels: the design has no equipment that needs one. Review E-602.', MARGIN, MARGIN + HEAD + 12, { size: 9 }))
    for (const p of placed) {
      items.push(
        { kind: 'group', role: 'note', data: { label: String(p.label.number), kind: p.label.kind }, items: drawLabel(p.label, p.layout, p.x, p.y) },
        ...cutMarks(p.x, p.y, p.layout.widthPt, p.layout.heightPt),
        text(`#${p.label.number} \u00b7 copy ${p.copy} of ${p.label.quantity} \u00b7 ${p.label.reference}${p.label.stock ? ` \u00b7 print on ${p.label.stock} stock` : ''}`, p.x + MARK_OFFSET + MARK_LENGTH + 3, p.y + p.layout.heightPt + 8, { size: 5 }, p.layout.widthPt - 2 * (MARK_OFFSET + MARK_LENGTH + 3)),
      )
    }
    let y = PAGE.height - MARGIN - footHeight + 6 + FOOT_SIZE
    items.push({ kind: 'polyline', points: [{ x: MARGIN, y: y - FOOT_SIZE - 3 }, { x: PAGE.width - MARGIN, y: y - FOOT_SIZE - 3 }], strokeWidth: 0.4 })
    items.push(text(`${project.code} \u00b7 labels.pdf \u00b7 page ${k + 1} of ${pages.length}`, MARGIN, y, { size: FOOT_SIZE, weight: 'bold' }, footWidth))
    for (const line of cautionLines) {
      y += FOOT_SIZE * 1.3
      items.push(text(line, MARGIN, y, { size: FOOT_SIZE }))
    }
    return { id: `LBL-${k + 1}`, title: 'Printable labels', widthPt: PAGE.width, heightPt: PAGE.height, items }
  })
}

/** labels.pdf: the printable label sheet of a plan set. */
export async function labelsPdf(ctx: PlanSetContext, evaluation: Evaluation): Promise<Uint8Array> {
  const { project } = ctx.doc
  return sheetsToPdf(labelPages(ctx, evaluation), { title: `${project.name} \u2014 field labels`, subject: project.code, author: project.installer })
}
