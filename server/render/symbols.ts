/**
 * Device symbols drawn by us after the shapes of IEEE 315 / IEC 60617 (PV generator, converter
 * square with a diagonal, fuse, circuit breaker, switch, battery cells, two-winding transformer,
 * earth, meter circle, AC source). Each symbol fills the box it is given and returns plain items.
 */
import { text } from './fonts'
import type { Box, DrawItem, PolylineItem } from './model'

export const SYMBOL_KINDS = [
  'pv', 'moduleElectronics', 'combiner', 'fuse', 'breaker', 'disconnect', 'inverter', 'dcConverter',
  'chargeController', 'battery', 'meter', 'panelboard', 'transformer', 'ground', 'utility', 'load',
] as const
export type SymbolKind = (typeof SYMBOL_KINDS)[number]

/** Natural size of each symbol [pt]; enclosures (combiner, panelboard) grow with their inputs. */
export const SYMBOL_SIZE: Record<SymbolKind, { width: number; height: number }> = {
  pv: { width: 34, height: 24 },
  moduleElectronics: { width: 16, height: 16 },
  combiner: { width: 46, height: 40 },
  fuse: { width: 14, height: 6 },
  breaker: { width: 14, height: 7 },
  disconnect: { width: 40, height: 30 },
  inverter: { width: 40, height: 40 },
  dcConverter: { width: 40, height: 40 },
  chargeController: { width: 40, height: 40 },
  battery: { width: 34, height: 30 },
  meter: { width: 30, height: 30 },
  panelboard: { width: 46, height: 44 },
  transformer: { width: 44, height: 30 },
  ground: { width: 14, height: 10 },
  utility: { width: 32, height: 32 },
  load: { width: 34, height: 22 },
}

const STROKE = 0.9
/** Breaker terminals sit this far inside the box: the wire meets them there [pt]. */
export const BREAKER_TERMINAL_INSET = 1.2
const DOT = BREAKER_TERMINAL_INSET
/** How far a fuse's conductor reaches beyond its body on each side [pt]. */
export const FUSE_LEAD = 3
const line = (x1: number, y1: number, x2: number, y2: number, strokeWidth = STROKE): PolylineItem => ({
  kind: 'polyline', points: [{ x: x1, y: y1 }, { x: x2, y: y2 }], strokeWidth,
})
const outline = (box: Box): DrawItem => ({ kind: 'rect', box, strokeWidth: STROKE, fill: 'none' })
const sine = (cx: number, cy: number, w: number, h: number): DrawItem => ({
  kind: 'path',
  d: `M ${cx - w / 2} ${cy} C ${cx - w / 4} ${cy - h} ${cx - w / 4} ${cy - h} ${cx} ${cy} C ${cx + w / 4} ${cy + h} ${cx + w / 4} ${cy + h} ${cx + w / 2} ${cy}`,
  strokeWidth: STROKE,
})
/** IEC 60617 DC mark: a solid line over a dashed one. */
const dcMark = (cx: number, cy: number, w: number): DrawItem[] => [
  line(cx - w / 2, cy - 1.5, cx + w / 2, cy - 1.5),
  { ...line(cx - w / 2, cy + 1.5, cx + w / 2, cy + 1.5), dash: [w / 5, w / 10] },
]

/** A converter square with a diagonal and its two marks: DC/AC inverter, DC/DC converter. */
function converter(box: Box, right: 'ac' | 'dc'): DrawItem[] {
  const { x, y, width: w, height: h } = box
  const mark = w * 0.3
  return [
    outline(box),
    line(x, y + h, x + w, y),
    ...dcMark(x + w * 0.28, y + h * 0.28, mark),
    ...(right === 'ac' ? [sine(x + w * 0.72, y + h * 0.72, mark, h * 0.08)] : dcMark(x + w * 0.72, y + h * 0.72, mark)),
  ]
}

/** IEC 60617 fuse: a rectangle with the conductor through it, horizontal. */
export function fuse(box: Box): DrawItem[] {
  const cy = box.y + box.height / 2
  return [outline(box), line(box.x - FUSE_LEAD, cy, box.x + box.width + FUSE_LEAD, cy)]
}


/** IEEE 315 circuit breaker: an arc bridging the two terminals, horizontal. */
export function breaker(box: Box): DrawItem[] {
  const { x, y, width: w, height: h } = box
  return [
    { kind: 'circle', centre: { x: x + DOT, y: y + h - DOT }, radius: DOT, fill: 'black' },
    { kind: 'circle', centre: { x: x + w - DOT, y: y + h - DOT }, radius: DOT, fill: 'black' },
    { kind: 'path', d: `M ${x + DOT} ${y + h - DOT} Q ${x + w / 2} ${y - h * 0.9} ${x + w - DOT} ${y + h - DOT}`, strokeWidth: STROKE },
  ]
}

