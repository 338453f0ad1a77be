/**
 * The plan set: G-001, E-101…, E-601…, E-602…, E-603…, E-604…, then the uploaded datasheets as
 * pages, each stamped in its margin with its attachment letter, equipment and page. A datasheet
 * pdf-lib cannot read becomes one framed placeholder page saying which file and why.
 */
import fontkit from '@pdf-lib/fontkit'
import { EncryptedPDFError, PDFDocument, rgb, type PDFPage } from 'pdf-lib'
import type { Evaluation } from '../../shared/electrical'
import type { DesignDocument } from '../../shared/schemas/design'
import { fontBytes, printable, text, truncate, wrap } from './fonts'
import { stampBoxOf, type DrawItem, type Sheet } from './model'
import { PLAIN_SHAPING, setMetadata, sheetsToPdf } from './pdf'
import { DEFAULT_SHEET_SIZE, sheetSize, type SheetSizeName } from './sheet-sizes'
import { arrayLayoutSheets } from './sheets/e101-array-layout'
import { singleLineSheets } from './sheets/e601-single-line'
import { calculationSheets } from './sheets/e602-calculations'
import { labelSheets } from './sheets/e603-labels'
import { equipmentSheets, type AttachmentRef } from './sheets/e604-equipment'
import { frameSheet, type AhjRequirements, type PlanSetContext, type RevisionEntry } from './sheets/frame'
import { coverSheet, type SheetIndexEntry } from './sheets/g001-cover'

export interface RenderOptions {
  /** Sheet size from the jurisdiction profile; ANSI B when not given. */
  size?: SheetSizeName
  revisions?: readonly RevisionEntry[]
  preparedBy: string
  /** The evaluation to print; computed from the document when not given. */
  evaluation?: Evaluation
  /** The jurisdiction profile's notes and required labels; none when the project names no profile. */
  ahj?: AhjRequirements
}

/** The sheet context, with a clear error for a bad option. */
export function planSetContext(doc: DesignDocument, options: RenderOptions): PlanSetContext {
  const size = options.size ?? DEFAULT_SHEET_SIZE
  sheetSize(size)
  if (options.preparedBy.trim() === '') throw new RangeError('preparedBy: must name the person who prepared the plan set')
  return { doc, size, revisions: options.revisions ?? [], preparedBy: options.preparedBy, ahj: options.ahj ?? { notes: [], requiredLabelSections: [] } }
}

export interface DatasheetAttachment { equipmentName: string; fileName: string; bytes: Uint8Array }
export interface PlanSetInput extends RenderOptions { doc: DesignDocument; evaluation: Evaluation; attachments?: DatasheetAttachment[] }

/** What reading one datasheet gave: its page count, or why it cannot be merged. */
export type AttachmentOutcome = { pages: number } | { error: string }

/** A, B, …, Z, AA, AB, … */
export function attachmentLetter(index: number): string {
  let n = index + 1
  let out = ''
  while (n > 0) {
    out = String.fromCharCode(65 + ((n - 1) % 26)) + out
    n = Math.floor((n - 1) / 26)
  }
  return out
}

const attachmentId = (letter: string) => `ATT-${letter}`

/** The framed page that stands in for a datasheet that could not be merged. */
function placeholderSheet(ctx: PlanSetContext, ref: AttachmentRef): Sheet {
  const id = attachmentId(ref.letter)
  const frame = frameSheet(ctx, id, 'Datasheet not merged', '')
  const c = frame.content
  const items: DrawItem[] = [...frame.items, text(`ATTACHMENT ${ref.letter} \u2014 DATASHEET COULD NOT BE MERGED`, c.x, c.y + 18, { size: 14, weight: 'bold' }, c.width)]
  let y = c.y + 44
  for (const [label, value] of [['Equipment', ref.equipmentName], ['File', ref.fileName], ['Reason', ref.mergeError ?? ''],
    ['What to do', 'Upload the manufacturer\u2019s datasheet as a readable PDF without a password and generate the plan set again. Until then the reviewer must obtain the datasheet separately.']]) {
    for (const line of wrap(`${label}: ${value}`, 10, 'regular', c.width * 0.7, 6)) {
      items.push(text(line, c.x, y, { size: 10 }))
      y += 14
    }
    y += 6
  }
  return { id, title: 'Datasheet not merged', widthPt: frame.widthPt, heightPt: frame.heightPt, items }
}

