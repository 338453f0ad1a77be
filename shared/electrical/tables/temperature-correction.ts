import type { TemperatureColumn } from '../types'
import type { SectionByEdition } from '../reference'

/**
 * Ambient temperature correction factors based on 30 °C (86 °F), for Tables 310.16 and 310.17.
 * Source: NFPA 70-2020 and 2023 Table 310.15(B)(1); NFPA 70-2017 Table 310.15(B)(2)(a).
 * Same values in all three editions (values from memory).
 *
 * Each row covers the band of ambient temperatures up to and including `upToC`, down to the
 * previous row's bound: the printed bands "31–35", "36–40" … use whole degrees, so a fractional
 * ambient such as 35.5 °C falls in the warmer band (the conservative reading).
 */
export const TEMPERATURE_CORRECTION_REF: SectionByEdition = {
  2017: 'Table 310.15(B)(2)(a)',
  2020: 'Table 310.15(B)(1)',
  2023: 'Table 310.15(B)(1)',
}

/** Ambient basis of Tables 310.16 and 310.17 [°C]. */
export const AMPACITY_TABLE_AMBIENT_C = 30

export interface TemperatureCorrectionRow {
  /** Printed band, e.g. "36–40". */
  band: string
  /** Warmest ambient of the band [°C]; the first row ("10 or less") has no lower bound. */
  upToC: number
  /** Factors per insulation temperature column; null where the table has a dash. */
  factors: Readonly<Record<TemperatureColumn, number | null>>
}

const row = (band: string, upToC: number, f60: number | null, f75: number | null, f90: number): TemperatureCorrectionRow => ({
  band,
  upToC,
  factors: { 60: f60, 75: f75, 90: f90 },
})

export const TEMPERATURE_CORRECTION_30C: readonly TemperatureCorrectionRow[] = [
  row('10 or less', 10, 1.29, 1.2, 1.15),
  row('11–15', 15, 1.22, 1.15, 1.12),
  row('16–20', 20, 1.15, 1.11, 1.08),
  row('21–25', 25, 1.08, 1.05, 1.04),
  row('26–30', 30, 1.0, 1.0, 1.0),
  row('31–35', 35, 0.91, 0.94, 0.96),
  row('36–40', 40, 0.82, 0.88, 0.91),
  row('41–45', 45, 0.71, 0.82, 0.87),
  row('46–50', 50, 0.58, 0.75, 0.82),
  row('51–55', 55, 0.41, 0.67, 0.76),
  row('56–60', 60, null, 0.58, 0.71),
  row('61–65', 65, null, 0.47, 0.65),
  row('66–70', 70, null, 0.33, 0.58),
  row('71–75', 75, null, null, 0.5),
  row('76–80', 80, null, null, 0.41),
  row('81–85', 85, null, null, 0.29),
]

/**
 * Band of Table 310.15(B)(1) for an ambient temperature and its factor in one column, or null
 * when the table has no factor (warmer than the column allows, or not a finite number).
 * @param ambientC ambient temperature [°C]
 * @param column conductor insulation temperature rating [°C]
 */
export function temperatureCorrectionRow(
  ambientC: number,
  column: TemperatureColumn,
): { row: TemperatureCorrectionRow; factor: number } | null {
  if (!Number.isFinite(ambientC)) return null
  const found = TEMPERATURE_CORRECTION_30C.find((r) => ambientC <= r.upToC)
  const factor = found?.factors[column]
  return found && factor != null ? { row: found, factor } : null
}

/**
 * The code's equation for correcting ampacity to another ambient:
 * I' = I × √((Tc − Ta′) ÷ (Tc − Ta)), here returned as the factor √((Tc − Ta′) ÷ (Tc − Ta)).
 * Source: NFPA 70-2020/2023 310.15(B), 2017 310.15(B)(2) (from memory).
 * @param ambientC new ambient Ta′ [°C]; must be below the conductor rating
 * @param conductorRatingC temperature rating of the conductor Tc [°C]
 * @param tableAmbientC ambient the table is based on Ta [°C]
 * @returns correction factor [-], or null when Ta′ ≥ Tc (no ampacity left)
 */
export function temperatureCorrectionByFormula(
  ambientC: number,
  conductorRatingC: number,
  tableAmbientC: number = AMPACITY_TABLE_AMBIENT_C,
): number | null {
  if (!Number.isFinite(ambientC) || ambientC >= conductorRatingC || tableAmbientC >= conductorRatingC) return null
  return Math.sqrt((conductorRatingC - ambientC) / (conductorRatingC - tableAmbientC))
}
