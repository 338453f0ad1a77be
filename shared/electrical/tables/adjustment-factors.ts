import type { SectionByEdition } from '../reference'

/**
 * Adjustment factors for more than three current-carrying conductors in a raceway or cable
 * (or bundled without spacing for more than 24 in).
 * Source: NFPA 70-2020 and 2023 Table 310.15(C)(1); NFPA 70-2017 Table 310.15(B)(3)(a).
 * Same values in all three editions (values from memory). Three or fewer: no adjustment.
 */
export const ADJUSTMENT_FACTORS_REF: SectionByEdition = {
  2017: 'Table 310.15(B)(3)(a)',
  2020: 'Table 310.15(C)(1)',
  2023: 'Table 310.15(C)(1)',
}

export interface AdjustmentFactorRow {
  /** Printed band, e.g. "4–6". */
  band: string
  /** Most conductors of the band; Infinity for "41 and above". */
  upToConductors: number
  /** Percent of the table ampacity, as a factor [-]. */
  factor: number
}

export const ADJUSTMENT_FACTORS: readonly AdjustmentFactorRow[] = [
  { band: '1–3', upToConductors: 3, factor: 1 },
  { band: '4–6', upToConductors: 6, factor: 0.8 },
  { band: '7–9', upToConductors: 9, factor: 0.7 },
  { band: '10–20', upToConductors: 20, factor: 0.5 },
  { band: '21–30', upToConductors: 30, factor: 0.45 },
  { band: '31–40', upToConductors: 40, factor: 0.4 },
  { band: '41 and above', upToConductors: Number.POSITIVE_INFINITY, factor: 0.35 },
]

/**
 * Row of the adjustment table for a number of current-carrying conductors, or null unless it is
 * a whole number of at least 1.
 * @param currentCarryingConductors current-carrying conductors together [-]
 */
export function adjustmentFactorRow(currentCarryingConductors: number): AdjustmentFactorRow | null {
  if (!Number.isInteger(currentCarryingConductors) || currentCarryingConductors < 1) return null
  return ADJUSTMENT_FACTORS.find((r) => currentCarryingConductors <= r.upToConductors) ?? null
}
