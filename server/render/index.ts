/**
 * Public API of the rendering core: design + evaluation → drawing model (sheets) → SVG / PDF.
 * Later work (the package, revisions, jobs) calls only what is exported here.
 */
import { evaluateDesign, type Evaluation } from '../../shared/electrical'
import type { DesignDocument } from '../../shared/schemas/design'
import type { Sheet } from './model'
import { sheetsToPdf } from './pdf'
import { calculationSheets } from './sheets/e602-calculations'
import { singleLineSheets } from './sheets/e601-single-line'
import { DEFAULT_SHEET_SIZE, sheetSize, type SheetSizeName } from './sheet-sizes'
import type { PlanSetContext, RevisionEntry } from './sheets/frame'
import { sheetToSvg } from './svg'

export type { Box, DrawItem, Sheet, TextItem } from './model'
export type { PlanSetContext, RevisionEntry } from './sheets/frame'
export type { CollisionBox, ScheduleLine, SingleLineLayout, SingleLineOptions } from './layout/sld'
export { SHEET_SIZES, SHEET_SIZE_NAMES, DEFAULT_SHEET_SIZE, type SheetSizeName } from './sheet-sizes'
export { layoutSingleLine, compactIds } from './layout/sld'
export { singleLineSheets, MIN_DIAGRAM_SCALE } from './sheets/e601-single-line'
export { calculationSheets } from './sheets/e602-calculations'
export { frameSheet } from './sheets/frame'
export { sheetToSvg } from './svg'
export { sheetsToPdf, type PdfMetadata } from './pdf'
export { printable } from './fonts'

export interface RenderOptions {
  /** Sheet size from the jurisdiction profile; ANSI B when not given. */
  size?: SheetSizeName
  revisions?: readonly RevisionEntry[]
  preparedBy: string
  /** The evaluation to print; computed from the document when not given. */
  evaluation?: Evaluation
}

/** The sheet context, with a clear error for a bad option. */
export function planSetContext(doc: DesignDocument, options: RenderOptions): PlanSetContext {
  const size = options.size ?? DEFAULT_SHEET_SIZE
  sheetSize(size)
  if (options.preparedBy.trim() === '') throw new RangeError('preparedBy: must name the person who prepared the plan set')
  return { doc, size, revisions: options.revisions ?? [], preparedBy: options.preparedBy }
}

/** E-601 and E-602 sheets of a design, in plan-set order. */
export function electricalSheets(doc: DesignDocument, options: RenderOptions): Sheet[] {
  const ctx = planSetContext(doc, options)
  const evaluation = options.evaluation ?? evaluateDesign(doc)
  return [...singleLineSheets(ctx, evaluation), ...calculationSheets(ctx, evaluation)]
}

/** The single-line diagram as SVG documents (`single-line.svg` of the package), one per E-601 part. */
export function singleLineSvg(doc: DesignDocument, options: RenderOptions): string[] {
  const ctx = planSetContext(doc, options)
  return singleLineSheets(ctx, options.evaluation ?? evaluateDesign(doc)).map(sheetToSvg)
}

/** E-601 and E-602 as one vector PDF. */
export async function electricalSheetsPdf(doc: DesignDocument, options: RenderOptions): Promise<Uint8Array> {
  return sheetsToPdf(electricalSheets(doc, options), { title: `${doc.project.name} \u2014 electrical sheets`, author: doc.project.installer, subject: doc.project.code })
}

