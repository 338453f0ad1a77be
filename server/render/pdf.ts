/**
 * PDF renderer: draws the same drawing model as the SVG renderer with pdf-lib's vector
 * operations (lines, paths, circles, text), one page per sheet, Open Sans embedded as a subset.
 */
import fontkit from '@pdf-lib/fontkit'
import { concatTransformationMatrix, LineCapStyle, PDFDocument, popGraphicsState, pushGraphicsState, rgb, type PDFFont, type PDFPage } from 'pdf-lib'
import { fontBytes, textWidth } from './fonts'
import type { DrawItem, FontWeight, Sheet } from './model'

const BLACK = rgb(0, 0, 0)
const FILL = { black: BLACK, white: rgb(1, 1, 1), shade: rgb(0.91, 0.91, 0.91) } as const

/**
 * OpenType features switched off: plan-sheet text needs no ligatures or contextual forms, and
 * shaping every string with them costs most of the PDF time. Widths then match `textWidth`.
 */
export const PLAIN_SHAPING = Object.fromEntries(['ccmp', 'locl', 'liga', 'clig', 'calt', 'rlig', 'rclt', 'kern', 'mark', 'mkmk', 'dlig', 'frac', 'numr', 'dnom', 'sups', 'subs', 'ordn', 'case', 'lnum', 'pnum', 'tnum', 'onum', 'salt', 'ss01', 'ss02', 'ss03', 'cv01', 'dist', 'curs'].map((f) => [f, false]))

/** Point mapping of a page: model units (y down) to PDF user space (y up). */
interface Frame { page: PDFPage; height: number; fonts: Record<FontWeight, PDFFont> }

function draw(f: Frame, item: DrawItem): void {
  const { page, height } = f
  const border = (i: { strokeWidth?: number; dash?: number[] }) =>
    i.strokeWidth === 0 ? {} : { borderColor: BLACK, borderWidth: i.strokeWidth ?? 0.9, ...(i.dash ? { borderDashArray: i.dash } : {}) }
  switch (item.kind) {
    case 'polyline': {
      const d = item.points.map((p, k) => `${k === 0 ? 'M' : 'L'} ${p.x} ${p.y}`).join(' ')
      page.drawSvgPath(d, { x: 0, y: height, ...border(item), borderLineCap: LineCapStyle.Butt })
      return
    }
    case 'rect': {
      const fill = item.fill && item.fill !== 'none' ? { color: FILL[item.fill] } : {}
      page.drawRectangle({ x: item.box.x, y: height - item.box.y - item.box.height, width: item.box.width, height: item.box.height, ...fill, ...border(item) })
      return
    }
    case 'circle': {
      const fill = item.fill && item.fill !== 'none' ? { color: FILL[item.fill] } : {}
      page.drawCircle({ x: item.centre.x, y: height - item.centre.y, size: item.radius, ...fill, ...border(item) })
      return
    }
    case 'path': {
      const fill = item.fill && item.fill !== 'none' ? { color: FILL[item.fill] } : {}
      page.drawSvgPath(item.d, { x: 0, y: height, ...fill, ...border(item) })
      return
    }
    case 'text': {
      const font = f.fonts[item.weight]
      const width = textWidth(item.text, item.size, item.weight)
      const x = item.anchor === 'start' ? item.x : item.anchor === 'middle' ? item.x - width / 2 : item.x - width
      page.drawText(item.text, { x, y: height - item.y, size: item.size, font, color: item.fill === 'white' ? FILL.white : BLACK })
      return
    }
    case 'group': {
      if (!item.transform) {
        for (const child of item.items) draw(f, child)
        return
      }
      // children in their own units: translate and scale, then draw as if the page were 0 high (y = -y)
      const { dx, dy, scale } = item.transform
      page.pushOperators(pushGraphicsState(), concatTransformationMatrix(scale, 0, 0, scale, dx, height - dy))
      for (const child of item.items) draw({ ...f, height: 0 }, child)
      page.pushOperators(popGraphicsState())
    }
  }
}

/**
 * Plan sheets repeat much of their text (title block, headers, units, statuses): each string is
 * shaped once per document. The glyphs stay in the subset from the first encoding.
 */
function rememberEncodings(font: PDFFont): PDFFont {
  const encode = font.encodeText.bind(font)
  const known = new Map<string, ReturnType<PDFFont['encodeText']>>()
  font.encodeText = (text: string) => {
    let encoded = known.get(text)
    if (!encoded) known.set(text, (encoded = encode(text)))
    return encoded
  }
  return font
}

export interface PdfMetadata { title: string; subject?: string; author?: string }

/** Title, subject and author of a PDF, with Stringline as its producer. */
export function setMetadata(pdf: PDFDocument, metadata: PdfMetadata): void {
  pdf.setTitle(metadata.title)
  if (metadata.subject) pdf.setSubject(metadata.subject)
  if (metadata.author) pdf.setAuthor(metadata.author)
  pdf.setProducer('Stringline')
  pdf.setCreator('Stringline')
}

/** A PDF with one vector page per sheet. */
export async function sheetsToPdf(sheets: readonly Sheet[], metadata: PdfMetadata): Promise<Uint8Array> {
  const pdf = await PDFDocument.create()
  pdf.registerFontkit(fontkit)
  const fonts = {
    regular: rememberEncodings(await pdf.embedFont(fontBytes('regular'), { subset: true, features: PLAIN_SHAPING })),
    bold: rememberEncodings(await pdf.embedFont(fontBytes('bold'), { subset: true, features: PLAIN_SHAPING })),
  }
  setMetadata(pdf, metadata)
  for (const sheet of sheets) {
    const page = pdf.addPage([sheet.widthPt, sheet.heightPt])
    const frame: Frame = { page, height: sheet.heightPt, fonts }
    for (const item of sheet.items) draw(frame, item)
  }
  return pdf.save()
}
