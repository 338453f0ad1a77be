import { describe, expect, it } from 'vitest'
import type { Box, DrawItem } from '../../server/render/model'
import { drawSymbol, FUSE_LEAD, SYMBOL_KINDS, SYMBOL_SIZE } from '../../server/render/symbols'

/** Extent of the straight items and circles of a symbol (paths are inside by construction of their end points). */
function extent(items: DrawItem[]): Box {
  const xs: number[] = []
  const ys: number[] = []
  for (const i of items) {
    if (i.kind === 'polyline') i.points.forEach((p) => { xs.push(p.x); ys.push(p.y) })
    if (i.kind === 'rect') {
      xs.push(i.box.x, i.box.x + i.box.width)
      ys.push(i.box.y, i.box.y + i.box.height)
    }
    if (i.kind === 'circle') {
      xs.push(i.centre.x - i.radius, i.centre.x + i.radius)
      ys.push(i.centre.y - i.radius, i.centre.y + i.radius)
    }
    if (i.kind === 'text') {
      xs.push(i.bounds.x, i.bounds.x + i.bounds.width)
      ys.push(i.bounds.y, i.bounds.y + i.bounds.height)
    }
  }
  return { x: Math.min(...xs), y: Math.min(...ys), width: Math.max(...xs) - Math.min(...xs), height: Math.max(...ys) - Math.min(...ys) }
}

describe('device symbols', () => {
  it.each(SYMBOL_KINDS)('%s draws inside the box it is given', (kind) => {
    const size = SYMBOL_SIZE[kind]
    const box = { x: 100, y: 50, ...size }
    const items = drawSymbol(kind, box, { fused: kind === 'disconnect' })
    expect(items.length).toBeGreaterThan(0)
    const e = extent(items)
    // a fuse's conductor leads reach beyond its body, by design
    const slack = kind === 'fuse' ? FUSE_LEAD : 0.01
    expect(e.x).toBeGreaterThanOrEqual(box.x - slack)
    expect(e.y).toBeGreaterThanOrEqual(box.y - slack)
    expect(e.x + e.width).toBeLessThanOrEqual(box.x + box.width + slack)
    expect(e.y + e.height).toBeLessThanOrEqual(box.y + box.height + slack)
  })

  it('a fused disconnect draws the fuse, a plain one does not', () => {
    const box = { x: 0, y: 0, ...SYMBOL_SIZE.disconnect }
    const rects = (fused: boolean) => drawSymbol('disconnect', box, { fused }).filter((i) => i.kind === 'rect').length
    expect(rects(true)).toBe(rects(false) + 1)
  })
})
