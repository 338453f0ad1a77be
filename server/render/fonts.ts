/**
 * The fonts every sheet uses: Open Sans shipped in `@fontsource/open-sans` (no network at run
 * time), with the metrics the layout needs and the text clean-up that keeps user text printable.
 */
import fontkit from '@pdf-lib/fontkit'
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import path from 'node:path'
import { inflateSync } from 'node:zlib'
import type { Box, FontWeight, TextAnchor, TextItem } from './model'

const FONT_FILES: Record<FontWeight, string> = {
  regular: 'open-sans-latin-400-normal.woff',
  bold: 'open-sans-latin-700-normal.woff',
}

interface LoadedFont {
  bytes: Uint8Array
  font: ReturnType<typeof fontkit.create>
  /** Advance widths per code point [em], cached: a 1 MW calculation sheet measures ~10⁵ strings. */
  advance: Map<number, number>
}

/**
 * The plain TrueType/OpenType font inside a WOFF 1.0 file (W3C WOFF File Format 1.0, sections 3–5):
 * each table inflated once, so neither the layout nor pdf-lib's subsetter inflates it again per use.
 */
export function woffToSfnt(woff: Uint8Array): Uint8Array {
  const src = Buffer.from(woff.buffer, woff.byteOffset, woff.byteLength)
  if (src.toString('latin1', 0, 4) !== 'wOFF') throw new Error('woffToSfnt: not a WOFF 1.0 file (signature is not "wOFF")')
  const numTables = src.readUInt16BE(12)
  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + i * 20
    const offset = src.readUInt32BE(at + 4)
    const compLength = src.readUInt32BE(at + 8)
    const origLength = src.readUInt32BE(at + 12)
    const raw = src.subarray(offset, offset + compLength)
    return { tag: src.subarray(at, at + 4), checksum: src.readUInt32BE(at + 16), data: compLength < origLength ? inflateSync(raw) : raw }
  })
  const pad4 = (n: number) => (n + 3) & ~3
  const headerLength = 12 + 16 * numTables
  const out = Buffer.alloc(headerLength + tables.reduce((t, x) => t + pad4(x.data.length), 0))
  const log2 = Math.floor(Math.log2(numTables))
  out.writeUInt32BE(src.readUInt32BE(4), 0) // flavor
  out.writeUInt16BE(numTables, 4)
  out.writeUInt16BE(2 ** log2 * 16, 6)
  out.writeUInt16BE(log2, 8)
  out.writeUInt16BE(numTables * 16 - 2 ** log2 * 16, 10)
  let offset = headerLength
  tables.forEach((t, i) => {
    const at = 12 + i * 16
    t.tag.copy(out, at)
    out.writeUInt32BE(t.checksum, at + 4)
    out.writeUInt32BE(offset, at + 8)
    out.writeUInt32BE(t.data.length, at + 12)
    t.data.copy(out, offset)
    offset += pad4(t.data.length)
  })
  return new Uint8Array(out)
}

const fontsDir = () => path.join(path.dirname(createRequire(import.meta.url).resolve('@fontsource/open-sans/package.json')), 'files')
const loaded = new Map<FontWeight, LoadedFont>()

function load(weight: FontWeight): LoadedFont {
  let entry = loaded.get(weight)
  if (!entry) {
    const bytes = woffToSfnt(new Uint8Array(readFileSync(path.join(fontsDir(), FONT_FILES[weight]))))
    entry = { bytes, font: fontkit.create(Buffer.from(bytes)), advance: new Map() }
    loaded.set(weight, entry)
  }
  return entry
}

/** The font to embed in a PDF (TrueType flavoured sfnt). */
export const fontBytes = (weight: FontWeight): Uint8Array => load(weight).bytes

/** Ascender and descender as fractions of the font size (descender positive, below the baseline). */
export const ASCENT_EM = 1.069 // Open Sans hhea ascender 2189 / 2048
export const DESCENT_EM = 0.293 // Open Sans hhea descender 600 / 2048

/** Signs the engine prints that the Latin subset of Open Sans lacks, spelled with glyphs it has. */
const SPELLED: Record<string, string> = {
  '\u2192': '->', '\u2190': '<-', '\u2265': '>=', '\u2264': '<=', '\u221a': 'sqrt', '\u03a9': 'ohm', '\u2126': 'ohm',
  '\u2248': '~', '\u0394': 'delta', '\u03b8': 'theta', '\u2032': "'", '\u2033': '"', '\u03a3': 'sum', '\u00a0': ' ',
}

