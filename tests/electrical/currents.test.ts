import { describe, expect, it } from 'vitest'
import { combinedOutputCurrent, converterOutputCurrent, nameplateCurrent, pvOutputMaxCurrent, pvSourceMaxCurrent } from '../../shared/electrical/rules/currents'
import { sourceCircuitOcpdRequired } from '../../shared/electrical/rules/pv-ocpd'
import { transformerRatedCurrent } from '../../shared/electrical/rules/transformer'
import { essMaxCurrent } from '../../shared/electrical/rules/ess'

describe('maximum circuit current, 690.8(A)', () => {
  // NFPA 70-2023 690.8(A)(1)(a)(1): 125 % of the sum of parallel module Isc (value from memory)
  it('takes 125 % of Isc for a source circuit, numbered per edition', () => {
    expect(pvSourceMaxCurrent(2023, 'k', 13.8).value).toBeCloseTo(17.25, 9)
    expect(pvSourceMaxCurrent(2017, 'k', 13.8).reference).toBe('NEC 2017 690.8(A)(1)')
    expect(pvSourceMaxCurrent(2020, 'k', 13.8).reference).toBe('NEC 2020 690.8(A)(1)(a)')
    expect(pvSourceMaxCurrent(2023, 'k', 10, 2).value).toBe(25)
  })

  // NFPA 70-2017 690.8(A)(2): sum of the parallel source circuit maximum currents (value from memory)
  it('sums source circuits for an output circuit', () => {
    const d = pvOutputMaxCurrent(2017, 'k', [17.25, 17.25, 17.25])
    expect(d.value).toBeCloseTo(51.75, 9)
    expect(d.reference).toBe('NEC 2017 690.8(A)(2)')
  })

  // NFPA 70-2017 690.8(A)(3); NFPA 70-2023 690.8(A)(2): the continuous output current rating (value from memory)
  it('takes the converter continuous output rating, times units on a branch', () => {
    expect(converterOutputCurrent(2023, 'k', 'inverter', 32).value).toBe(32)
    expect(converterOutputCurrent(2023, 'k', 'inverter', 1.21, 8).value).toBeCloseTo(9.68, 9)
    expect(converterOutputCurrent(2017, 'k', 'inverter', 32).reference).toBe('NEC 2017 690.8(A)(3)')
    expect(converterOutputCurrent(2017, 'k', 'dc_dc_converter', 15).reference).toBe('NEC 2017 690.8(A)(5)')
    expect(converterOutputCurrent(2023, 'k', 'charge_controller', 80).label).toContain('charge controller')
  })

  it('sums inverter outputs into an AC combiner and reads nameplates', () => {
    expect(combinedOutputCurrent(2023, 'k', [120.3, 120.3, 120.3]).value).toBeCloseTo(360.9, 9)
    expect(nameplateCurrent(2023, 'k', 10, 'DC load PUMP').reference).toBe('NEC 2023 110.3(B)')
  })

  // NFPA 70 706.30(A) (from memory): the larger nameplate continuous current
  it('takes the larger of ESS charge and discharge current', () => {
    expect(essMaxCurrent(2023, 'k', 150, 120).value).toBe(150)
    expect(essMaxCurrent(2023, 'k', 50, 80).value).toBe(80)
  })
})

describe('transformer rated current, I = S / (√3 V)', () => {
  // handbook full-load current tables: 500 kVA at 480 V three-phase ≈ 601 A; 1000 kVA ≈ 1203 A;
  // 25 kVA at 240 V single-phase ≈ 104 A (values from memory)
  it('matches the usual full-load current figures', () => {
    expect(transformerRatedCurrent('k', '', 500, 480, 3).value).toBeCloseTo(601.4, 1)
    expect(transformerRatedCurrent('k', '', 1000, 480, 3).value).toBeCloseTo(1202.8, 1)
    expect(transformerRatedCurrent('k', '', 25, 240, 1).value).toBeCloseTo(104.2, 1)
  })
})

describe('source circuit fuses, 690.9(A)', () => {
  // NFPA 70 690.9(A) exception (from memory): no fuse when backfeed from the others cannot exceed the series fuse rating
  it('needs no fuse with one or two strings and does with three of a 13.8 A module on a 25 A series fuse', () => {
    expect(sourceCircuitOcpdRequired(2023, 'k', 1, 13.8, 25).value).toBe(false)
    expect(sourceCircuitOcpdRequired(2023, 'k', 2, 13.8, 25).value).toBe(false)
    const three = sourceCircuitOcpdRequired(2023, 'k', 3, 13.8, 25)
    expect(three.value).toBe(true)
    expect(three.formula).toBe('(3 − 1) × 1.25 × 13.8 A = 34.5 A > 25 A')
  })
})
