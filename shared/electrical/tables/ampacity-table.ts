import type { ConductorMaterial, ConductorSize, TemperatureColumn } from '../types'
import type { SectionByEdition } from '../reference'

/** Ampacities of one size in the 60, 75 and 90 °C columns [A]; null where the table has a dash. */
export type AmpacityColumns = Readonly<Record<TemperatureColumn, number | null>>

/** One of the ampacity tables (310.16, 310.17), all based on a 30 °C ambient. */
export interface AmpacityTable {
  /** Table number per edition. */
  reference: SectionByEdition
  title: string
  rows: Readonly<Record<ConductorMaterial, Readonly<Partial<Record<ConductorSize, AmpacityColumns>>>>>
}

/** Table row as printed: size, then the 60, 75 and 90 °C columns [A]. */
export type PrintedAmpacityRow = readonly [ConductorSize, number | null, number | null, number | null]

/** Turns printed rows into a lookup by size. */
export function ampacityRows(printed: readonly PrintedAmpacityRow[]): Partial<Record<ConductorSize, AmpacityColumns>> {
  return Object.fromEntries(printed.map(([size, c60, c75, c90]) => [size, { 60: c60, 75: c75, 90: c90 }]))
}

/**
 * Table ampacity of one conductor before any correction or adjustment [A], or null where the
 * table gives none (size not listed for the material, or a dash in the column).
 */
export function tableAmpacityA(
  table: AmpacityTable,
  size: ConductorSize,
  material: ConductorMaterial,
  column: TemperatureColumn,
): number | null {
  return table.rows[material][size]?.[column] ?? null
}