/** C0/C1 controls, bidi embeddings/overrides/isolates/marks, zero-width and BOM: never printed. */
// eslint-disable-next-line no-control-regex
const INVISIBLE = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u061c\u200b-\u200f\u202a-\u202e\u2060-\u2069\ufeff]/g

/**
 * Text made safe to print with our fonts: invisible and control characters removed, tabs and
 * line breaks turned into spaces, known signs spelled out, anything else the font lacks shown as "?".
 */
export function printable(text: string): string {
  const font = load('regular').font
  let out = ''
  for (const ch of text.normalize('NFC').replace(INVISIBLE, '').replace(/[\t\n\r]+/g, ' ')) {
    const spelled = SPELLED[ch]
    if (spelled !== undefined) out += spelled
    else out += font.hasGlyphForCodePoint(ch.codePointAt(0)!) ? ch : '?'
  }
  return out
}

/** Width of already printable text [pt]. */
export function textWidth(text: string, size: number, weight: FontWeight = 'regular'): number {
  const f = load(weight)
  let em = 0
  for (const ch of text) {
    const cp = ch.codePointAt(0)!
    let a = f.advance.get(cp)
    if (a === undefined) {
      a = f.font.glyphForCodePoint(cp).advanceWidth / f.font.unitsPerEm
      f.advance.set(cp, a)
    }
    em += a
  }
  return em * size
}

const ELLIPSIS = '\u2026'

/** The text shortened with an ellipsis so that it fits `maxWidth` [pt]. */
export function truncate(text: string, size: number, weight: FontWeight, maxWidth: number): string {
  if (textWidth(text, size, weight) <= maxWidth) return text
  const chars = [...text]
  let lo = 0
  let hi = chars.length
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2)
    if (textWidth(chars.slice(0, mid).join('') + ELLIPSIS, size, weight) <= maxWidth) lo = mid
    else hi = mid - 1
  }
  return chars.slice(0, lo).join('').trimEnd() + ELLIPSIS
}

/**
 * Printable text broken into lines no wider than `maxWidth` [pt]; words longer than a line are
 * cut, and the last line ends in an ellipsis when more than `maxLines` would be needed.
 */
export function wrap(text: string, size: number, weight: FontWeight, maxWidth: number, maxLines = Infinity): string[] {
  const lines: string[] = []
  let line = ''
  const push = (l: string) => lines.push(l)
  for (const word of printable(text).split(' ').filter((w) => w !== '')) {
    const candidate = line === '' ? word : `${line} ${word}`
    if (textWidth(candidate, size, weight) <= maxWidth) {
      line = candidate
      continue
    }
    if (line !== '') push(line)
    line = word
    while (textWidth(line, size, weight) > maxWidth) {
      const head = truncate(line, size, weight, maxWidth).replace(ELLIPSIS, '')
      const cut = Math.max(1, [...head].length)
      push([...line].slice(0, cut).join(''))
      line = [...line].slice(cut).join('')
    }
  }
  if (line !== '') push(line)
  if (lines.length <= maxLines) return lines
  const kept = lines.slice(0, maxLines)
  kept[maxLines - 1] = truncate(`${kept[maxLines - 1]} ${ELLIPSIS}`, size, weight, maxWidth)
  if (!kept[maxLines - 1]!.endsWith(ELLIPSIS)) kept[maxLines - 1] += ELLIPSIS
  return kept
}

export interface TextStyle { size: number; weight?: FontWeight; anchor?: TextAnchor }

/**
 * A text item at a baseline, made printable and, with `maxWidth`, truncated to fit; its bounds
 * come from the font metrics.
 */
export function text(raw: string, x: number, y: number, style: TextStyle, maxWidth?: number): TextItem {
  const weight = style.weight ?? 'regular'
  const anchor = style.anchor ?? 'start'
  const clean = printable(raw)
  const fitted = maxWidth === undefined ? clean : truncate(clean, style.size, weight, maxWidth)
  const width = textWidth(fitted, style.size, weight)
  const left = anchor === 'start' ? x : anchor === 'middle' ? x - width / 2 : x - width
  const bounds: Box = { x: left, y: y - ASCENT_EM * style.size, width, height: (ASCENT_EM + DESCENT_EM) * style.size }
  return { kind: 'text', text: fitted, x, y, size: style.size, weight, anchor, bounds }
}

/** Height of one line of text at a size, ascender to descender [pt]. */
export const lineHeight = (size: number): number => (ASCENT_EM + DESCENT_EM) * size
