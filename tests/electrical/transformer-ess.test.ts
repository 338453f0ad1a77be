import { describe, expect, it } from 'vitest'
import { transformerOcpd450_3B, transformerRatedCurrent } from '../../shared/electrical/rules/transformer'
import { TABLE_450_3_B_LIMIT_V } from '../../shared/electrical/tables/transformer-ocpd-450-3-b'
import { essDisconnect, essMaxCurrent } from '../../shared/electrical/rules/ess'

const byKey = (items: { key: string; value: number }[], suffix: string) => items.find((d) => d.key.endsWith(suffix))?.value

describe('transformer overcurrent protection, Table 450.3(B)', () => {
  // Handbook-style example: 75 kVA, 480 V to 208Y/120 V three-phase. Primary 90.2 A × 125 % =
  // 112.8 A → 125 A (Note 1, next standard size); secondary 208.2 A × 125 % = 260.2 A → 300 A;
  // primary with secondary protection ≤ 250 % = 225.5 A. Table 450.3(B), 2017-2023 (values from memory)
  it('sizes primary-only and primary-and-secondary protection', () => {
    const primary = transformerRatedCurrent('p', '', 75, 480, 3).value
    const secondary = transformerRatedCurrent('s', '', 75, 208, 3).value
    expect(primary).toBeCloseTo(90.21, 2)
    expect(secondary).toBeCloseTo(208.18, 2)
    const items = transformerOcpd450_3B(2023, 'equipment.T1.ocpd', primary, secondary, 480)
    expect(byKey(items, 'primaryOnly')).toBe(125)
    expect(byKey(items, 'primaryWithSecondary')).toBeCloseTo(225.53, 2)
    expect(byKey(items, 'secondary')).toBe(300)
    expect(items.every((d) => d.reference === 'NEC 2023 Table 450.3(B)')).toBe(true)
  })

  // Table 450.3(B): primary currents of 2 A to 9 A take 167 %, under 2 A take 300 %; secondary under 9 A 167 % (values from memory)
  it('uses the small-current rows', () => {
    expect(byKey(transformerOcpd450_3B(2023, 'k', 5, 5, 480), 'primaryOnly')).toBeCloseTo(8.35, 9)
    expect(byKey(transformerOcpd450_3B(2023, 'k', 1.5, 5, 480), 'primaryOnly')).toBeCloseTo(4.5, 9)
    expect(byKey(transformerOcpd450_3B(2023, 'k', 1.5, 5, 480), 'secondary')).toBeCloseTo(8.35, 9)
  })

  // 450.3(B) covers 1000 V and less in 2017, 2020 and 2023; above, Table 450.3(A) applies (from memory)
  it('defers windings over 1000 V to Table 450.3(A) with a warning', () => {
    expect(TABLE_450_3_B_LIMIT_V).toBe(1000)
    const mv = transformerOcpd450_3B(2023, 'k', 1203, 46.3, 12470)
    expect(mv).toHaveLength(1)
    expect(mv[0]?.status).toBe('warn')
    expect(mv[0]?.reference).toBe('NEC 2023 450.3(A)')
    expect(transformerOcpd450_3B(2017, 'k', 100, 60, 1000)).toHaveLength(3)
    expect(transformerOcpd450_3B(2017, 'k', 100, 60, 1001)[0]?.reference).toBe('NEC 2017 450.3(A)')
  })
})

describe('energy storage systems, Article 706', () => {
  // NFPA 70-2017 706.7, NFPA 70-2020/2023 706.15: ESS disconnecting means (numbering from memory)
  it('requires a disconnect, cited per edition', () => {
    expect(essDisconnect(2017, 'k', 'disconnect BDC').reference).toBe('NEC 2017 706.7')
    const missing = essDisconnect(2023, 'k', null)
    expect(missing.status).toBe('fail')
    expect(missing.reference).toBe('NEC 2023 706.15')
  })

  it('takes the nameplate continuous current under 706.30(A)', () => {
    const d = essMaxCurrent(2020, 'k', 100, 60)
    expect(d.value).toBe(100)
    expect(d.reference).toBe('NEC 2020 706.30(A)')
  })
})