interface Assembly {
  sheets: Sheet[]
  refs: AttachmentRef[]
  /** Sheets before the first datasheet page: the cover, E-101 … E-604. */
  mainSheets: number
}

function assemble(input: PlanSetInput, outcomes: readonly AttachmentOutcome[] | undefined): Assembly {
  const ctx = planSetContext(input.doc, input)
  const { evaluation } = input
  const attachments = input.attachments ?? []
  const body = [...arrayLayoutSheets(ctx, evaluation), ...singleLineSheets(ctx, evaluation), ...calculationSheets(ctx, evaluation), ...labelSheets(ctx, evaluation)]
  const refsFor = (equipmentPages: number): AttachmentRef[] => {
    let page = 1 + body.length + equipmentPages + 1
    return attachments.map((a, k) => {
      const outcome = outcomes?.[k]
      const ref: AttachmentRef = {
        letter: attachmentLetter(k), equipmentName: a.equipmentName, fileName: a.fileName,
        firstPage: outcome ? page : null, mergeError: outcome && 'error' in outcome ? outcome.error : null,
      }
      if (outcome) page += 'error' in outcome ? 1 : outcome.pages
      return ref
    })
  }
  // the page numbers printed on E-604 depend on how many pages E-604 itself takes
  let refs = refsFor(1)
  let equipment = equipmentSheets(ctx, evaluation, refs)
  for (let tries = 0; tries < 3; tries++) {
    const next = refsFor(equipment.length)
    const again = equipmentSheets(ctx, evaluation, next)
    refs = next
    if (again.length === equipment.length) {
      equipment = again
      break
    }
    equipment = again
  }
  const placeholders = refs.filter((r) => r.mergeError !== null).map((r) => placeholderSheet(ctx, r))
  const index: SheetIndexEntry[] = [{ id: 'G-001', title: 'Cover sheet' }, ...[...body, ...equipment].map((s) => ({ id: s.id, title: s.title }))]
  refs.forEach((r, k) => {
    const outcome = outcomes?.[k]
    const pages = outcome && 'pages' in outcome ? `, ${outcome.pages} page${outcome.pages === 1 ? '' : 's'}` : ''
    index.push({ id: attachmentId(r.letter), title: r.mergeError !== null ? `Datasheet not merged: ${r.fileName}` : `Datasheet: ${r.equipmentName} (${r.fileName}${pages})` })
  })
  const cover = coverSheet(ctx, evaluation, index)
  return { sheets: [cover, ...body, ...equipment, ...placeholders], refs, mainSheets: 1 + body.length + equipment.length }
}

/**
 * The sheets of the plan set in order. With `outcomes` (what reading each datasheet gave, as
 * `planSetPdf` finds it) E-604 prints page numbers and unreadable datasheets get their placeholder
 * sheet; without, E-604 names the attachments by letter only.
 */
export function planSetSheets(input: PlanSetInput, outcomes?: readonly AttachmentOutcome[]): Sheet[] {
  return assemble(input, outcomes).sheets
}

/** Reads a datasheet; anything pdf-lib cannot read or copy becomes the reason it is not merged. */
async function readDatasheet(a: DatasheetAttachment): Promise<{ pdf: PDFDocument; pages: number } | { error: string }> {
  if (a.bytes.byteLength === 0) return { error: 'the file is empty' }
  try {
    const pdf = await PDFDocument.load(a.bytes, { updateMetadata: false })
    const pages = pdf.getPageCount()
    if (pages === 0) return { error: 'the PDF has no pages' }
    // copying resolves every object a page refers to: a file that fails here would fail in the merge
    await (await PDFDocument.create()).copyPages(pdf, pdf.getPageIndices())
    return { pdf, pages }
  } catch (err) {
    if (err instanceof EncryptedPDFError) return { error: 'the PDF is encrypted (password protected), so its pages cannot be copied' }
    const message = err instanceof Error ? err.message : String(err)
    return { error: `the file is not a readable PDF (${message.slice(0, 160)})` }
  }
}

const OVERLAY_SIZE = 7
/** Sheets drawn into one pdf-lib document before it is saved and its pages copied on. */
const SHEETS_PER_DOCUMENT = 4

