/**
 * SVG renderer: draws a sheet's drawing model with @svgdotjs/svg.js on svgdom (a DOM for Node).
 * svg.js sets text and attributes through the DOM, so user text is escaped by the serialiser.
 */
import { SVG, registerWindow, type Container, type Svg } from '@svgdotjs/svg.js'
import { createSVGDocument, createSVGWindow } from 'svgdom'
import type { DrawItem, Sheet } from './model'

const FILL = { none: 'none', black: '#000', white: '#fff', shade: '#e8e8e8' } as const
const round = (n: number) => Math.round(n * 100) / 100

function stroke(item: { strokeWidth?: number; dash?: number[] }) {
  const attrs: Record<string, string | number> = { stroke: item.strokeWidth === 0 ? 'none' : '#000', 'stroke-width': item.strokeWidth ?? 0.9 }
  if (item.dash) attrs['stroke-dasharray'] = item.dash.join(' ')
  return attrs
}

function draw(parent: Container, item: DrawItem): void {
  switch (item.kind) {
    case 'polyline':
      parent.polyline(item.points.map((p) => [round(p.x), round(p.y)] as [number, number])).attr({ fill: 'none', ...stroke(item) })
      return
    case 'rect':
      parent.rect(round(item.box.width), round(item.box.height)).move(round(item.box.x), round(item.box.y)).attr({ fill: FILL[item.fill ?? 'none'], ...stroke(item) })
      return
    case 'circle':
      parent.circle(round(item.radius * 2)).center(round(item.centre.x), round(item.centre.y)).attr({ fill: FILL[item.fill ?? 'none'], ...stroke(item) })
      return
    case 'path':
      parent.path(item.d).attr({ fill: FILL[item.fill ?? 'none'], ...stroke(item) })
      return
    case 'text': {
      const anchor = item.anchor === 'middle' ? 'middle' : item.anchor === 'end' ? 'end' : 'start'
      parent.plain(item.text).attr({
        x: round(item.x), y: round(item.y), 'font-size': item.size, 'font-weight': item.weight === 'bold' ? 700 : 400, 'text-anchor': anchor, ...(item.fill === 'white' ? { fill: FILL.white } : {}),
      })
      return
    }
    case 'group': {
      const g = parent.group().attr({ class: `sl-${item.role}` })
      if (item.transform) g.attr('transform', `translate(${round(item.transform.dx)} ${round(item.transform.dy)}) scale(${item.transform.scale})`)
      for (const [k, v] of Object.entries(item.data)) g.attr(`data-${k}`, v)
      for (const child of item.items) draw(g, child)
    }
  }
}

/** The sheet as a standalone SVG document (sizes in points, Open Sans named as the font). */
export function sheetToSvg(sheet: Sheet): string {
  const window = createSVGWindow()
  const document = createSVGDocument()
  registerWindow(window, document)
  const canvas = SVG(document.documentElement) as Svg
  canvas.clear()
  canvas.attr({
    width: `${round(sheet.widthPt)}pt`, height: `${round(sheet.heightPt)}pt`, viewBox: `0 0 ${round(sheet.widthPt)} ${round(sheet.heightPt)}`,
    'font-family': "'Open Sans', sans-serif", 'data-sheet': sheet.id,
  })
  canvas.element('title').words(`${sheet.id} ${sheet.title}`)
  canvas.rect(round(sheet.widthPt), round(sheet.heightPt)).attr({ fill: '#fff' })
  for (const item of sheet.items) draw(canvas, item)
  return `<?xml version="1.0" encoding="UTF-8"?>\n${canvas.svg()}`
}
