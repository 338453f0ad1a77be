/**
 * The resubmittal narrative for the AHJ: a letter-style introduction from the handlebars template,
 * then every change between two revisions as a table, on framed sheets `RN-1`, `RN-2`, …
 */
import type { RevisionDiff } from '../../shared/schemas/revision'
import { text, wrap } from './fonts'
import type { DrawItem, Sheet } from './model'
import { notesFromTemplate } from './notes'
import { sheetsToPdf } from './pdf'
import { frameSheet, type PlanSetContext } from './sheets/frame'
import { layoutTable, type TableColumn, type TableRow } from './sheets/table'

const TITLE = 'Revision narrative'
const COLUMNS: TableColumn[] = [{ header: 'Item', weight: 26 }, { header: 'Change', weight: 18 }, { header: 'Before', weight: 28 }, { header: 'After', weight: 28 }]
const KIND_WORD = { added: 'added', removed: 'removed', changed: 'changed' } as const

function rows(diff: RevisionDiff): TableRow[] {
  if (diff.groups.length === 0) return [{ cells: ['No changes', '', '', ''] }]
  return diff.groups.flatMap((g): TableRow[] => [
    { heading: `${g.title} (${g.changes.length})` },
    ...g.changes.map((c) => ({ cells: [c.subject, c.field === null ? KIND_WORD[c.kind] : `${c.field} ${KIND_WORD[c.kind]}`, c.before ?? '\u2014', c.after ?? '\u2014'] })),
  ])
}

/** The narrative's sheets: the introduction on the first, the change table over as many as it takes. */
export function narrativeSheets(ctx: PlanSetContext, diff: RevisionDiff): Sheet[] {
  const p = ctx.doc.project
  const paragraphs = notesFromTemplate('resubmittal-narrative', {
    jurisdiction: p.jurisdiction, projectName: p.name, projectCode: p.code, siteAddress: p.siteAddress, city: p.city,
    from: diff.from, to: diff.to, summary: diff.summary, edition: ctx.doc.codeBasis.necEdition, preparedBy: ctx.preparedBy, installer: p.installer,
  })
  const probe = frameSheet(ctx, 'RN-1', TITLE, '')
  const content = probe.content
  const size = probe.widthPt > 2000 ? 10 : 8
  // a letter reads best at about 90 characters a line
  const measure = Math.min(content.width, size * 48)
  const intro: DrawItem[] = [text(`RESUBMITTAL NARRATIVE \u2014 REVISION ${diff.from} TO REVISION ${diff.to}`, content.x, content.y + size * 1.4, { size: size * 1.4, weight: 'bold' }, content.width)]
  let y = content.y + size * 3
  for (const paragraph of paragraphs) {
    for (const line of wrap(paragraph, size, 'regular', measure)) {
      y += size * 1.35
      intro.push(text(line, content.x, y, { size }))
    }
    y += size * 0.7
  }
  const all = rows(diff)
  const style = { size: size - 1, maxLines: 4 }
  const pages: DrawItem[][] = []
  for (let start = 0; start < all.length || pages.length === 0;) {
    const first = pages.length === 0
    const top = first ? y + size : content.y
    const page = layoutTable(COLUMNS, all, start, { x: content.x, y: top, width: content.width, height: content.y + content.height - top }, style)
    pages.push(first ? [...intro, ...page.items] : page.items)
    start += Math.max(1, page.rows)
  }
  return pages.map((items, k) => {
    const id = `RN-${k + 1}`
    const frame = frameSheet(ctx, id, TITLE, `page ${k + 1} of ${pages.length}`)
    return { id, title: TITLE, widthPt: frame.widthPt, heightPt: frame.heightPt, items: [...frame.items, ...items] }
  })
}

export async function revisionNarrativePdf(ctx: PlanSetContext, diff: RevisionDiff): Promise<Uint8Array> {
  const p = ctx.doc.project
  return sheetsToPdf(narrativeSheets(ctx, diff), { title: `${p.name} \u2014 revision narrative, revision ${diff.from} to ${diff.to}`, subject: p.code, author: p.installer })
}
