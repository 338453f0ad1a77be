/**
 * Public API of the rendering core: design + evaluation → drawing model (sheets) → SVG / PDF.
 * Later work (the package, revisions, jobs) calls only what is exported here; the whole
 * plan set (G-001 … E-604 and the datasheets) comes from `planSetSheets` / `planSetPdf`.
 */
import { evaluateDesign } from '../../shared/electrical'
import type { DesignDocument } from '../../shared/schemas/design'
import type { Sheet } from './model'
import { sheetsToPdf } from './pdf'
import { calculationSheets } from './sheets/e602-calculations'
import { singleLineSheets } from './sheets/e601-single-line'
import { planSetContext, type RenderOptions } from './plan-set'
import { sheetToSvg } from './svg'

export type { Box, DrawItem, Sheet, TextItem } from './model'
export type { AhjRequirements, PlanSetContext, RevisionEntry } from './sheets/frame'
export type { CollisionBox, ScheduleLine, SingleLineLayout, SingleLineOptions } from './layout/sld'
export { SHEET_SIZES, SHEET_SIZE_NAMES, DEFAULT_SHEET_SIZE, type SheetSizeName } from './sheet-sizes'
export { layoutSingleLine, compactIds } from './layout/sld'
export { singleLineSheets, MIN_DIAGRAM_SCALE } from './sheets/e601-single-line'
export { calculationSheets } from './sheets/e602-calculations'
export { frameSheet } from './sheets/frame'
export { sheetToSvg } from './svg'
export { sheetsToPdf, type PdfMetadata } from './pdf'
export { printable } from './fonts'
export { planSetContext, planSetSheets, planSetPdf, attachmentLetter, type RenderOptions, type PlanSetInput, type DatasheetAttachment, type AttachmentOutcome } from './plan-set'
export { coverSheet, type SheetIndexEntry } from './sheets/g001-cover'
export { arrayLayoutSheets, planArrayLayout, compassPoint, type ArrayLayoutPage, type PlacedArrayBlock, type ModuleGroup } from './sheets/e101-array-layout'
export { equipmentSheets, equipmentLines, attachmentFor, type AttachmentRef, type EquipmentLine } from './sheets/e604-equipment'
export { labelSheets } from './sheets/e603-labels'

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

