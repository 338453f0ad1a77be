import { describe, expect, it } from 'vitest'
import { unit } from 'mathjs'
import { CONDUCTOR_SIZES, type ConductorMaterial, type ConductorSize, type TemperatureColumn } from '../../shared/electrical/types'
import { AMPACITY_310_16 } from '../../shared/electrical/tables/ampacity-310-16'
import { AMPACITY_310_17 } from '../../shared/electrical/tables/ampacity-310-17'
import { tableAmpacityA } from '../../shared/electrical/tables/ampacity-table'
import {
  TEMPERATURE_CORRECTION_30C,
  temperatureCorrectionByFormula,
  temperatureCorrectionRow,
} from '../../shared/electrical/tables/temperature-correction'
import { ADJUSTMENT_FACTORS, adjustmentFactorRow } from '../../shared/electrical/tables/adjustment-factors'
import {
  lookupVocCorrection690_7A,
  VOC_CORRECTION_690_7_A,
  vocCorrectionFactor690_7A,
} from '../../shared/electrical/tables/voc-correction-690-7a'
import { nextStandardRatingA, STANDARD_OCPD_RATINGS_A } from '../../shared/electrical/tables/standard-ocpd-ratings'
import { EGC_250_122, egcRow } from '../../shared/electrical/tables/egc-250-122'
import { conduitFillLimitPercent } from '../../shared/electrical/tables/conduit-fill-limits'
import { RACEWAY_AREAS } from '../../shared/electrical/tables/raceway-areas'
import { CONDUCTOR_AREAS_IN2 } from '../../shared/electrical/tables/conductor-areas'
import { CONDUCTOR_PROPERTIES } from '../../shared/electrical/tables/conductor-properties'
import { AC_IMPEDANCE } from '../../shared/electrical/tables/ac-impedance'
import { ROOFTOP_ADDER_C, ROOFTOP_ADDER_MAX_HEIGHT_IN } from '../../shared/electrical/tables/rooftop-adder'

type Spot = readonly [ConductorSize, number]
const a16 = (size: ConductorSize, m: ConductorMaterial, c: TemperatureColumn) => tableAmpacityA(AMPACITY_310_16, size, m, c)
const a17 = (size: ConductorSize, m: ConductorMaterial, c: TemperatureColumn) => tableAmpacityA(AMPACITY_310_17, size, m, c)

