import { fmt } from '../format'
import { necRef } from '../reference'
import { nextStandardRatingA } from '../tables/standard-ocpd-ratings'
import { TABLE_450_3_B, TABLE_450_3_B_LIMIT_V, type TransformerOcpdBand } from '../tables/transformer-ocpd-450-3-b'
import type { Derived, NecEdition } from '../types'

/**
 * Rated full-load current of a transformer winding: I = S / (√3 · V) three-phase, S / V single-phase.
 * Source: circuit theory; no code section.
 * @param kva      transformer rating [kVA]
 * @param voltageV line-to-line voltage of the winding [V]
 * @param phases   1 or 3
 */
export function transformerRatedCurrent(key: string, label: string, kva: number, voltageV: number, phases: 1 | 3): Derived {
  const divisor = phases === 3 ? Math.sqrt(3) * voltageV : voltageV
  return {
    key, label, value: (kva * 1000) / divisor, unit: 'A',
    formula: phases === 3 ? `${fmt(kva)} kVA × 1000 / (√3 × ${fmt(voltageV)} V)` : `${fmt(kva)} kVA × 1000 / ${fmt(voltageV)} V`,
    reference: '', status: 'info', message: 'Rated full-load current of the winding.',
  }
}

function maxDevice(edition: NecEdition, key: string, label: string, currentA: number, bands: readonly TransformerOcpdBand[], note: string): Derived {
  const band = bands.find((b) => currentA >= b.fromA) ?? bands[bands.length - 1]!
  const limitA = (band.percent / 100) * currentA
  const rounded = band.nextHigherPermitted ? nextStandardRatingA(limitA, 'breaker') : null
  const value = rounded ?? limitA
  return {
    key, label, value, unit: 'A',
    formula: `${band.percent} % × ${fmt(currentA)} A = ${fmt(limitA)} A${rounded !== null && rounded !== limitA ? ` → next standard ${rounded} A (Note 1)` : ''}`,
    reference: necRef(edition, 'Table 450.3(B)'), status: 'info', message: note,
  }
}

/**
 * Largest overcurrent devices for a transformer of 1000 V and less per Table 450.3(B): primary-only
 * protection, or primary (250 %) with secondary protection. Over 1000 V,
 * Table 450.3(A) applies and the engine returns a single warning asking for an engineered design.
 * Source: NFPA 70 450.3(B) and Table 450.3(B) (2017, 2020, 2023; values from memory).
 * @param primaryA   primary rated current [A]
 * @param secondaryA secondary rated current [A]
 * @param highestV   the higher of the two winding voltages [V]
 */
export function transformerOcpd450_3B(edition: NecEdition, key: string, primaryA: number, secondaryA: number, highestV: number): Derived[] {
  const limitV = TABLE_450_3_B_LIMIT_V
  if (highestV > limitV) {
    return [{
      key: `${key}.over${limitV}V`, label: 'Transformer overcurrent protection', value: highestV, unit: 'V',
      formula: `${fmt(highestV)} V > ${limitV} V`, reference: necRef(edition, '450.3(A)'), status: 'warn',
      message: `A winding is over ${limitV} V: Table 450.3(A) governs its protection; the engine does not size it. An engineer must.`,
    }]
  }
  const withSecondary = TABLE_450_3_B.primaryWithSecondary
  return [
    maxDevice(edition, `${key}.primaryOnly`, 'Primary device, primary-only protection', primaryA, TABLE_450_3_B.primaryOnly, 'Largest primary device when the secondary has no device of its own.'),
    maxDevice(edition, `${key}.primaryWithSecondary`, 'Primary device with secondary protection', primaryA, [{ fromA: 0, percent: withSecondary, nextHigherPermitted: false }], 'Largest primary device when the secondary is also protected.'),
    maxDevice(edition, `${key}.secondary`, 'Secondary device', secondaryA, TABLE_450_3_B.secondary, 'Largest secondary device in the primary-and-secondary scheme.'),
  ]
}
