/**
 * E-603: every label and placard the system needs for the adopted edition: its wording with the
 * values put in, where it goes, how many, its size and its code reference, over as many pages as
 * it takes, with the note on label material (110.21(B)).
 */
import { necRef, type Evaluation } from '../../../shared/electrical'
import { requiredLabels, type RequiredLabel } from '../../../shared/electrical/rules/labels'
import { LABEL_MATERIAL_NOTE } from '../../../shared/electrical/tables/required-labels'
import { text, wrap } from '../fonts'
import type { DrawItem, Sheet } from '../model'
import { frameSheet, type PlanSetContext } from './frame'
import { pagedSheetId, paginateTable, type TableColumn, type TableRow } from './table'

const COLUMNS: TableColumn[] = [
  { header: '#', weight: 2 }, { header: 'Label text (signal word, title, wording with values)', weight: 34 },
  { header: 'Where it goes', weight: 24 }, { header: 'Qty', weight: 3 }, { header: 'Size', weight: 6 }, { header: 'Code reference', weight: 9 },
]

/** The whole wording of a label on one line: signal word, title, body. */
const labelWording = (l: RequiredLabel): string => [l.signalWord, l.title, l.text].filter((p) => p !== null && p !== '').join(' \u2013 ')

const sizeText = (l: RequiredLabel) =>
  `${l.sizeIn.width} \u00d7 ${l.sizeIn.height} in${l.letterHeightIn ? `; letters \u2265 ${l.letterHeightIn.title} in` : ''}${l.stock ? `; ${l.stock}` : ''}`

function rows(labels: RequiredLabel[]): TableRow[] {
  return labels.map((l) => ({
    cells: [String(l.number), labelWording(l) + (l.wordingOurs ? ' (wording ours; the code sets what it must say)' : ''), l.location, String(l.quantity), sizeText(l), l.reference],
    bold: l.missing.length > 0,
  }))
}

/** The section a label cites, without its "NEC <edition>" prefix. */
const citedSection = (l: RequiredLabel) => l.reference.replace(/^NEC \d{4} /, '')

/** One row per section the jurisdiction profile requires a label for, with the labels above that answer it. */
function ahjRows(ctx: PlanSetContext, labels: RequiredLabel[]): TableRow[] {
  if (ctx.ahj.requiredLabelSections.length === 0) return []
  return [
    { heading: `Labels ${ctx.doc.project.jurisdiction} requires on every job` },
    ...ctx.ahj.requiredLabelSections.map((section) => {
      const answering = labels.filter((l) => citedSection(l).startsWith(section))
      return answering.length > 0
        ? { cells: ['\u2014', `Section ${section}: see label ${answering.map((l) => `#${l.number}`).join(', ')} above.`, '', '', '', section] }
        : { cells: ['\u2014', `Section ${section}: no label of this system answers to it in the adopted edition; ask ${ctx.doc.project.jurisdiction} what it must say and where.`, 'As the AHJ directs', '', '', section], bold: true }
    }),
  ]
}

/** The E-603 pages: `E-603`, or `E-603.1` … `E-603.n` when the labels run over several. */
export function labelSheets(ctx: PlanSetContext, evaluation: Evaluation): Sheet[] {
  const labels = requiredLabels(ctx.doc, evaluation)
  const edition = evaluation.edition ?? ctx.doc.codeBasis.necEdition
  const probe = frameSheet(ctx, 'E-603', 'Labels and placards', '')
  const large = probe.widthPt > 2000
  const size = large ? 7.5 : 6.5
  const noteLines = wrap(`LABEL MATERIAL (${necRef(edition, LABEL_MATERIAL_NOTE.reference)}): ${LABEL_MATERIAL_NOTE.text} Sizes are common practice; printable copies are in labels.pdf.`, size, 'regular', probe.content.width)
  const noteHeight = (noteLines.length + 1) * size * 1.3
  const content = { ...probe.content, y: probe.content.y + 14, height: probe.content.height - 14 - noteHeight }
  const all = [...rows(labels), ...ahjRows(ctx, labels)]
  const pages = paginateTable(COLUMNS, all, content, { size, maxLines: 8 })
  const total = labels.reduce((t, l) => t + l.quantity, 0)
  const missing = labels.filter((l) => l.missing.length > 0).length
  return pages.map((page, k) => {
    const id = pagedSheetId('E-603', k, pages.length)
    const frame = frameSheet(ctx, id, 'Labels and placards', `page ${k + 1} of ${pages.length}`)
    const heading = `REQUIRED LABELS AND PLACARDS \u2014 NEC ${edition} \u2014 ${labels.length} entries, ${total} labels in all` +
      (missing > 0 ? ` \u2014 ${missing} WITH VALUES NOT COMPUTED (bold rows): correct the design` : '')
    const top = content.y + page.height + size * 1.6
    const note: DrawItem[] = noteLines.map((line, n) => text(line, frame.content.x, top + n * size * 1.3, { size }))
    return {
      id, title: 'Labels and placards', widthPt: frame.widthPt, heightPt: frame.heightPt,
      items: [...frame.items, text(heading, frame.content.x, frame.content.y + 8, { size: 8, weight: 'bold' }, frame.content.width), ...page.items, ...note],
    }
  })
}
