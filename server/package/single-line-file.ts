/**
 * `single-line.svg` of the package is one file that opens in any browser: when the diagram runs
 * over several E-601 parts, the parts are stacked top to bottom as nested `<svg>` elements under
 * one viewBox, each keeping its own coordinates.
 */
import { printable } from '../render/fonts'

/** Gap between stacked parts [pt]. */
const GAP = 24

const ROOT_TAG = /^<svg\b[^>]*>/
const XML_DECLARATION = /^<\?xml[^>]*\?>\s*/

/** The number of an attribute of a part's root element; parts come from our own renderer. */
function rootNumber(root: string, name: 'width' | 'height'): number {
  const value = new RegExp(`\\s${name}="([\\d.]+)pt"`).exec(root)?.[1]
  if (value === undefined) throw new Error(`single-line part has no ${name} in points`)
  return Number(value)
}

/** The parts (standalone SVG documents from `singleLineSvg`) as one SVG document. */
export function stackSvgParts(parts: readonly string[], title: string): string {
  if (parts.length === 0) throw new RangeError('parts: the single-line diagram has no part to pack')
  if (parts.length === 1) return parts[0]!
  let y = 0
  let width = 0
  const nested = parts.map((part) => {
    const body = part.replace(XML_DECLARATION, '')
    const root = ROOT_TAG.exec(body)?.[0]
    if (!root) throw new Error('single-line part is not an SVG document')
    const w = rootNumber(root, 'width')
    const h = rootNumber(root, 'height')
    // inside the outer viewBox a nested svg is sized in user units (points), not in "pt"
    const placed = root.replace(/\swidth="[^"]*"/, ` width="${w}"`).replace(/\sheight="[^"]*"/, ` height="${h}"`).replace(/^<svg\b/, `<svg x="0" y="${y}"`)
    y += h + GAP
    width = Math.max(width, w)
    return placed + body.slice(root.length)
  })
  const height = y - GAP
  const escapedTitle = printable(title).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${width}pt" height="${height}pt" viewBox="0 0 ${width} ${height}" font-family="'Open Sans', sans-serif" data-parts="${parts.length}">`,
    `<title>${escapedTitle}</title>`,
    ...nested,
    '</svg>',
  ].join('\n')
}