/** Draws a symbol to fill `box`. `fused` adds a fuse to a disconnect. */
export function drawSymbol(kind: SymbolKind, box: Box, options: { fused?: boolean } = {}): DrawItem[] {
  const { x, y, width: w, height: h } = box
  const cx = x + w / 2
  const cy = y + h / 2
  switch (kind) {
    case 'pv': {
      // PV generator: the module rectangle with its cell grid and two arrows of incoming light
      const cells: DrawItem[] = []
      for (let i = 1; i < 4; i++) cells.push(line(x + (w * i) / 4, y + h * 0.3, x + (w * i) / 4, y + h, 0.4))
      cells.push(line(x, y + h * 0.65, x + w, y + h * 0.65, 0.4))
      const arrow = (ax: number): DrawItem => ({
        kind: 'path', d: `M ${ax} ${y} L ${ax + 6} ${y + 6} M ${ax + 6} ${y + 6} L ${ax + 2.5} ${y + 5} M ${ax + 6} ${y + 6} L ${ax + 5} ${y + 2.5}`, strokeWidth: 0.6,
      })
      return [outline({ x, y: y + h * 0.3, width: w, height: h * 0.7 }), ...cells, arrow(x + w * 0.25), arrow(x + w * 0.5)]
    }
    case 'moduleElectronics':
    case 'dcConverter':
      return converter(box, kind === 'moduleElectronics' ? 'ac' : 'dc')
    case 'inverter':
      return converter(box, 'ac')
    case 'chargeController':
      // a DC/DC converter whose output is marked with the battery cell pair
      return [...converter(box, 'dc'), line(x + w * 0.85, y + h * 0.12, x + w * 0.85, y + h * 0.32, 1.2), line(x + w * 0.92, y + h * 0.17, x + w * 0.92, y + h * 0.27, 1.2)]
    case 'combiner':
    case 'panelboard':
      // enclosure with its bus; the devices on each input are drawn by the layout
      return [outline(box), line(x + w - 8, y + 5, x + w - 8, y + h - 5, 2)]
    case 'fuse':
      return fuse(box)
    case 'breaker':
      return breaker(box)
    case 'disconnect': {
      // enclosure, two contacts and the open blade of a switch (IEC 60617 disconnector)
      const left = x + w * 0.22
      const right = x + w * 0.78
      const items: DrawItem[] = [
        { kind: 'rect', box, strokeWidth: STROKE, fill: 'none', dash: [2, 1.5] },
        line(x, cy, left, cy),
        { kind: 'circle', centre: { x: left, y: cy }, radius: 1.4, fill: 'white', strokeWidth: STROKE },
        line(left, cy, right - 3, cy - h * 0.3),
        line(right, cy, right, cy - 4),
      ]
      if (options.fused) items.push(...fuse({ x: right + 3, y: cy - 2, width: x + w - right - 6.5, height: 4 }))
      else items.push(line(right, cy, x + w, cy))
      return items
    }
    case 'battery': {
      // IEC 60617 battery: long (positive) and short plates, three cells
      const items: DrawItem[] = [line(x, cy, x + w * 0.15, cy), line(x + w * 0.85, cy, x + w, cy)]
      for (let i = 0; i < 3; i++) {
        const px = x + w * (0.22 + i * 0.22)
        items.push(line(px, y, px, y + h, 1), line(px + w * 0.08, y + h * 0.28, px + w * 0.08, y + h * 0.72, 2.2))
      }
      return items
    }
    case 'meter':
      return [
        { kind: 'circle', centre: { x: cx, y: cy }, radius: w / 2, fill: 'none', strokeWidth: STROKE },
        text('kWh', cx, cy + 2.5, { size: 7, weight: 'bold', anchor: 'middle' }),
      ]
    case 'transformer': {
      const r = h / 2
      return [
        { kind: 'circle', centre: { x: cx - r * 0.45, y: cy }, radius: r, fill: 'none', strokeWidth: STROKE },
        { kind: 'circle', centre: { x: cx + r * 0.45, y: cy }, radius: r, fill: 'none', strokeWidth: STROKE },
      ]
    }
    case 'ground':
      return [
        line(cx, y, cx, y + h * 0.4),
        line(x, y + h * 0.4, x + w, y + h * 0.4),
        line(x + w * 0.2, y + h * 0.7, x + w * 0.8, y + h * 0.7),
        line(x + w * 0.4, y + h, x + w * 0.6, y + h),
      ]
    case 'utility':
      // AC source of the utility: a circle with a sine wave
      return [
        { kind: 'circle', centre: { x: cx, y: cy }, radius: w / 2, fill: 'none', strokeWidth: STROKE },
        sine(cx, cy, w * 0.6, h * 0.2),
      ]
    case 'load':
      // a load as the IEC 60617 resistive element
      return [outline({ x: x + w * 0.15, y: y + h * 0.25, width: w * 0.7, height: h * 0.5 }), line(x, cy, x + w * 0.15, cy), line(x + w * 0.85, cy, x + w, cy)]
  }
}
