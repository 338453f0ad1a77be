import { describe, expect, it } from 'vitest'
import fontkit from '@pdf-lib/fontkit'
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import path from 'node:path'
import { printable, text, textWidth, truncate, woffToSfnt, wrap } from '../../server/render/fonts'
import { sheetSize, SHEET_SIZES } from '../../server/render/sheet-sizes'

describe('printable text', () => {
  it('removes control, bidi and zero-width characters and turns breaks into spaces', () => {
    expect(printable('a\u0000b\u0007c\u202Ed\u200Fe\u2066f\u2069\u200Bg\ufeff')).toBe('abcdefg')
    expect(printable('line one\nline two\tend')).toBe('line one line two end')
  })

  it('spells out signs the shipped font lacks and marks other missing glyphs', () => {
    expect(printable('I \u2265 1.25 \u00d7 Isc \u2192 ok, 3 \u03a9')).toBe('I >= 1.25 \u00d7 Isc -> ok, 3 ohm')
    expect(printable('\u6f22\u5b57')).toBe('??')
    expect(printable('Caf\u0065\u0301 \u00b0C \u00b2')).toBe('Caf\u00e9 \u00b0C \u00b2')
  })

  it('wraps long text to the width and ends an overflowing paragraph with an ellipsis', () => {
    const long = 'word '.repeat(200)
    const lines = wrap(long, 7, 'regular', 100, 3)
    expect(lines).toHaveLength(3)
    for (const l of lines) expect(textWidth(l, 7)).toBeLessThanOrEqual(100)
    expect(lines[2]!.endsWith('\u2026')).toBe(true)
    // a word longer than a line is cut, never left to overflow
    for (const l of wrap('x'.repeat(300), 7, 'bold', 60)) expect(textWidth(l, 7, 'bold')).toBeLessThanOrEqual(60)
  })

  it('truncates a single line with an ellipsis and measures its box from the font', () => {
    const t = text('A very long project name that does not fit', 0, 10, { size: 8 }, 80)
    expect(t.text.endsWith('\u2026')).toBe(true)
    expect(t.bounds.width).toBeLessThanOrEqual(80)
    expect(truncate('short', 8, 'regular', 80)).toBe('short')
    // bold is wider than regular in Open Sans
    expect(textWidth('Sheet', 10, 'bold')).toBeGreaterThan(textWidth('Sheet', 10, 'regular'))
  })
})

describe('shipped font', () => {
  it('unpacks the WOFF to a font with the same glyphs and metrics (W3C WOFF 1.0)', () => {
    const dir = path.join(path.dirname(createRequire(import.meta.url).resolve('@fontsource/open-sans/package.json')), 'files')
    const woff = new Uint8Array(readFileSync(path.join(dir, 'open-sans-latin-400-normal.woff')))
    const sfnt = woffToSfnt(woff)
    expect(Buffer.from(sfnt.subarray(0, 4)).readUInt32BE(0)).toBe(0x00010000) // TrueType flavour
    const a = fontkit.create(Buffer.from(woff))
    const b = fontkit.create(Buffer.from(sfnt))
    expect(b.numGlyphs).toBe(a.numGlyphs)
    expect(b.unitsPerEm).toBe(a.unitsPerEm)
    expect(b.glyphForCodePoint(0x57).advanceWidth).toBe(a.glyphForCodePoint(0x57).advanceWidth)
    expect(b.layout('Voltage drop').advanceWidth).toBe(a.layout('Voltage drop').advanceWidth)
    expect(() => woffToSfnt(sfnt)).toThrow(/not a WOFF 1.0 file/)
  })
})

describe('sheet sizes', () => {
  // ANSI/ASME Y14.1: B is 11 × 17 in, D is 22 × 34 in; ISO 216: A3 is 297 × 420 mm
  it('match the published sheet dimensions in points', () => {
    expect(SHEET_SIZES.ANSI_B).toMatchObject({ widthPt: 1224, heightPt: 792 })
    expect(SHEET_SIZES.ANSI_D).toMatchObject({ widthPt: 2448, heightPt: 1584 })
    expect(SHEET_SIZES.A3.widthPt).toBeCloseTo(1190.55, 1)
    expect(SHEET_SIZES.A3.heightPt).toBeCloseTo(841.89, 1)
    expect(() => sheetSize('B')).toThrow(/expected one of ANSI_B, ANSI_D, A3/)
  })
})
