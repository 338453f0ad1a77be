import type { NecEdition } from './types'

/**
 * Section numbers that moved between editions, given per edition. A plain string means the
 * section has the same number in every edition the engine knows.
 */
export type SectionByEdition = string | Record<NecEdition, string>

/** "NEC 2023 690.7(A)(1)": the reference printed beside a result for the adopted edition. */
export function necRef(edition: NecEdition, section: SectionByEdition): string {
  const number = typeof section === 'string' ? section : section[edition]
  return `NEC ${edition} ${number}`
}
