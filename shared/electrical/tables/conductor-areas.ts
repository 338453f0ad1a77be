import type { ConductorSize, Insulation } from '../types'

/**
 * Dimensions of insulated conductors and fixture wires: approximate area [in²].
 * Source: NFPA 70 Chapter 9 Table 5, same in the 2017, 2020 and 2023 editions (values from
 * memory). Rows used:
 * - THWN-2: the "THHN, THWN, THWN-2" row (14 AWG–1000 kcmil).
 * - XHHW-2: the "XHH, XHHW, XHHW-2" row (14 AWG–2000 kcmil).
 * - USE-2 and PV wire: Table 5 lists neither. The "RHH*, RHW*, RHW-2*" row (without outer
 *   covering) is used as the proxy because those types share the cross-linked insulation
 *   thickness class of USE-2 and 600 V PV wire. PV wire rated 1000 V or 2000 V is often thicker:
 *   where the cable data sheet gives a larger diameter, the data sheet governs (Chapter 9 Note (5)
 *   to the tables: actual dimensions for conductors Chapter 9 does not include; from memory).
 */
export const CONDUCTOR_AREAS_REF = 'Chapter 9 Table 5'

/** Table 5 row standing for each insulation, named as printed. */
export const CONDUCTOR_AREA_ROW: Readonly<Record<Insulation, string>> = {
  'THWN-2': 'THHN, THWN, THWN-2',
  'XHHW-2': 'XHH, XHHW, XHHW-2',
  'USE-2': 'RHH*, RHW*, RHW-2* without outer covering (proxy for USE-2)',
  PV: 'RHH*, RHW*, RHW-2* without outer covering (proxy for PV wire)',
}

const THHN_THWN: Partial<Record<ConductorSize, number>> = {
  '14': 0.0097, '12': 0.0133, '10': 0.0211, '8': 0.0366, '6': 0.0507, '4': 0.0824, '3': 0.0973,
  '2': 0.1158, '1': 0.1562, '1/0': 0.1855, '2/0': 0.2223, '3/0': 0.2679, '4/0': 0.3237,
  '250': 0.397, '300': 0.4608, '350': 0.5242, '400': 0.5863, '500': 0.7073, '600': 0.8676,
  '700': 0.9887, '750': 1.0496, '800': 1.1085, '900': 1.2311, '1000': 1.3478,
}

const XHHW: Partial<Record<ConductorSize, number>> = {
  '14': 0.0139, '12': 0.0181, '10': 0.0243, '8': 0.0437, '6': 0.059, '4': 0.0814, '3': 0.0962,
  '2': 0.1146, '1': 0.1534, '1/0': 0.1825, '2/0': 0.219, '3/0': 0.2642, '4/0': 0.3197,
  '250': 0.3904, '300': 0.4536, '350': 0.5166, '400': 0.5782, '500': 0.6984, '600': 0.8709,
  '700': 0.9923, '750': 1.0532, '800': 1.1122, '900': 1.2351, '1000': 1.3519, '1250': 1.718,
  '1500': 2.0156, '1750': 2.3127, '2000': 2.6073,
}

const RHW_NO_COVER: Partial<Record<ConductorSize, number>> = {
  '14': 0.0209, '12': 0.026, '10': 0.0333, '8': 0.0556, '6': 0.0726, '4': 0.0973, '3': 0.1134,
  '2': 0.1333, '1': 0.1901, '1/0': 0.2223, '2/0': 0.2624, '3/0': 0.3117, '4/0': 0.3718,
  '250': 0.4596, '300': 0.5281, '350': 0.5958, '400': 0.6619, '500': 0.7901, '600': 0.9729,
  '700': 1.101, '750': 1.1652, '800': 1.2272, '900': 1.3561, '1000': 1.4784, '1250': 1.8602,
  '1500': 2.1695, '1750': 2.4773, '2000': 2.7818,
}

export const CONDUCTOR_AREAS_IN2: Readonly<Record<Insulation, Readonly<Partial<Record<ConductorSize, number>>>>> = {
  'THWN-2': THHN_THWN,
  'XHHW-2': XHHW,
  'USE-2': RHW_NO_COVER,
  PV: RHW_NO_COVER,
}