/** Inserts the readable datasheets after E-604 (placeholders for the others are already there), each page stamped in its margin. */
async function mergeDatasheets(out: PDFDocument, read: Awaited<ReturnType<typeof readDatasheet>>[], refs: AttachmentRef[], mainSheets: number, projectCode: string, onStep?: (step: 'attachments') => void) {
  onStep?.('attachments')
  out.registerFontkit(fontkit)
  const font = await out.embedFont(fontBytes('regular'), { subset: true, features: PLAIN_SHAPING })
  let at = mainSheets
  for (const [k, r] of read.entries()) {
    if (!('pdf' in r)) {
      at++ // its placeholder sheet is already here
      continue
    }
    const ref = refs[k]!
    const pages = await out.copyPages(r.pdf, r.pdf.getPageIndices())
    pages.forEach((page, n) => {
      out.insertPage(at++, page)
      const box = page.getMediaBox()
      const label = `${attachmentId(ref.letter)} \u2014 datasheet: ${ref.equipmentName} \u2014 ${ref.fileName} \u2014 page ${n + 1} of ${pages.length} \u2014 ${projectCode}`
      const line = truncate(printable(label), OVERLAY_SIZE, 'regular', box.width - 30)
      const width = font.widthOfTextAtSize(line, OVERLAY_SIZE)
      page.drawRectangle({ x: box.x + 10, y: box.y + 6, width: width + 4, height: OVERLAY_SIZE + 4, color: rgb(1, 1, 1) })
      page.drawText(line, { x: box.x + 12, y: box.y + 8.5, size: OVERLAY_SIZE, font, color: rgb(0, 0, 0) })
    })
  }
}

/**
 * The plan-set PDF: every sheet as vector pages, then the datasheets; with the sheets it drew (the
 * package takes the single-line SVG from them). `onStep` hears when drawing starts and when the
 * datasheets are merged.
 */
/** Where the reviewer's stamp goes on one page: PDF user space (points, origin bottom left), page index from 0. */
export interface StampBox { page: number; x: number; y: number; width: number; height: number }

/** The stamp box of each framed sheet at the page it was printed on. */
function stampBoxes(sheets: readonly Sheet[], pageOfSheet: (index: number) => number): StampBox[] {
  return sheets.flatMap((sheet, k) => {
    const box = stampBoxOf(sheet)
    return box ? [{ page: pageOfSheet(k), x: box.x, y: sheet.heightPt - box.y - box.height, width: box.width, height: box.height }] : []
  })
}

export interface PlanSetPdf {
  pdf: Uint8Array
  sheets: Sheet[]
  pageCount: number
  /** Every sheet's stamp box, for stamping the published file later. */
  stampBoxes: StampBox[]
}

export async function planSetPdf(input: PlanSetInput, onStep?: (step: 'drawing' | 'attachments') => void): Promise<PlanSetPdf> {
  const attachments = input.attachments ?? []
  const read = await Promise.all(attachments.map(readDatasheet))
  const outcomes: AttachmentOutcome[] = read.map((r) => ('error' in r ? { error: r.error } : { pages: r.pages }))
  onStep?.('drawing')
  const { sheets, refs, mainSheets } = assemble(input, outcomes)
  const p = input.doc.project
  const metadata = { title: `${p.name} \u2014 permit plan set`, subject: p.code, author: p.installer }
  const merged = read.filter((r) => 'pdf' in r).length
  if (sheets.length <= SHEETS_PER_DOCUMENT && merged === 0) {
    const pdf = await sheetsToPdf(sheets, metadata)
    return { pdf, sheets, pageCount: sheets.length, stampBoxes: stampBoxes(sheets, (k) => k) }
  }

  // pdf-lib holds every drawing operator of a document until it is saved: a large set is drawn a
  // batch of sheets at a time and the saved pages copied into one document
  const out = await PDFDocument.create()
  const sheetPages: PDFPage[] = []
  for (let start = 0; start < sheets.length; start += SHEETS_PER_DOCUMENT) {
    const batch = await PDFDocument.load(await sheetsToPdf(sheets.slice(start, start + SHEETS_PER_DOCUMENT), metadata), { updateMetadata: false })
    for (const page of await out.copyPages(batch, batch.getPageIndices())) sheetPages.push(out.addPage(page))
  }
  if (merged > 0) await mergeDatasheets(out, read, refs, mainSheets, p.code, onStep)
  setMetadata(out, metadata)
  // datasheet pages went in between the sheets: each sheet's page is found where it ended up
  const pages = out.getPages()
  const boxes = stampBoxes(sheets, (k) => pages.indexOf(sheetPages[k]!))
  const pdf = await out.save()
  return { pdf, sheets, pageCount: out.getPageCount(), stampBoxes: boxes }
}
