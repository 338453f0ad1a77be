import type { ConductorMaterial, ConductorSize } from '../types'
import type { SectionByEdition } from '../reference'

/**
 * Minimum size of conductors for 0–2000 V circuits.
 * Source: NFPA 70-2020 and 2023 Table 310.3(A); NFPA 70-2017 Table 310.106(A) (values from
 * memory): 14 AWG copper, 12 AWG aluminium or copper-clad aluminium.
 */
export const MINIMUM_CONDUCTOR_SIZE_REF: SectionByEdition = {
  2017: 'Table 310.106(A)',
  2020: 'Table 310.3(A)',
  2023: 'Table 310.3(A)',
}

export const MINIMUM_CONDUCTOR_SIZE: Readonly<Record<ConductorMaterial, ConductorSize>> = { Cu: '14', Al: '12' }
