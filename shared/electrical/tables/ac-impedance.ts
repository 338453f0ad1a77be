import type { ConductorMaterial, ConductorSize, RacewayKind } from '../types'

/**
 * Alternating-current resistance and reactance for 600 V cables, 3-phase, 60 Hz, 75 °C (167 °F):
 * three single conductors in conduit [Ω/kft to neutral].
 * Source: NFPA 70 Chapter 9 Table 9, same in the 2017, 2020 and 2023 editions (values from
 * memory). Note 2 to the table: effective Z = R × cos θ + XL × sin θ, where θ is the power-factor
 * angle; the printed "effective Z at 0.85 PF" columns follow from it.
 */
export const AC_IMPEDANCE_REF = 'Chapter 9 Table 9'

/** Table 9 raceway columns: PVC, aluminium and steel conduit. */
export type ImpedanceConduit = 'pvc' | 'aluminum' | 'steel'

/**
 * Table 9 column for each raceway kind. EMT and RMC are steel raceways here (common practice,
 * no source: the table's "steel conduit" column is used for steel EMT and rigid steel).
 */
export const IMPEDANCE_CONDUIT_OF: Readonly<Record<RacewayKind, ImpedanceConduit>> = {
  EMT: 'steel',
  RMC: 'steel',
  PVC40: 'pvc',
  PVC80: 'pvc',
}

type ByConduit = Readonly<Record<ImpedanceConduit, number>>

export interface AcImpedanceRow {
  /** Inductive reactance XL; PVC and aluminium conduit share one column [Ω/kft]. */
  reactanceOhmPerKft: ByConduit
  /** AC resistance per material and conduit [Ω/kft]; null where not printed (14 AWG aluminium). */
  resistanceOhmPerKft: Readonly<Record<ConductorMaterial, ByConduit | null>>
  /** Effective Z at 0.85 power factor as printed [Ω/kft]. */
  impedanceAt085OhmPerKft: Readonly<Record<ConductorMaterial, ByConduit | null>>
}

type Triple = readonly [number, number, number]
const byConduit = ([pvc, aluminum, steel]: Triple): ByConduit => ({ pvc, aluminum, steel })

function row(
  xl: readonly [number, number],
  rCu: Triple,
  rAl: Triple | null,
  zCu: Triple,
  zAl: Triple | null,
): AcImpedanceRow {
  return {
    reactanceOhmPerKft: { pvc: xl[0], aluminum: xl[0], steel: xl[1] },
    resistanceOhmPerKft: { Cu: byConduit(rCu), Al: rAl && byConduit(rAl) },
    impedanceAt085OhmPerKft: { Cu: byConduit(zCu), Al: zAl && byConduit(zAl) },
  }
}

/** Sizes printed in Table 9 (14 AWG–1000 kcmil, without 700, 800 and 900 kcmil). */
export const AC_IMPEDANCE: Readonly<Partial<Record<ConductorSize, AcImpedanceRow>>> = {
  '14': row([0.058, 0.073], [3.1, 3.1, 3.1], null, [2.7, 2.7, 2.7], null),
  '12': row([0.054, 0.068], [2.0, 2.0, 2.0], [3.2, 3.2, 3.2], [1.7, 1.7, 1.7], [2.8, 2.8, 2.8]),
  '10': row([0.05, 0.063], [1.2, 1.2, 1.2], [2.0, 2.0, 2.0], [1.1, 1.1, 1.1], [1.8, 1.8, 1.8]),
  '8': row([0.052, 0.065], [0.78, 0.78, 0.78], [1.3, 1.3, 1.3], [0.69, 0.69, 0.7], [1.1, 1.1, 1.1]),
  '6': row([0.051, 0.064], [0.49, 0.49, 0.49], [0.81, 0.81, 0.81], [0.44, 0.45, 0.45], [0.71, 0.72, 0.72]),
  '4': row([0.048, 0.06], [0.31, 0.31, 0.31], [0.51, 0.51, 0.51], [0.29, 0.29, 0.3], [0.46, 0.46, 0.46]),
  '3': row([0.047, 0.059], [0.25, 0.25, 0.25], [0.4, 0.41, 0.4], [0.23, 0.24, 0.24], [0.37, 0.37, 0.37]),
  '2': row([0.045, 0.057], [0.19, 0.2, 0.2], [0.32, 0.32, 0.32], [0.19, 0.19, 0.2], [0.3, 0.3, 0.3]),
  '1': row([0.046, 0.057], [0.15, 0.16, 0.16], [0.25, 0.26, 0.25], [0.15, 0.16, 0.16], [0.24, 0.24, 0.25]),
  '1/0': row([0.044, 0.055], [0.12, 0.13, 0.12], [0.2, 0.21, 0.2], [0.12, 0.13, 0.13], [0.19, 0.2, 0.2]),
  '2/0': row([0.043, 0.054], [0.1, 0.1, 0.1], [0.16, 0.16, 0.16], [0.1, 0.11, 0.11], [0.16, 0.16, 0.16]),
  '3/0': row([0.042, 0.052], [0.077, 0.082, 0.079], [0.13, 0.13, 0.13], [0.088, 0.092, 0.094], [0.13, 0.13, 0.14]),
  '4/0': row([0.041, 0.051], [0.062, 0.067, 0.063], [0.1, 0.11, 0.1], [0.073, 0.078, 0.08], [0.11, 0.11, 0.11]),
  '250': row([0.041, 0.052], [0.052, 0.057, 0.054], [0.085, 0.09, 0.086], [0.064, 0.069, 0.071], [0.094, 0.1, 0.1]),
  '300': row([0.041, 0.051], [0.044, 0.049, 0.045], [0.071, 0.076, 0.072], [0.057, 0.062, 0.064], [0.082, 0.085, 0.088]),
  '350': row([0.04, 0.05], [0.038, 0.043, 0.039], [0.061, 0.066, 0.063], [0.051, 0.056, 0.058], [0.072, 0.076, 0.079]),
  '400': row([0.04, 0.049], [0.033, 0.038, 0.035], [0.054, 0.059, 0.055], [0.048, 0.052, 0.054], [0.066, 0.07, 0.073]),
  '500': row([0.039, 0.048], [0.027, 0.032, 0.029], [0.043, 0.048, 0.045], [0.043, 0.048, 0.05], [0.057, 0.061, 0.064]),
  '600': row([0.039, 0.048], [0.023, 0.028, 0.025], [0.036, 0.041, 0.038], [0.04, 0.045, 0.047], [0.051, 0.055, 0.058]),
  '750': row([0.038, 0.048], [0.019, 0.024, 0.021], [0.029, 0.034, 0.031], [0.036, 0.041, 0.043], [0.045, 0.049, 0.052]),
  '1000': row([0.037, 0.046], [0.015, 0.019, 0.018], [0.023, 0.027, 0.025], [0.032, 0.037, 0.04], [0.039, 0.042, 0.046]),
}
