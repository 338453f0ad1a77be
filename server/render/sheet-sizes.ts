/**
 * Sheet sizes a plan set can be printed on, landscape, in points (1/72 in).
 * Sources: ANSI/ASME Y14.1 (B = 11 × 17 in, D = 22 × 34 in); ISO 216 (A3 = 297 × 420 mm).
 */
export const SHEET_SIZES = {
  ANSI_B: { label: 'ANSI B (11 × 17 in)', widthPt: 17 * 72, heightPt: 11 * 72 },
  ANSI_D: { label: 'ANSI D (22 × 34 in)', widthPt: 34 * 72, heightPt: 22 * 72 },
  A3: { label: 'ISO A3 (297 × 420 mm)', widthPt: (420 / 25.4) * 72, heightPt: (297 / 25.4) * 72 },
} as const

export type SheetSizeName = keyof typeof SHEET_SIZES
export const SHEET_SIZE_NAMES = Object.keys(SHEET_SIZES) as SheetSizeName[]
export const DEFAULT_SHEET_SIZE: SheetSizeName = 'ANSI_B'

/** The size by name, or an error naming the option and the sizes known. */
export function sheetSize(name: string): (typeof SHEET_SIZES)[SheetSizeName] {
  if (!(SHEET_SIZE_NAMES as string[]).includes(name)) {
    throw new RangeError(`sheetSize: "${name}" is not a sheet size; expected one of ${SHEET_SIZE_NAMES.join(', ')}`)
  }
  return SHEET_SIZES[name as SheetSizeName]
}