describe('Table 310.16 (2020/2023; 2017: Table 310.15(B)(16)) ampacities', () => {
  // NFPA 70-2023 Table 310.16, 60 °C copper column (values from memory)
  it.each<Spot>([
    ['14', 15], ['12', 20], ['10', 30], ['8', 40], ['6', 55], ['4', 70], ['2', 95], ['1/0', 125],
    ['4/0', 195], ['250', 215], ['500', 320], ['1000', 455], ['2000', 555],
  ])('Cu 60 °C %s → %i A', (size, amps) => expect(a16(size, 'Cu', 60)).toBe(amps))

  // NFPA 70-2023 Table 310.16, 75 °C copper column (values from memory)
  it.each<Spot>([
    ['14', 20], ['12', 25], ['10', 35], ['8', 50], ['6', 65], ['4', 85], ['3', 100], ['2', 115],
    ['1', 130], ['1/0', 150], ['2/0', 175], ['3/0', 200], ['4/0', 230], ['250', 255], ['350', 310],
    ['500', 380], ['600', 420], ['750', 475], ['1000', 545],
  ])('Cu 75 °C %s → %i A', (size, amps) => expect(a16(size, 'Cu', 75)).toBe(amps))

  // NFPA 70-2023 Table 310.16, 90 °C copper column (values from memory)
  it.each<Spot>([
    ['18', 14], ['16', 18], ['14', 25], ['12', 30], ['10', 40], ['8', 55], ['6', 75], ['4', 95],
    ['2', 130], ['1/0', 170], ['4/0', 260], ['300', 320], ['500', 430], ['2000', 750],
  ])('Cu 90 °C %s → %i A', (size, amps) => expect(a16(size, 'Cu', 90)).toBe(amps))

  // NFPA 70-2023 Table 310.16, 60 °C aluminium column (values from memory)
  it.each<Spot>([
    ['12', 15], ['10', 25], ['8', 35], ['6', 40], ['4', 55], ['2', 75], ['1/0', 100], ['2/0', 115],
    ['4/0', 150], ['250', 170], ['500', 260], ['1000', 375],
  ])('Al 60 °C %s → %i A', (size, amps) => expect(a16(size, 'Al', 60)).toBe(amps))

  // NFPA 70-2023 Table 310.16, 75 °C aluminium column (values from memory)
  it.each<Spot>([
    ['12', 20], ['10', 30], ['8', 40], ['6', 50], ['4', 65], ['3', 75], ['2', 90], ['1', 100],
    ['1/0', 120], ['2/0', 135], ['3/0', 155], ['4/0', 180], ['250', 205], ['350', 250], ['500', 310],
    ['750', 385], ['1000', 445],
  ])('Al 75 °C %s → %i A', (size, amps) => expect(a16(size, 'Al', 75)).toBe(amps))

  // NFPA 70-2023 Table 310.16, 90 °C aluminium column (values from memory)
  it.each<Spot>([
    ['12', 25], ['10', 35], ['8', 45], ['6', 55], ['4', 75], ['2', 100], ['1/0', 135], ['4/0', 205],
    ['250', 230], ['500', 350], ['1000', 500], ['2000', 630],
  ])('Al 90 °C %s → %i A', (size, amps) => expect(a16(size, 'Al', 90)).toBe(amps))

  it('has dashes where the table has them (18/16 AWG Cu below 90 °C, no Al below 12 AWG)', () => {
    // NFPA 70-2023 Table 310.16: 18 and 16 AWG only in the 90 °C column (value from memory)
    expect(a16('18', 'Cu', 75)).toBeNull()
    expect(a16('16', 'Cu', 60)).toBeNull()
    expect(a16('14', 'Al', 90)).toBeNull()
  })

  it('is consistent: each column grows with size, 60 ≤ 75 ≤ 90 °C in each row, Al below Cu', () => {
    for (const material of ['Cu', 'Al'] as const) {
      for (const column of [60, 75, 90] as const) {
        const values = CONDUCTOR_SIZES.map((s) => a16(s, material, column)).filter((v): v is number => v !== null)
        values.slice(1).forEach((v, i) => expect(v).toBeGreaterThan(values[i] as number))
      }
    }
    for (const size of CONDUCTOR_SIZES) {
      const [c60, c75, c90] = [a16(size, 'Cu', 60), a16(size, 'Cu', 75), a16(size, 'Cu', 90)]
      if (c60 !== null && c75 !== null && c90 !== null) expect(c60 <= c75 && c75 <= c90).toBe(true)
      const al = a16(size, 'Al', 75)
      if (al !== null && c75 !== null) expect(al).toBeLessThan(c75)
    }
  })
})

describe('Table 310.17 (2020/2023; 2017: Table 310.15(B)(17)) free-air ampacities', () => {
  // NFPA 70-2023 Table 310.17, copper and aluminium (values from memory)
  it.each<readonly [ConductorSize, ConductorMaterial, TemperatureColumn, number]>([
    ['14', 'Cu', 90, 35], ['12', 'Cu', 90, 40], ['10', 'Cu', 90, 55], ['10', 'Cu', 75, 50], ['8', 'Cu', 90, 80],
    ['6', 'Cu', 75, 95], ['4/0', 'Cu', 75, 360], ['500', 'Cu', 90, 700], ['2000', 'Cu', 90, 1560],
    ['10', 'Al', 90, 45], ['1/0', 'Al', 75, 180], ['500', 'Al', 75, 485], ['2000', 'Al', 90, 1295],
  ])('%s %s %i °C → %i A', (size, m, c, amps) => expect(a17(size, m, c)).toBe(amps))

  it('is above Table 310.16 for every size and column it shares (free air cools better)', () => {
    for (const material of ['Cu', 'Al'] as const) {
      for (const column of [60, 75, 90] as const) {
        for (const size of CONDUCTOR_SIZES) {
          const raceway = a16(size, material, column)
          const air = a17(size, material, column)
          if (raceway !== null) expect(air).toBeGreaterThan(raceway)
        }
      }
    }
  })
})

