import type { ConductorSize } from '../types'

/**
 * Conductor properties: area and direct-current resistance at 75 °C (167 °F) of stranded
 * conductors.
 * Source: NFPA 70 Chapter 9 Table 8, same in the 2017, 2020 and 2023 editions (values from
 * memory). Stranded values throughout: PV and feeder conductors are stranded; solid 18–8 AWG
 * rows differ by about 2 %.
 */
export const CONDUCTOR_PROPERTIES_REF = 'Chapter 9 Table 8'

export interface ConductorProperties {
  /** Area [cmil]. */
  areaCmil: number
  /** DC resistance, uncoated copper [Ω/kft]. */
  copperOhmPerKft: number
  /** DC resistance, coated (tinned) copper [Ω/kft]. */
  coatedCopperOhmPerKft: number
  /** DC resistance, aluminium [Ω/kft]. */
  aluminumOhmPerKft: number
}

type PrintedRow = readonly [ConductorSize, number, number, number, number]

const PRINTED: readonly PrintedRow[] = [
  ['18', 1620, 7.95, 8.45, 13.1],
  ['16', 2580, 4.99, 5.29, 8.21],
  ['14', 4110, 3.14, 3.26, 5.17],
  ['12', 6530, 1.98, 2.05, 3.25],
  ['10', 10380, 1.24, 1.29, 2.04],
  ['8', 16510, 0.778, 0.809, 1.28],
  ['6', 26240, 0.491, 0.51, 0.808],
  ['4', 41740, 0.308, 0.321, 0.508],
  ['3', 52620, 0.245, 0.254, 0.403],
  ['2', 66360, 0.194, 0.201, 0.319],
  ['1', 83690, 0.154, 0.16, 0.253],
  ['1/0', 105600, 0.122, 0.127, 0.201],
  ['2/0', 133100, 0.0967, 0.101, 0.159],
  ['3/0', 167800, 0.0766, 0.0797, 0.126],
  ['4/0', 211600, 0.0608, 0.0626, 0.1],
  ['250', 250000, 0.0515, 0.0535, 0.0847],
  ['300', 300000, 0.0429, 0.0446, 0.0707],
  ['350', 350000, 0.0367, 0.0382, 0.0605],
  ['400', 400000, 0.0321, 0.0331, 0.0529],
  ['500', 500000, 0.0258, 0.0265, 0.0424],
  ['600', 600000, 0.0214, 0.0223, 0.0353],
  ['700', 700000, 0.0184, 0.0189, 0.0303],
  ['750', 750000, 0.0171, 0.0176, 0.0282],
  ['800', 800000, 0.0161, 0.0166, 0.0265],
  ['900', 900000, 0.0143, 0.0147, 0.0235],
  ['1000', 1000000, 0.0129, 0.0132, 0.0212],
  ['1250', 1250000, 0.0103, 0.0106, 0.0169],
  ['1500', 1500000, 0.00858, 0.00883, 0.0141],
  ['1750', 1750000, 0.00735, 0.00756, 0.0121],
  ['2000', 2000000, 0.00643, 0.00662, 0.0106],
]

/** Every size the engine knows has a Table 8 row. */
export const CONDUCTOR_PROPERTIES = Object.fromEntries(
  PRINTED.map(([size, areaCmil, copperOhmPerKft, coatedCopperOhmPerKft, aluminumOhmPerKft]) => [
    size,
    { areaCmil, copperOhmPerKft, coatedCopperOhmPerKft, aluminumOhmPerKft },
  ]),
) as Readonly<Record<ConductorSize, ConductorProperties>>
