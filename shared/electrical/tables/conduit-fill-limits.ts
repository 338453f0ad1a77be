/**
 * Percent of cross section of conduit and tubing for conductors and cables.
 * Source: NFPA 70 Chapter 9 Table 1, same in the 2017, 2020 and 2023 editions (values from
 * memory): 1 conductor 53 %, 2 conductors 31 %, over 2 conductors 40 %. Note (1) to the
 * tables: equipment grounding and bonding conductors count when installed.
 */
export const CONDUIT_FILL_REF = 'Chapter 9 Table 1'

/**
 * Fill limit for a number of conductors in one raceway [%], or null unless a whole number ≥ 1.
 * @param conductors every conductor in the raceway, grounding conductors included [-]
 */
export function conduitFillLimitPercent(conductors: number): number | null {
  if (!Number.isInteger(conductors) || conductors < 1) return null
  if (conductors === 1) return 53
  if (conductors === 2) return 31
  return 40
}
