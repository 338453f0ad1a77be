import type { Insulation, TemperatureColumn } from '../types'
import type { SectionByEdition } from '../reference'

/**
 * Temperature rating of each insulation type in wet and dry locations, i.e. the ampacity-table
 * column its conductors use.
 * Source: NFPA 70-2020 and 2023 Table 310.4(A), 2017 Table 310.104(A) (values from memory):
 * THWN-2, XHHW-2 and USE-2 are 90 °C wet or dry. PV wire is not in that table; its listing
 * (UL 4703) rates it 90 °C wet (common practice, no source in NFPA 70).
 */
export const INSULATION_RATING_REF: SectionByEdition = {
  2017: 'Table 310.104(A)',
  2020: 'Table 310.4(A)',
  2023: 'Table 310.4(A)',
}

export const INSULATION_RATING_C: Readonly<Record<Insulation, TemperatureColumn>> = {
  'THWN-2': 90,
  'XHHW-2': 90,
  'USE-2': 90,
  PV: 90,
}
