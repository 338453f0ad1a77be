/**
 * E-602: every derivation of the evaluation, section by section: label, formula with the numbers
 * put in, value and unit, code reference, status and message, over as many pages as it takes.
 * Input problems the engine found are listed first.
 */
import { fmt, type AnyDerived, type Evaluation } from '../../../shared/electrical'
import { text } from '../fonts'
import type { Sheet } from '../model'
import { frameSheet, type PlanSetContext } from './frame'
import { pagedSheetId, paginateTable, type TableColumn, type TableRow } from './table'

const COLUMNS: TableColumn[] = [
  { header: 'Step', weight: 14 }, { header: 'Formula with values', weight: 30 }, { header: 'Result', weight: 8 },
  { header: 'Code reference', weight: 11 }, { header: 'Status', weight: 4 }, { header: 'Reason', weight: 22 },
]

const STATUS_WORD = { pass: 'PASS', warn: 'WARN', fail: 'FAIL', info: 'INFO' } as const

/** The printed value: numbers as the engine formats them, booleans as yes / no. */
export const printedValue = (d: AnyDerived): string =>
  typeof d.value === 'boolean' ? (d.value ? 'yes' : 'no') : `${fmt(d.value, 2)}${d.unit === '-' ? '' : ` ${d.unit}`}`

function rows(evaluation: Evaluation): TableRow[] {
  const out: TableRow[] = []
  if (evaluation.issues.length > 0) {
    out.push({ heading: 'Problems with the design input' })
    for (const i of evaluation.issues) out.push({ cells: [i.field, i.message, '', '', i.severity === 'error' ? 'FAIL' : 'WARN', 'Correct the design document; affected results are missing.'] })
  }
  for (const section of evaluation.sections) {
    out.push({ heading: `${section.title} \u2014 ${STATUS_WORD[section.status]}` })
    for (const d of section.items) out.push({ cells: [d.label, d.formula, printedValue(d), d.reference === '' ? '\u2014' : d.reference, STATUS_WORD[d.status], d.message] })
  }
  return out
}

/** The E-602 pages: `E-602`, or `E-602.1` … `E-602.n` when the calculations run over several. */
export function calculationSheets(ctx: PlanSetContext, evaluation: Evaluation): Sheet[] {
  const all = rows(evaluation)
  const probe = frameSheet(ctx, 'E-602', 'Calculations', '')
  const content = { ...probe.content, y: probe.content.y + 14, height: probe.content.height - 14 }
  const style = { size: probe.widthPt > 2000 ? 7.5 : 6.5, maxLines: 4 }
  const pages = paginateTable(COLUMNS, all, content, style)
  return pages.map((page, k) => {
    const id = pagedSheetId('E-602', k, pages.length)
    const frame = frameSheet(ctx, id, 'Calculations', `page ${k + 1} of ${pages.length}`)
    const heading = `NEC ${evaluation.edition ?? ''} CALCULATIONS \u2014 engine ${evaluation.engineVersion} \u2014 overall ${STATUS_WORD[evaluation.status]}`
    return {
      id, title: 'Calculations', widthPt: frame.widthPt, heightPt: frame.heightPt,
      items: [...frame.items, text(heading, frame.content.x, frame.content.y + 8, { size: 8, weight: 'bold' }), ...page.items],
    }
  })
}
