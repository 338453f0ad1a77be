/**
 * Unit conversions the engine's data rely on, checked against mathjs (an independent reference
 * library): the °F column of Table 690.7(A), voltage drop in metres and ohms per kilometre,
 * conductor areas in circular mils and square millimetres.
 */
import { evaluate, unit, type Unit } from 'mathjs'
import { describe, expect, it } from 'vitest'
import { voltageDrop } from '../../shared/electrical/rules/conductors'
import { CONDUCTOR_PROPERTIES } from '../../shared/electrical/tables/conductor-properties'
import { CONDUCTOR_AREAS_IN2 } from '../../shared/electrical/tables/conductor-areas'
import { VOC_CORRECTION_690_7_A } from '../../shared/electrical/tables/voc-correction-690-7a'

const fahrenheit = (c: number) => unit(c, 'degC').toNumber('degF')
/** One circular mil is the area of a circle one mil (0.001 in) across: π/4 mil². */
const cmilToMm2 = (cmil: number) => (evaluate(`pi / 4 * ${cmil} mil^2`) as Unit).toNumber('mm^2')

describe('°C and °F', () => {
  // NFPA 70 Table 690.7(A) prints both scales; 5 °C bands are exactly 9 °F bands (values from memory)
  it('the °F bands of Table 690.7(A) are the °C bands converted', () => {
    for (const row of VOC_CORRECTION_690_7_A) {
      expect(row.coldestF).toBe(Math.round(fahrenheit(row.coldestC)))
      // the band runs up to, not including, the next whole °C: its warmest °F is one below (warmest + 1) °C
      expect(row.warmestF).toBe(Math.round(fahrenheit(row.warmestC + 1)) - 1)
    }
  })
})

describe('feet and metres', () => {
  it('a DC voltage drop computed in feet equals the same drop computed in SI units', () => {
    const lengthFt = 65
    const result = voltageDrop({ key: 'k', edition: 2023, system: 'dc', currentA: 12.9, voltageV: 310, lengthFt, size: '10', material: 'Cu', parallelSets: 1, method: 'EMT', limitPercent: 2 })
    if (!result.ok) throw new Error(JSON.stringify(result.issues))
    const ohmPerKm = unit(CONDUCTOR_PROPERTIES['10']!.copperOhmPerKft, 'ohm').toNumber('ohm') / unit(1000, 'ft').toNumber('km')
    const lengthKm = unit(lengthFt, 'ft').toNumber('km')
    expect(result.value.dropV).toBeCloseTo(2 * lengthKm * 12.9 * ohmPerKm, 3)
  })
})

describe('circular mils, square inches and square millimetres', () => {
  // ASTM B258 metric areas: 10 AWG 5.26 mm², 4/0 AWG 107.2 mm²; 250 kcmil 126.7 mm² (values from memory)
  it('Chapter 9 Table 8 areas convert to the familiar metric areas', () => {
    expect(cmilToMm2(CONDUCTOR_PROPERTIES['10']!.areaCmil)).toBeCloseTo(5.26, 2)
    expect(cmilToMm2(CONDUCTOR_PROPERTIES['4/0']!.areaCmil)).toBeCloseTo(107.2, 1)
    expect(cmilToMm2(CONDUCTOR_PROPERTIES['250']!.areaCmil)).toBeCloseTo(126.7, 1)
  })

  // ASTM B258: d(n) = 0.005 in × 92^((36 − n)/39); area in cmil = d² in mil²
  it('Table 8 AWG areas follow the AWG diameter formula within 0.5 %', () => {
    for (const [size, gauge] of [['14', 14], ['12', 12], ['10', 10], ['8', 8], ['6', 6], ['4', 4], ['2', 2], ['1', 1]] as const) {
      const dMil = unit(0.005 * 92 ** ((36 - gauge) / 39), 'inch').toNumber('mil')
      expect(Math.abs(CONDUCTOR_PROPERTIES[size]!.areaCmil / dMil ** 2 - 1)).toBeLessThan(0.005)
    }
  })

  // NFPA 70 Chapter 9 Table 5 prints both: 10 AWG THWN-2 0.0211 in² = 13.61 mm² (values from memory)
  it('Chapter 9 Table 5 in² convert to its printed mm²', () => {
    expect(unit(CONDUCTOR_AREAS_IN2['THWN-2']['10']!, 'inch^2').toNumber('mm^2')).toBeCloseTo(13.61, 1)
  })

  it('a kcmil is 0.5067 mm²', () => {
    expect(cmilToMm2(1000)).toBeCloseTo(0.5067, 4)
  })
})
