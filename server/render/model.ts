/**
 * The drawing model: what a sheet shows, laid out once in sheet units (PostScript points, 1/72 in;
 * origin top left, y down). The SVG and PDF renderers draw exactly these items, so both outputs
 * stay vector and agree with each other.
 */

export interface Point { x: number; y: number }

/** Axis-aligned rectangle in points. */
export interface Box { x: number; y: number; width: number; height: number }

export type FontWeight = 'regular' | 'bold'
export type TextAnchor = 'start' | 'middle' | 'end'

interface ItemBase {
  /** Stroke width [pt]; 0 draws no outline. */
  strokeWidth?: number
  /** Dash pattern [pt], e.g. [4, 2] for a DC conductor shown dashed. */
  dash?: number[]
}

/** Straight segments through the points. */
export interface PolylineItem extends ItemBase { kind: 'polyline'; points: Point[] }
export interface RectItem extends ItemBase { kind: 'rect'; box: Box; fill?: 'none' | 'black' | 'shade' }
export interface CircleItem extends ItemBase { kind: 'circle'; centre: Point; radius: number; fill?: 'none' | 'black' | 'white' }
/** An SVG path string (M, L, C, Q, A, Z) in sheet units; both renderers accept it. */
export interface PathItem extends ItemBase { kind: 'path'; d: string; fill?: 'none' | 'black' | 'white' }
/** One line of text, already sanitised and fitted; `y` is the baseline. */
export interface TextItem {
  kind: 'text'
  text: string
  x: number
  y: number
  size: number
  weight: FontWeight
  anchor: TextAnchor
  /** White text, e.g. a label's signal word reversed out of a black band; black when absent. */
  fill?: 'white'
  /** The text's own box (from the font metrics), used by the overlap checks. */
  bounds: Box
}
/** Items drawn together; `data` becomes data-* attributes in SVG (device and run ids). */
export interface GroupItem {
  kind: 'group'
  role: 'device' | 'wire' | 'tag' | 'frame' | 'table' | 'note' | 'stamp-box'
  data: Record<string, string>
  /** Children drawn in their own units, scaled by `scale` then moved by (dx, dy) on the sheet. */
  transform?: { dx: number; dy: number; scale: number }
  items: DrawItem[]
}

export type DrawItem = PolylineItem | RectItem | CircleItem | PathItem | TextItem | GroupItem

/** One printed sheet (a PDF page). */
export interface Sheet {
  /** Sheet identifier with its page suffix when split, e.g. `E-602` or `E-602.2`. */
  id: string
  title: string
  widthPt: number
  heightPt: number
  items: DrawItem[]
}

export const boxesIntersect = (a: Box, b: Box): boolean =>
  a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height

export const unionBox = (boxes: Box[]): Box => {
  const x = Math.min(...boxes.map((b) => b.x))
  const y = Math.min(...boxes.map((b) => b.y))
  const right = Math.max(...boxes.map((b) => b.x + b.width))
  const bottom = Math.max(...boxes.map((b) => b.y + b.height))
  return { x, y, width: right - x, height: bottom - y }
}

/** Every text item of a tree of items, in drawing order. */
export function textsOf(items: DrawItem[]): TextItem[] {
  const out: TextItem[] = []
  const walk = (list: DrawItem[]) => {
    for (const item of list) {
      if (item.kind === 'text') out.push(item)
      else if (item.kind === 'group') walk(item.items)
    }
  }
  walk(items)
  return out
}

/** The box the reviewer's stamp goes into on a framed sheet (the frame marks it), or null for a sheet without one. */
export function stampBoxOf(sheet: Sheet): Box | null {
  const find = (list: DrawItem[]): Box | null => {
    for (const item of list) {
      if (item.kind !== 'group') continue
      if (item.role === 'stamp-box') {
        const rect = item.items.find((i) => i.kind === 'rect')
        if (rect?.kind === 'rect') return rect.box
      }
      const inner = find(item.items)
      if (inner) return inner
    }
    return null
  }
  return find(sheet.items)
}
