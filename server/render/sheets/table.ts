/**
 * Ruled tables for the schedules and the calculation sheet: cells wrap to a few lines, rows never
 * split, and a table that runs out of room continues on the next page with its header repeated.
 */
import { text, wrap } from '../fonts'
import type { Box, DrawItem } from '../model'

export interface TableColumn { header: string; /** share of the table width */ weight: number }
/** A row of cells, or a heading row spanning every column. */
export type TableRow = { cells: string[]; bold?: boolean } | { heading: string }

export interface TableStyle { size: number; maxLines: number }

const PAD = 2.5

export interface TablePage { items: DrawItem[]; rows: number; height: number }

/** Lays out rows from `start` into `box` until it is full; at least one row goes on every page. */
export function layoutTable(columns: readonly TableColumn[], rows: readonly TableRow[], start: number, box: Box, style: TableStyle): TablePage {
  const total = columns.reduce((t, c) => t + c.weight, 0)
  const widths = columns.map((c) => (c.weight / total) * box.width)
  const lefts = widths.map((_, k) => box.x + widths.slice(0, k).reduce((t, w) => t + w, 0))
  const line = style.size * 1.3
  const items: DrawItem[] = []
  const rule = (y: number, weight = 0.4) => items.push({ kind: 'polyline', points: [{ x: box.x, y }, { x: box.x + box.width, y }], strokeWidth: weight })
  const cellLines = (cells: string[], bold: boolean) => cells.map((c, k) => wrap(c, style.size, bold ? 'bold' : 'regular', widths[k]! - 2 * PAD, style.maxLines))
  const drawRow = (cells: string[][], y: number, bold: boolean) => {
    cells.forEach((lines, k) => lines.forEach((l, n) => {
      if (l !== '') items.push(text(l, lefts[k]! + PAD, y + PAD + (n + 1) * line - style.size * 0.3, { size: style.size, weight: bold ? 'bold' : 'regular' }))
    }))
  }
  const rowHeight = (cells: string[][]) => Math.max(1, ...cells.map((l) => l.length)) * line + 2 * PAD

  const header = cellLines(columns.map((c) => c.header), true)
  const headerHeight = rowHeight(header)
  items.push({ kind: 'rect', box: { x: box.x, y: box.y, width: box.width, height: headerHeight }, fill: 'shade', strokeWidth: 0 })
  drawRow(header, box.y, true)
  let y = box.y + headerHeight
  rule(box.y, 0.8)
  rule(y, 0.8)
  let i = start
  while (i < rows.length) {
    const row = rows[i]!
    if ('heading' in row) {
      const h = line + 2 * PAD
      // a heading never ends a page: keep it with the row that follows
      const next = rows[i + 1]
      const follow = next && !('heading' in next) ? rowHeight(cellLines(next.cells, next.bold ?? false)) : 0
      if (y + h + follow > box.y + box.height + 0.01 && i > start) break
      items.push({ kind: 'rect', box: { x: box.x, y, width: box.width, height: h }, fill: 'shade', strokeWidth: 0 })
      items.push(text(row.heading, box.x + PAD, y + PAD + line - style.size * 0.3, { size: style.size, weight: 'bold' }, box.width - 2 * PAD))
      y += h
    } else {
      const cells = cellLines(row.cells, row.bold ?? false)
      const h = rowHeight(cells)
      if (y + h > box.y + box.height + 0.01 && i > start) break
      drawRow(cells, y, row.bold ?? false)
      y += h
    }
    rule(y)
    i++
  }
  for (const [k, left] of lefts.entries()) {
    if (k > 0) items.push({ kind: 'polyline', points: [{ x: left, y: box.y }, { x: left, y }], strokeWidth: 0.3 })
  }
  items.push({ kind: 'rect', box: { x: box.x, y: box.y, width: box.width, height: y - box.y }, strokeWidth: 0.8 })
  return { items: [{ kind: 'group', role: 'table', data: {}, items }], rows: i - start, height: y - box.y }
}

/** Every page of a table laid into the same box, as many as the rows need (one, when there are none). */
export function paginateTable(columns: readonly TableColumn[], rows: readonly TableRow[], box: Box, style: TableStyle): TablePage[] {
  const pages: TablePage[] = []
  for (let start = 0; start < rows.length || pages.length === 0;) {
    const page = layoutTable(columns, rows, start, box, style)
    pages.push(page)
    start += Math.max(1, page.rows)
  }
  return pages
}

/** `E-602` for a one-page sheet, `E-602.1` … `E-602.n` for its parts. */
export const pagedSheetId = (id: string, k: number, pages: number): string => (pages === 1 ? id : `${id}.${k + 1}`)
