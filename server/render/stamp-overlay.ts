/**
 * The reviewer's stamp on a published plan set: the stamp image, the holder, the licence, the date
 * and the verification id drawn into the stamp box of every sheet, and a one-line mark on the
 * pages without a box (merged datasheets). The sheets themselves are not drawn again: what was
 * reviewed is what gets stamped.
 */
import fontkit from '@pdf-lib/fontkit'
import { PDFDocument, rgb, type PDFFont, type PDFPage } from 'pdf-lib'
import { fontBytes, printable, truncate } from './fonts'
import { PLAIN_SHAPING } from './pdf'
import type { StampBox } from './plan-set'

export interface StampMark {
  /** The reviewer's stamp image (PNG). */
  image: Uint8Array
  holderName: string
  licenceNumber: string
  licenceRegion: string
  /** YYYY-MM-DD. */
  stampedOn: string
  verificationId: string
  /** Where anyone holding the sheet can check the stamp, e.g. `https://…/verify/7K2M-9QXR-4T1H`. */
  verifyUrl: string
  /** Signed with a generated demo certificate: printed on the stamp. */
  demo: boolean
}

const INK = rgb(0, 0, 0)
const DEMO_INK = rgb(0.7, 0.05, 0.05)
const PAD = 3

interface Fonts { regular: PDFFont; bold: PDFFont }

/** One fitted line of the stamp text; the font size follows the box width (ANSI B box ≈ 178 pt). */
function line(page: PDFPage, fonts: Fonts, raw: string, x: number, y: number, size: number, maxWidth: number, bold = false, color = INK): void {
  const weight = bold ? 'bold' : 'regular'
  page.drawText(truncate(printable(raw), size, weight, maxWidth), { x, y, size, font: fonts[weight], color })
}

function drawStamp(page: PDFPage, box: StampBox, fonts: Fonts, image: Awaited<ReturnType<PDFDocument['embedPng']>>, mark: StampMark): void {
  const size = Math.max(5, Math.min(8, box.width / 30))
  const lead = size * 1.3
  const lines: { text: string; bold?: boolean; color?: ReturnType<typeof rgb> }[] = [
    { text: mark.holderName, bold: true },
    { text: `Licence ${mark.licenceNumber}, ${mark.licenceRegion}` },
    { text: `Stamped ${mark.stampedOn} · digitally signed` },
    { text: `Verification ${mark.verificationId}`, bold: true },
    { text: mark.verifyUrl },
    ...(mark.demo ? [{ text: 'DEMO CERTIFICATE — NOT FOR PERMIT USE', bold: true, color: DEMO_INK }] : []),
  ]
  const inner = box.width - 2 * PAD
  // white ground first, so the stamp reads on its own and not over the dashed outline
  page.drawRectangle({ x: box.x + 0.5, y: box.y + 0.5, width: box.width - 1, height: box.height - 1, color: rgb(1, 1, 1) })
  lines.forEach((l, k) => line(page, fonts, l.text, box.x + PAD, box.y + PAD + (lines.length - 1 - k) * lead + size * 0.25, size, inner, l.bold, l.color))
  const textTop = box.y + PAD + lines.length * lead
  const room = { width: inner, height: box.y + box.height - PAD - textTop }
  if (room.height < 12) return
  const scale = Math.min(room.width / image.width, room.height / image.height)
  const width = image.width * scale
  const height = image.height * scale
  page.drawImage(image, { x: box.x + PAD + (room.width - width) / 2, y: textTop + (room.height - height) / 2, width, height })
}

/**
 * The plan set with the stamp in each given box (`boxes` as the generation recorded them) and a
 * verification line at the foot of every other page. Answers the unsigned bytes; signing follows.
 */
export async function stampPlanSet(pdf: Uint8Array, boxes: readonly StampBox[], mark: StampMark): Promise<Uint8Array> {
  const doc = await PDFDocument.load(pdf, { updateMetadata: false })
  doc.registerFontkit(fontkit)
  const fonts: Fonts = {
    regular: await doc.embedFont(fontBytes('regular'), { subset: true, features: PLAIN_SHAPING }),
    bold: await doc.embedFont(fontBytes('bold'), { subset: true, features: PLAIN_SHAPING }),
  }
  const image = await doc.embedPng(mark.image)
  const pages = doc.getPages()
  for (const box of boxes) {
    const page = pages[box.page]
    if (!page) throw new RangeError(`stamp box on page ${box.page + 1}, but the plan set has ${pages.length} pages`)
    drawStamp(page, box, fonts, image, mark)
  }
  const boxed = new Set(boxes.map((b) => b.page))
  pages.forEach((page, k) => {
    if (boxed.has(k)) return
    const { width, x, y } = page.getMediaBox()
    line(page, fonts, `Part of the set stamped by ${mark.holderName} on ${mark.stampedOn} · verification ${mark.verificationId}`, x + 12, y + 20, 7, width - 30)
  })
  return doc.save({ useObjectStreams: false })
}
