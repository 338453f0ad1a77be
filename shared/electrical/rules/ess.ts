import { fmt } from '../format'
import { necRef } from '../reference'
import type { Derived, NecEdition } from '../types'

/**
 * Article 706 section numbers per edition (from memory): the ESS disconnecting means moved from
 * 706.7 (2017) to 706.15 (2020, 2023); circuit current stays in 706.30(A).
 */
export const SECTION_706 = {
  disconnect: { 2017: '706.7', 2020: '706.15', 2023: '706.15' },
  circuitCurrent: '706.30(A)',
} as const

/**
 * Maximum current of an energy storage system circuit: the larger of the nameplate maximum
 * continuous discharge and charge currents. Conductors and devices are then sized at 125 % of it
 * (706.30(B)) by the conductor rules.
 * Source: NFPA 70 706.30(A) (2017, 2020, 2023; from memory).
 * @param dischargeA maximum continuous discharge current [A]
 * @param chargeA    maximum continuous charge current [A]
 */
export function essMaxCurrent(edition: NecEdition, key: string, dischargeA: number, chargeA: number): Derived {
  return {
    key, label: 'Maximum ESS circuit current', value: Math.max(dischargeA, chargeA), unit: 'A',
    formula: `max(${fmt(dischargeA)} A discharge, ${fmt(chargeA)} A charge)`,
    reference: necRef(edition, SECTION_706.circuitCurrent), status: 'info',
    message: 'Nameplate maximum continuous current of the energy storage system.',
  }
}

/**
 * An ESS needs a disconnecting means for its conductors, integral to the listed unit or within
 * its circuit.
 * Source: NFPA 70 706.7 (2017), 706.15 (2020, 2023) (from memory).
 * @param provided  where the disconnect is, or null when the design shows none
 */
export function essDisconnect(edition: NecEdition, key: string, provided: string | null): Derived<boolean> {
  return {
    key, label: 'ESS disconnecting means', value: provided !== null, unit: '-',
    formula: provided ?? 'none shown', reference: necRef(edition, SECTION_706.disconnect),
    status: provided !== null ? 'pass' : 'fail',
    message: provided !== null ? `Provided: ${provided}.` : 'Show a disconnect on the battery circuit or use a battery with an integral one.',
  }
}
