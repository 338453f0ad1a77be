import { fmt } from '../format'
import { necRef } from '../reference'
import type { Derived, NecEdition } from '../types'
import { PV_ISC_MULTIPLIER } from './currents'

/**
 * Whether a PV source circuit needs its own overcurrent device: not when the fault current the
 * other paralleled circuits can feed into it stays within the module's maximum series fuse rating
 * (with one or two strings in parallel this always holds).
 * Source: NFPA 70 690.9(A) and its exception (2017, 2020, 2023; wording and numbering from memory).
 * @param parallelStrings strings paralleled on the same input or combiner [-]
 * @param iscA            module short-circuit current [A]
 * @param maxSeriesFuseA  module maximum series fuse rating [A]
 */
export function sourceCircuitOcpdRequired(
  edition: NecEdition,
  key: string,
  parallelStrings: number,
  iscA: number,
  maxSeriesFuseA: number,
): Derived<boolean> {
  const backfeedA = (parallelStrings - 1) * PV_ISC_MULTIPLIER * iscA
  const required = backfeedA > maxSeriesFuseA
  return {
    key, label: 'Source circuit overcurrent device required', value: required, unit: '-',
    formula: `(${parallelStrings} − 1) × 1.25 × ${fmt(iscA)} A = ${fmt(backfeedA)} A ${required ? '>' : '≤'} ${fmt(maxSeriesFuseA)} A`,
    reference: necRef(edition, '690.9(A)'), status: 'info',
    message: required
      ? 'Fault current from the other strings can exceed the module series fuse rating: fuse each string.'
      : 'Fault current from the other strings stays within the module series fuse rating: no fuse needed.',
  }
}