describe('Table 310.15(B)(1) (2020/2023; 2017: Table 310.15(B)(2)(a)) temperature correction', () => {
  // NFPA 70-2023 Table 310.15(B)(1), spot rows (values from memory)
  it.each<readonly [number, TemperatureColumn, number]>([
    [38, 90, 0.91], [71, 90, 0.5], [45, 75, 0.82], [30, 60, 1], [-10, 90, 1.15], [52, 60, 0.41], [35.5, 90, 0.91],
  ])('%d °C in the %i °C column → %d', (t, c, f) => expect(temperatureCorrectionRow(t, c)?.factor).toBe(f))

  it('has no factor past the column (60 °C col above 55 °C, 75 °C above 70 °C, 90 °C above 85 °C)', () => {
    expect(temperatureCorrectionRow(56, 60)).toBeNull()
    expect(temperatureCorrectionRow(71, 75)).toBeNull()
    expect(temperatureCorrectionRow(85.5, 90)).toBeNull()
    expect(temperatureCorrectionRow(Number.NaN, 90)).toBeNull()
  })

  // Cross-check of every printed factor against the code's own equation (2023 310.15(B), 2017
  // 310.15(B)(2)): √((Tc − Ta′)/(Tc − 30)) at the warm end of each band, within 0.01.
  it('matches √((Tc − Ta′)/(Tc − Ta)) at every band and column within 0.01', () => {
    let checked = 0
    for (const row of TEMPERATURE_CORRECTION_30C) {
      for (const column of [60, 75, 90] as const) {
        const printed = row.factors[column]
        if (printed === null) continue
        const computed = temperatureCorrectionByFormula(row.upToC, column, 30)
        expect(computed).not.toBeNull()
        expect(Math.abs((computed as number) - printed)).toBeLessThanOrEqual(0.01)
        checked++
      }
    }
    expect(checked).toBe(16 + 13 + 10)
  })

  it('formula gives no factor at or above the conductor rating', () => {
    expect(temperatureCorrectionByFormula(90, 90)).toBeNull()
    expect(temperatureCorrectionByFormula(30, 90)).toBe(1)
  })
})

describe('rooftop adder, 2017 310.15(B)(3)(c) / 2020–2023 310.15(B)(2)', () => {
  it('is 33 °C (60 °F) below 7/8 in (values from memory)', () => {
    expect(ROOFTOP_ADDER_C).toBe(33)
    expect(ROOFTOP_ADDER_MAX_HEIGHT_IN).toBe(0.875)
    // 60 °F of temperature difference is 33.3 °C: the code rounds down to 33
    expect(Math.round((60 * 5) / 9)).toBe(ROOFTOP_ADDER_C)
  })
})

describe('Table 310.15(C)(1) (2020/2023; 2017: Table 310.15(B)(3)(a)) adjustment factors', () => {
  // NFPA 70-2023 Table 310.15(C)(1) (values from memory)
  it.each<readonly [number, number]>([
    [1, 1], [3, 1], [4, 0.8], [6, 0.8], [7, 0.7], [9, 0.7], [10, 0.5], [20, 0.5], [21, 0.45], [30, 0.45],
    [31, 0.4], [40, 0.4], [41, 0.35], [120, 0.35],
  ])('%i conductors → %d', (n, f) => expect(adjustmentFactorRow(n)?.factor).toBe(f))

  it('rejects non-whole and zero counts', () => {
    expect(adjustmentFactorRow(0)).toBeNull()
    expect(adjustmentFactorRow(4.5)).toBeNull()
    expect(ADJUSTMENT_FACTORS).toHaveLength(7)
  })
})

