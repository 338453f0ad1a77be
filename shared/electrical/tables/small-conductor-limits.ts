import type { ConductorMaterial, ConductorSize } from '../types'

/**
 * Overcurrent protection limits for small conductors, unless specifically permitted otherwise by
 * 240.4(E) or (G).
 * Source: NFPA 70 240.4(D)(1)–(7), same in the 2017, 2020 and 2023 editions (values from memory).
 * 18 and 16 AWG copper carry further conditions in 240.4(D)(1)–(2) that this limit alone does not check.
 */
export const SMALL_CONDUCTOR_MAX_OCPD_A: Readonly<Record<ConductorMaterial, Readonly<Partial<Record<ConductorSize, number>>>>> = {
  Cu: { '18': 7, '16': 10, '14': 15, '12': 20, '10': 30 },
  Al: { '12': 15, '10': 25 },
}
