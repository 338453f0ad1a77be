import type { ConductorMaterial, ConductorSize } from '../types'

/**
 * Minimum size of equipment grounding conductors for grounding raceway and equipment.
 * Source: NFPA 70 Table 250.122, same number and values in the 2017, 2020 and 2023 editions
 * (values from memory). The aluminium column also covers copper-clad aluminium.
 * Rows are keyed by the rating or setting of the automatic overcurrent device ahead of the
 * equipment, conduit etc., "not exceeding" that many amperes.
 */
export interface EgcRow {
  /** Largest overcurrent device rating of the row [A]. */
  upToA: number
  /**
   * Minimum EGC size per material; null where the printed size is not in the engine's size list
   * (the table gives 1200 kcmil aluminium for 5000 and 6000 A, a size without a Table 8 row).
   */
  sizes: Readonly<Record<ConductorMaterial, ConductorSize | null>>
  /** Size as printed in the aluminium column, kept for messages where `sizes.Al` is null. */
  printedAl: string
}

const row = (upToA: number, cu: ConductorSize, al: ConductorSize | '1200'): EgcRow => ({
  upToA,
  sizes: { Cu: cu, Al: al === '1200' ? null : al },
  printedAl: al,
})

export const EGC_250_122: readonly EgcRow[] = [
  row(15, '14', '12'),
  row(20, '12', '10'),
  row(60, '10', '8'),
  row(100, '8', '6'),
  row(200, '6', '4'),
  row(300, '4', '2'),
  row(400, '3', '1'),
  row(500, '2', '1/0'),
  row(600, '1', '2/0'),
  row(800, '1/0', '3/0'),
  row(1000, '2/0', '4/0'),
  row(1200, '3/0', '250'),
  row(1600, '4/0', '350'),
  row(2000, '250', '400'),
  row(2500, '350', '600'),
  row(3000, '400', '600'),
  row(4000, '500', '750'),
  row(5000, '700', '1200'),
  row(6000, '800', '1200'),
]

/**
 * Table 250.122 row for an overcurrent device rating, or null above 6000 A or for a rating that
 * is not a positive finite number.
 * @param ocpdRatingA rating of the overcurrent device ahead of the circuit [A]
 */
export function egcRow(ocpdRatingA: number): EgcRow | null {
  if (!Number.isFinite(ocpdRatingA) || ocpdRatingA <= 0) return null
  return EGC_250_122.find((r) => ocpdRatingA <= r.upToA) ?? null
}