describe('Table 690.7(A) voltage correction factors (2017, 2020, 2023)', () => {
  // NFPA 70-2023 Table 690.7(A), every row (values from memory): [warmest °C, coldest °C, factor]
  const printed: readonly (readonly [number, number, number])[] = [
    [24, 20, 1.02], [19, 15, 1.04], [14, 10, 1.06], [9, 5, 1.08], [4, 0, 1.1], [-1, -5, 1.12],
    [-6, -10, 1.14], [-11, -15, 1.16], [-16, -20, 1.18], [-21, -25, 1.2], [-26, -30, 1.21],
    [-31, -35, 1.23], [-36, -40, 1.25],
  ]
  it.each(printed)('%i to %i °C → %d', (warmest, coldest, factor) => {
    expect(vocCorrectionFactor690_7A(warmest)).toBe(factor)
    expect(vocCorrectionFactor690_7A(coldest)).toBe(factor)
    expect(vocCorrectionFactor690_7A((warmest + coldest) / 2)).toBe(factor)
  })

  it('has the same rows as printed, and °F columns that convert from °C', () => {
    expect(VOC_CORRECTION_690_7_A.map((r) => [r.warmestC, r.coldestC, r.factor])).toEqual(printed)
    for (const r of VOC_CORRECTION_690_7_A) {
      // mathjs as the reference for the °C → °F conversion; the table rounds to whole °F
      expect(Math.abs(unit(r.warmestC, 'degC').toNumber('degF') - r.warmestF)).toBeLessThanOrEqual(1)
      expect(Math.abs(unit(r.coldestC, 'degC').toNumber('degF') - r.coldestF)).toBeLessThanOrEqual(1)
    }
  })

  it('puts a temperature between two printed bands into the colder band', () => {
    expect(vocCorrectionFactor690_7A(-0.5)).toBe(1.12)
    expect(vocCorrectionFactor690_7A(24.9)).toBe(1.02)
  })

  it('gives null outside the table and says which side', () => {
    expect(vocCorrectionFactor690_7A(25)).toBeNull()
    expect(lookupVocCorrection690_7A(25).kind).toBe('warmer_than_table')
    expect(vocCorrectionFactor690_7A(-40.5)).toBeNull()
    expect(lookupVocCorrection690_7A(-41).kind).toBe('outside_table')
    expect(lookupVocCorrection690_7A(Number.NaN).kind).toBe('outside_table')
  })
})

describe('240.6(A) standard ampere ratings (2017 text; Table 240.6(A) in 2020/2023)', () => {
  it('lists every rating up to 1200 A (values from memory)', () => {
    // NFPA 70-2023 Table 240.6(A) with the fuse-only ratings 1, 3, 6, 10 and 601 A (values from memory)
    expect(STANDARD_OCPD_RATINGS_A.filter((r) => r <= 1200)).toEqual([
      1, 3, 6, 10, 15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225,
      250, 300, 350, 400, 450, 500, 600, 601, 700, 800, 1000, 1200,
    ])
    // NFPA 70-2023 Table 240.6(A), ratings above 1200 A (values from memory)
    expect(STANDARD_OCPD_RATINGS_A.filter((r) => r > 1200)).toEqual([1600, 2000, 2500, 3000, 4000, 5000, 6000])
  })

  it('rounds up to the next standard rating', () => {
    expect(nextStandardRatingA(15.63)).toBe(20)
    expect(nextStandardRatingA(20)).toBe(20)
    expect(nextStandardRatingA(8.2)).toBe(10)
    expect(nextStandardRatingA(8.2, 'breaker')).toBe(15)
    expect(nextStandardRatingA(600.5)).toBe(601)
    expect(nextStandardRatingA(600.5, 'breaker')).toBe(700)
    expect(nextStandardRatingA(6000)).toBe(6000)
    expect(nextStandardRatingA(6000.1)).toBeNull()
    expect(nextStandardRatingA(Number.POSITIVE_INFINITY)).toBeNull()
  })
})

