/**
 * Standard ampere ratings for fuses and inverse time circuit breakers.
 * Source: NFPA 70 240.6(A): a list in the 2017 text, Table 240.6(A) from 2020, same values in
 * 2017, 2020 and 2023 (values from memory). The code also lists 1, 3, 6, 10 and 601 A as
 * additional standard ratings for fuses only.
 */
export type OcpdDeviceKind = 'fuse_or_breaker' | 'fuse_only'

export interface StandardOcpdRating {
  ratingA: number
  devices: OcpdDeviceKind
}

const FUSE_AND_BREAKER_RATINGS_A = [
  15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350,
  400, 450, 500, 600, 700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000,
] as const
const FUSE_ONLY_RATINGS_A = [1, 3, 6, 10, 601] as const

/** Every standard rating with the devices it applies to, ascending. */
export const STANDARD_OCPD_RATINGS: readonly StandardOcpdRating[] = [
  ...FUSE_AND_BREAKER_RATINGS_A.map((ratingA) => ({ ratingA, devices: 'fuse_or_breaker' as const })),
  ...FUSE_ONLY_RATINGS_A.map((ratingA) => ({ ratingA, devices: 'fuse_only' as const })),
].sort((a, b) => a.ratingA - b.ratingA)

/** Every standard rating (fuses and breakers, including the fuse-only ratings), ascending [A]. */
export const STANDARD_OCPD_RATINGS_A: readonly number[] = STANDARD_OCPD_RATINGS.map((r) => r.ratingA)

/** The largest standard rating in 240.6(A) [A]. */
export const LARGEST_STANDARD_OCPD_RATING_A = Math.max(...STANDARD_OCPD_RATINGS_A)

/** Device the rating is for: a fuse may take any standard rating, a breaker only the shared ones. */
export type OcpdDevice = 'fuse' | 'breaker'

/**
 * Smallest standard rating not below `minA`, or null when `minA` exceeds 6000 A or is not a
 * finite number.
 * @param minA least acceptable rating [A]
 * @param device 'fuse' (default) admits every rating including the fuse-only ones; 'breaker'
 *   keeps to the ratings shared by fuses and breakers
 */
export function nextStandardRatingA(minA: number, device: OcpdDevice = 'fuse'): number | null {
  if (!Number.isFinite(minA)) return null
  const admitted = STANDARD_OCPD_RATINGS.filter((r) => device === 'fuse' || r.devices === 'fuse_or_breaker')
  return admitted.find((r) => r.ratingA >= minA)?.ratingA ?? null
}
