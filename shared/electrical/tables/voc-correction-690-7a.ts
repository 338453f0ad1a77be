/**
 * Voltage correction factors for crystalline and multicrystalline silicon modules.
 * Source: NFPA 70 Table 690.7(A), same number and values in the 2017, 2020 and 2023 editions
 * (values from memory). 690.7(A)(1) lets the module manufacturer's temperature coefficient
 * replace this table; the table only applies to crystalline and multicrystalline modules.
 *
 * Each row covers a 5 °C band of lowest expected ambient temperature, named by its warmest and
 * coldest whole degree (e.g. "4 to 0 °C"). A temperature between two bands (e.g. −0.5 °C) falls
 * in the colder band, which gives the larger factor: the conservative reading.
 */
export interface VocCorrectionRow {
  /** Warmest whole degree of the band as printed [°C]. */
  warmestC: number
  /** Coldest whole degree of the band as printed [°C]. */
  coldestC: number
  /** Same band in the table's Fahrenheit column [°F]. */
  warmestF: number
  coldestF: number
  /** Factor applied to the module's rated Voc [-]. */
  factor: number
}

export const VOC_CORRECTION_690_7_A: readonly VocCorrectionRow[] = [
  { warmestC: 24, coldestC: 20, warmestF: 76, coldestF: 68, factor: 1.02 },
  { warmestC: 19, coldestC: 15, warmestF: 67, coldestF: 59, factor: 1.04 },
  { warmestC: 14, coldestC: 10, warmestF: 58, coldestF: 50, factor: 1.06 },
  { warmestC: 9, coldestC: 5, warmestF: 49, coldestF: 41, factor: 1.08 },
  { warmestC: 4, coldestC: 0, warmestF: 40, coldestF: 32, factor: 1.1 },
  { warmestC: -1, coldestC: -5, warmestF: 31, coldestF: 23, factor: 1.12 },
  { warmestC: -6, coldestC: -10, warmestF: 22, coldestF: 14, factor: 1.14 },
  { warmestC: -11, coldestC: -15, warmestF: 13, coldestF: 5, factor: 1.16 },
  { warmestC: -16, coldestC: -20, warmestF: 4, coldestF: -4, factor: 1.18 },
  { warmestC: -21, coldestC: -25, warmestF: -5, coldestF: -13, factor: 1.2 },
  { warmestC: -26, coldestC: -30, warmestF: -14, coldestF: -22, factor: 1.21 },
  { warmestC: -31, coldestC: -35, warmestF: -23, coldestF: -31, factor: 1.23 },
  { warmestC: -36, coldestC: -40, warmestF: -32, coldestF: -40, factor: 1.25 },
]

/** Where a temperature falls in Table 690.7(A). */
export type VocCorrectionLookup =
  | { kind: 'row'; row: VocCorrectionRow }
  /** 25 °C or warmer: at or above STC, the table gives no increase (factor 1.00). */
  | { kind: 'warmer_than_table' }
  /** Colder than −40 °C, or not a finite number: the table does not apply; use the manufacturer's coefficient. */
  | { kind: 'outside_table' }

/**
 * Finds the Table 690.7(A) band of a lowest expected ambient temperature.
 * @param lowestAmbientC lowest expected ambient temperature [°C]
 */
export function lookupVocCorrection690_7A(lowestAmbientC: number): VocCorrectionLookup {
  if (!Number.isFinite(lowestAmbientC)) return { kind: 'outside_table' }
  // A band "warmest to coldest" covers [coldest, warmest + 1): the gap between printed whole
  // degrees goes to the colder band.
  if (lowestAmbientC >= 25) return { kind: 'warmer_than_table' }
  const row = VOC_CORRECTION_690_7_A.find((r) => lowestAmbientC >= r.coldestC)
  return row ? { kind: 'row', row } : { kind: 'outside_table' }
}

/**
 * Table 690.7(A) factor for a lowest expected ambient temperature.
 * Returns null when the table gives no factor: at 25 °C or warmer (no correction, treat as 1.00)
 * and below −40 °C or for a non-finite input (table does not apply). Callers that must tell the
 * two apart use `lookupVocCorrection690_7A`.
 * @param lowestAmbientC lowest expected ambient temperature [°C]
 */
export function vocCorrectionFactor690_7A(lowestAmbientC: number): number | null {
  const found = lookupVocCorrection690_7A(lowestAmbientC)
  return found.kind === 'row' ? found.row.factor : null
}