describe('Table 250.122 EGC sizes (2017, 2020, 2023)', () => {
  // NFPA 70-2023 Table 250.122, every row: [rating A, Cu, Al or copper-clad Al] (values from memory)
  const printed: readonly (readonly [number, string, string])[] = [
    [15, '14', '12'], [20, '12', '10'], [60, '10', '8'], [100, '8', '6'], [200, '6', '4'], [300, '4', '2'],
    [400, '3', '1'], [500, '2', '1/0'], [600, '1', '2/0'], [800, '1/0', '3/0'], [1000, '2/0', '4/0'],
    [1200, '3/0', '250'], [1600, '4/0', '350'], [2000, '250', '400'], [2500, '350', '600'],
    [3000, '400', '600'], [4000, '500', '750'], [5000, '700', '1200'], [6000, '800', '1200'],
  ]
  it.each(printed)('%i A → %s Cu, %s Al', (amps, cu, al) => {
    const row = egcRow(amps)
    expect(row?.sizes.Cu).toBe(cu)
    expect(row?.printedAl).toBe(al)
  })

  it('uses the row "not exceeding" the rating and has the printed rows in order', () => {
    expect(EGC_250_122.map((r) => r.upToA)).toEqual(printed.map((p) => p[0]))
    expect(egcRow(21)?.sizes.Cu).toBe('10')
    expect(egcRow(6001)).toBeNull()
    expect(egcRow(0)).toBeNull()
    // 1200 kcmil is not in the engine's size list, so the Al size is null there
    expect(egcRow(5000)?.sizes.Al).toBeNull()
  })
})

describe('Chapter 9 Table 1 fill limits', () => {
  // NFPA 70-2023 Chapter 9 Table 1 (values from memory)
  it('is 53 % for 1, 31 % for 2, 40 % for more', () => {
    expect(conduitFillLimitPercent(1)).toBe(53)
    expect(conduitFillLimitPercent(2)).toBe(31)
    expect(conduitFillLimitPercent(3)).toBe(40)
    expect(conduitFillLimitPercent(27)).toBe(40)
    expect(conduitFillLimitPercent(0)).toBeNull()
  })
})

describe('Chapter 9 Table 4 raceway areas', () => {
  // NFPA 70-2023 Chapter 9 Table 4 (values from memory): [kind, trade size, total in², 40 % in²]
  it.each<readonly ['EMT' | 'PVC40' | 'PVC80' | 'RMC', string, number, number]>([
    ['EMT', '1/2', 0.304, 0.122], ['EMT', '3/4', 0.533, 0.213], ['EMT', '1', 0.864, 0.346], ['EMT', '2', 3.356, 1.342],
    ['PVC40', '3/4', 0.508, 0.203], ['PVC40', '2', 3.291, 1.316], ['PVC80', '1', 0.688, 0.275],
    ['PVC80', '1-1/4', 1.237, 0.495], ['RMC', '3/4', 0.549, 0.22], ['RMC', '4', 12.882, 5.153],
  ])('%s %s → %d in² total, %d in² at 40 %', (kind, trade, total, forty) => {
    const row = RACEWAY_AREAS[kind].find((r) => r.tradeSize === trade)
    expect(row?.totalIn2).toBe(total)
    expect(row?.fortyPercentIn2).toBe(forty)
  })

  it('has a 40 % column that is 40 % of the total (to the printed 0.001 in²)', () => {
    for (const rows of Object.values(RACEWAY_AREAS)) {
      for (const r of rows) expect(Math.abs(r.totalIn2 * 0.4 - r.fortyPercentIn2)).toBeLessThanOrEqual(0.0011)
      rows.slice(1).forEach((r, i) => expect(r.totalIn2).toBeGreaterThan((rows[i] as { totalIn2: number }).totalIn2))
    }
  })
})

