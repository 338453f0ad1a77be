import type { RacewayKind } from '../types'

/**
 * Dimensions and percent area of conduit and tubing (areas of conduit or tubing for the
 * combinations of wires permitted in Table 1).
 * Source: NFPA 70 Chapter 9 Table 4, same in the 2017, 2020 and 2023 editions (values from
 * memory). Articles: EMT 358, PVC (Schedule 40 and 80) 352, RMC 344.
 */
export const RACEWAY_AREAS_REF = 'Chapter 9 Table 4'

/** NEC article of each raceway kind in Table 4. */
export const RACEWAY_ARTICLE: Readonly<Record<RacewayKind, string>> = {
  EMT: 'Article 358 (EMT)',
  PVC40: 'Article 352 (PVC Schedule 40)',
  PVC80: 'Article 352 (PVC Schedule 80)',
  RMC: 'Article 344 (RMC)',
}

export interface RacewayArea {
  /** Trade size as printed, e.g. '1-1/4'. */
  tradeSize: string
  /** Total (100 %) internal area [in²]. */
  totalIn2: number
  /** 40 % column (over 2 wires) [in²]. */
  fortyPercentIn2: number
}

type PrintedRow = readonly [string, number, number]
const rows = (printed: readonly PrintedRow[]): RacewayArea[] =>
  printed.map(([tradeSize, totalIn2, fortyPercentIn2]) => ({ tradeSize, totalIn2, fortyPercentIn2 }))

/** Trade sizes of each raceway kind in ascending order. */
export const RACEWAY_AREAS: Readonly<Record<RacewayKind, readonly RacewayArea[]>> = {
  EMT: rows([
    ['1/2', 0.304, 0.122],
    ['3/4', 0.533, 0.213],
    ['1', 0.864, 0.346],
    ['1-1/4', 1.496, 0.598],
    ['1-1/2', 2.036, 0.814],
    ['2', 3.356, 1.342],
    ['2-1/2', 5.858, 2.343],
    ['3', 8.846, 3.538],
    ['3-1/2', 11.545, 4.618],
    ['4', 14.753, 5.901],
  ]),
  PVC40: rows([
    ['1/2', 0.285, 0.114],
    ['3/4', 0.508, 0.203],
    ['1', 0.832, 0.333],
    ['1-1/4', 1.453, 0.581],
    ['1-1/2', 1.986, 0.794],
    ['2', 3.291, 1.316],
    ['2-1/2', 4.695, 1.878],
    ['3', 7.268, 2.907],
    ['3-1/2', 9.737, 3.895],
    ['4', 12.554, 5.022],
    ['5', 19.761, 7.904],
    ['6', 28.567, 11.427],
  ]),
  PVC80: rows([
    ['1/2', 0.217, 0.087],
    ['3/4', 0.409, 0.164],
    ['1', 0.688, 0.275],
    ['1-1/4', 1.237, 0.495],
    ['1-1/2', 1.711, 0.684],
    ['2', 2.874, 1.15],
    ['2-1/2', 4.119, 1.647],
    ['3', 6.442, 2.577],
    ['3-1/2', 8.688, 3.475],
    ['4', 11.258, 4.503],
    ['5', 17.855, 7.142],
    ['6', 25.598, 10.239],
  ]),
  RMC: rows([
    ['1/2', 0.314, 0.125],
    ['3/4', 0.549, 0.22],
    ['1', 0.887, 0.355],
    ['1-1/4', 1.526, 0.61],
    ['1-1/2', 2.071, 0.829],
    ['2', 3.408, 1.363],
    ['2-1/2', 4.866, 1.946],
    ['3', 7.499, 3.0],
    ['3-1/2', 10.01, 4.004],
    ['4', 12.882, 5.153],
    ['5', 20.212, 8.085],
    ['6', 29.158, 11.663],
  ]),
}