describe('Chapter 9 Table 5 conductor areas', () => {
  // NFPA 70-2023 Chapter 9 Table 5 (values from memory); PV and USE-2 use the RHW-2 row without outer covering
  it.each<readonly ['THWN-2' | 'XHHW-2' | 'PV' | 'USE-2', ConductorSize, number]>([
    ['THWN-2', '14', 0.0097], ['THWN-2', '12', 0.0133], ['THWN-2', '10', 0.0211], ['THWN-2', '8', 0.0366],
    ['THWN-2', '6', 0.0507], ['THWN-2', '1/0', 0.1855], ['THWN-2', '250', 0.397], ['XHHW-2', '10', 0.0243],
    ['XHHW-2', '4/0', 0.3197], ['PV', '10', 0.0333], ['USE-2', '6', 0.0726],
  ])('%s %s → %d in²', (ins, size, area) => expect(CONDUCTOR_AREAS_IN2[ins][size]).toBe(area))

  it('grows with size in every row', () => {
    for (const row of Object.values(CONDUCTOR_AREAS_IN2)) {
      const values = CONDUCTOR_SIZES.map((s) => row[s]).filter((v): v is number => v !== undefined)
      values.slice(1).forEach((v, i) => expect(v).toBeGreaterThan(values[i] as number))
    }
  })
})

describe('Chapter 9 Table 8 conductor properties', () => {
  // NFPA 70-2023 Chapter 9 Table 8, stranded, DC resistance at 75 °C (values from memory)
  it.each<readonly [ConductorSize, number, number, number]>([
    ['14', 4110, 3.14, 5.17], ['12', 6530, 1.98, 3.25], ['10', 10380, 1.24, 2.04], ['8', 16510, 0.778, 1.28],
    ['6', 26240, 0.491, 0.808], ['4', 41740, 0.308, 0.508], ['2', 66360, 0.194, 0.319], ['1/0', 105600, 0.122, 0.201],
    ['4/0', 211600, 0.0608, 0.1], ['250', 250000, 0.0515, 0.0847], ['500', 500000, 0.0258, 0.0424],
    ['1000', 1000000, 0.0129, 0.0212],
  ])('%s: %i cmil, Cu %d Ω/kft, Al %d Ω/kft', (size, cmil, cu, al) => {
    const row = CONDUCTOR_PROPERTIES[size]
    expect(row.areaCmil).toBe(cmil)
    expect(row.copperOhmPerKft).toBe(cu)
    expect(row.aluminumOhmPerKft).toBe(al)
  })

  // Cross-check against R = ρ·L/A. Constants: annealed copper (100 % IACS) ρ20 = 1.7241 µΩ·cm,
  // α20 = 0.00393 /°C; EC aluminium (61 % IACS) ρ20 = 1.7241/0.61 µΩ·cm, α20 = 0.00403 /°C.
  // Unit conversion by mathjs. Stranding adds about 2 % (lay of the strands), inside the 3 % band.
  const cmilInSquareMetres = (Math.PI / 4) * unit(1, 'mil').toNumber('m') ** 2
  const footInMetres = unit(1, 'ft').toNumber('m')
  const rho75OhmCmilPerFt = (rho20MicroOhmCm: number, alpha20: number) =>
    ((rho20MicroOhmCm * 1e-8 * (1 + alpha20 * (75 - 20))) * footInMetres) / cmilInSquareMetres

  it('has resistivities at 75 °C near 12.9 (Cu) and 21.2 (Al) Ω·cmil/ft', () => {
    expect(rho75OhmCmilPerFt(1.7241, 0.00393)).toBeCloseTo(12.61, 1)
    expect(rho75OhmCmilPerFt(1.7241 / 0.61, 0.00403)).toBeCloseTo(20.77, 1)
  })

  it('matches ρ·1000 ft / A within 3 % for every size, Cu and Al', () => {
    const rhoCu = rho75OhmCmilPerFt(1.7241, 0.00393)
    const rhoAl = rho75OhmCmilPerFt(1.7241 / 0.61, 0.00403)
    for (const size of CONDUCTOR_SIZES) {
      const row = CONDUCTOR_PROPERTIES[size]
      const cuComputed = (rhoCu * 1000) / row.areaCmil
      const alComputed = (rhoAl * 1000) / row.areaCmil
      expect(Math.abs(row.copperOhmPerKft / cuComputed - 1)).toBeLessThanOrEqual(0.03)
      expect(Math.abs(row.aluminumOhmPerKft / alComputed - 1)).toBeLessThanOrEqual(0.03)
      // Tinned copper is a little more resistive than bare copper, never less
      expect(row.coatedCopperOhmPerKft).toBeGreaterThanOrEqual(row.copperOhmPerKft)
    }
  })

  it('has areas that follow the AWG geometric series (area × 1.26 per gauge step)', () => {
    // AWG definition (ASTM B258): diameter ratio 92^(1/39) per gauge, area ratio 92^(2/39) ≈ 1.2610
    const ratio = 92 ** (2 / 39)
    const awg = ['18', '16', '14', '12', '10', '8', '6', '4', '3', '2', '1', '1/0', '2/0', '3/0', '4/0'] as const
    const gauge = (s: (typeof awg)[number]) => (s.includes('/') ? 1 - Number(s.split('/')[0]) : Number(s))
    for (const s of awg) {
      const expected = 211600 / ratio ** (gauge(s) - gauge('4/0'))
      expect(Math.abs(CONDUCTOR_PROPERTIES[s].areaCmil / expected - 1)).toBeLessThanOrEqual(0.005)
    }
  })
})

describe('Chapter 9 Table 9 AC resistance and reactance', () => {
  // NFPA 70-2023 Chapter 9 Table 9 (values from memory)
  it.each<readonly [ConductorSize, 'pvc' | 'aluminum' | 'steel', number, number]>([
    ['12', 'pvc', 0.054, 2.0], ['10', 'steel', 0.063, 1.2], ['6', 'pvc', 0.051, 0.49], ['4/0', 'steel', 0.051, 0.063],
    ['250', 'pvc', 0.041, 0.052], ['500', 'aluminum', 0.039, 0.032],
  ])('%s in %s conduit: XL %d, R(Cu) %d Ω/kft', (size, conduit, xl, r) => {
    expect(AC_IMPEDANCE[size]?.reactanceOhmPerKft[conduit]).toBe(xl)
    expect(AC_IMPEDANCE[size]?.resistanceOhmPerKft.Cu?.[conduit]).toBe(r)
  })

  // Cross-check of the printed "effective Z at 0.85 PF" against the table's own Note 2,
  // Ze = R·cos θ + XL·sin θ. The printed values carry two significant figures, so the tolerance is
  // the larger of 5 % and the rounding of the printed R, XL and Z (half a unit in the last digit).
  it('effective Z at 0.85 PF agrees with R·cos θ + XL·sin θ', () => {
    const halfUnit = (v: number) => 0.5 * 10 ** (Math.floor(Math.log10(v)) - 1)
    const sinTheta = Math.sqrt(1 - 0.85 ** 2)
    let checked = 0
    for (const row of Object.values(AC_IMPEDANCE)) {
      for (const material of ['Cu', 'Al'] as const) {
        for (const conduit of ['pvc', 'aluminum', 'steel'] as const) {
          const r = row?.resistanceOhmPerKft[material]?.[conduit]
          const z = row?.impedanceAt085OhmPerKft[material]?.[conduit]
          if (!row || r === undefined || z === undefined) continue
          const x = row.reactanceOhmPerKft[conduit]
          const computed = r * 0.85 + x * sinTheta
          const rounding = 0.85 * halfUnit(r) + sinTheta * halfUnit(x) + halfUnit(z)
          expect(Math.abs(computed - z)).toBeLessThanOrEqual(Math.max(0.05 * z, rounding))
          checked++
        }
      }
    }
    expect(checked).toBe(21 * 3 + 20 * 3)
  })

  it('has AC resistance close to the Table 8 DC resistance for small sizes (no skin effect)', () => {
    for (const size of ['12', '10', '8', '6'] as const) {
      const ac = AC_IMPEDANCE[size]?.resistanceOhmPerKft.Cu?.pvc as number
      expect(Math.abs(ac / CONDUCTOR_PROPERTIES[size].copperOhmPerKft - 1)).toBeLessThanOrEqual(0.05)
    }
  })
})
