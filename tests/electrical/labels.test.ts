import { describe, expect, it } from 'vitest'
import { demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import { evaluateDesign, fmt, type DesignDocument, type NecEdition } from '../../shared/electrical'
import { MISSING_VALUE, requiredLabels, type RequiredLabel } from '../../shared/electrical/rules/labels'
import type { LabelKindId } from '../../shared/electrical/tables/required-labels'

const labelsOf = (doc: DesignDocument) => {
  const evaluation = evaluateDesign(doc)
  return { evaluation, labels: requiredLabels(doc, evaluation) }
}
const inEdition = (key: DemoDesignKey, necEdition: NecEdition): DesignDocument => {
  const doc = demoDesign(key)
  return { ...doc, codeBasis: { ...doc.codeBasis, necEdition } }
}
const kinds = (labels: RequiredLabel[]) => new Set(labels.map((l) => l.kind))
const only = (labels: RequiredLabel[], kind: LabelKindId) => {
  const found = labels.filter((l) => l.kind === kind)
  expect(found, kind).toHaveLength(1)
  return found[0]!
}
const numberOf = (evaluation: ReturnType<typeof evaluateDesign>, key: string) => {
  const d = evaluation.sections.flatMap((s) => s.items).find((x) => x.key === key)
  if (typeof d?.value !== 'number') throw new Error(`no ${key}`)
  return d.value
}

describe('required labels per demo system', () => {
  it('roof-mounted grid-tied string inverter: rapid shutdown, disconnect, DC, interconnection and directory labels (NEC 2023, from memory)', () => {
    const { evaluation, labels } = labelsOf(demoDesign('gridTied'))
    // NEC 2023 690.56(C)(1) and (C)(2): buildings with rapid shutdown (value from memory)
    expect(only(labels, 'rapidShutdownSystem').reference).toBe('NEC 2023 690.56(C)(1)')
    expect(only(labels, 'rapidShutdownSwitch').reference).toBe('NEC 2023 690.56(C)(2)')
    expect(only(labels, 'rapidShutdownSystem').letterHeightIn).toEqual({ title: 3 / 8, text: 3 / 16 })
    // NEC 2023 690.13(B): the AC disconnect is marked, with the line/load warning (value from memory)
    expect(labels.filter((l) => l.kind === 'pvSystemDisconnect').map((l) => l.location)).toContain('On AC disconnect, non-fused (ACD)')
    expect(only(labels, 'lineLoadEnergized').signalWord).toBe('WARNING')
    // NEC 2023 690.53 with 690.7(A)(1): 10 × 37.1 V × (1 + (−0.27 %/°C)(−18 − 25) °C) = 414.07 V (hand calculation)
    const engineV = numberOf(evaluation, 'string.S1.vocMax')
    expect(engineV).toBeCloseTo(10 * 37.1 * (1 + (-0.0027) * (-18 - 25)), 6)
    const dc = only(labels, 'dcMaxVoltage')
    expect(dc.text).toBe(`MAXIMUM DC VOLTAGE OF PV SYSTEM: ${fmt(engineV, 1)} V.`)
    expect(dc.text).toContain('414.1 V')
    expect(dc.reference).toBe('NEC 2023 690.53')
    // NEC 2023 690.31(D)(2): raceway C1 is 65 ft; every 10 ft plus the penetrations → 7 + 2 (common practice, no source)
    const marking = only(labels, 'dcConductorMarking')
    expect(marking.text).toBe('SOLAR PV DC CIRCUIT')
    expect(marking.quantity).toBe(9)
    expect(marking.location).toContain('Raceway C1 (runs R1, R2)')
    // NEC 2023 690.54: rated AC output current of the 32 A inverter and the 240 V nominal voltage (value from memory)
    const poi = labels.filter((l) => l.kind === 'powerSourceOutput')
    expect(poi.map((l) => l.text)).toEqual(Array(2).fill('RATED AC OUTPUT CURRENT: 32 A. NOMINAL OPERATING AC VOLTAGE: 240 V.'))
    // NEC 2023 705.12(B)(3)(2): 1.25 × 32 A + 200 A main ≤ 1.2 × 200 A busbar, so the 120 % allowance governs (value from memory)
    expect(only(labels, 'backfedBreakerFixed').reference).toBe('NEC 2023 705.12(B)(3)(2)')
    expect(kinds(labels).has('busbarSumRule')).toBe(false)
    // NEC 2023 705.10: directory at the service and at the inverter (value from memory)
    expect(only(labels, 'sourceDirectory').quantity).toBe(2)
    expect(kinds(labels).has('essDisconnect')).toBe(false)
    expect(kinds(labels).has('standAloneSystem')).toBe(false)
  })

  it('the edition changes the references and wording (NEC 2017 / 2020 / 2023, from memory)', () => {
    const by = (e: NecEdition) => labelsOf(inEdition('gridTied', e)).labels
    // 690.56(C): 2017 (C)(1)(a), later (C)(1); switch label 2017 (C)(3), later (C)(2)
    expect(only(by(2017), 'rapidShutdownSystem').reference).toBe('NEC 2017 690.56(C)(1)(a)')
    expect(only(by(2017), 'rapidShutdownSwitch').reference).toBe('NEC 2017 690.56(C)(3)')
    expect(only(by(2020), 'rapidShutdownSystem').reference).toBe('NEC 2020 690.56(C)(1)')
    // DC conductor marking: 2017 690.31(G)(3)-(4) "PHOTOVOLTAIC POWER SOURCE", 2020 690.31(D)(2) "SOLAR PV DC CIRCUIT"
    expect(only(by(2017), 'dcConductorMarking')).toMatchObject({ reference: 'NEC 2017 690.31(G)(3) and (G)(4)', text: 'PHOTOVOLTAIC POWER SOURCE' })
    expect(only(by(2020), 'dcConductorMarking')).toMatchObject({ reference: 'NEC 2020 690.31(D)(2)', text: 'SOLAR PV DC CIRCUIT' })
    // 120 % allowance: 2017 705.12(B)(2)(3)(b), 2020 705.12(B)(3)(2)
    expect(only(by(2017), 'backfedBreakerFixed').reference).toBe('NEC 2017 705.12(B)(2)(3)(b)')
    expect(only(by(2020), 'backfedBreakerFixed').reference).toBe('NEC 2020 705.12(B)(3)(2)')
    // 2017 690.53 also asks for the maximum circuit current: 690.8(A)(1) 1.25 × Isc 13.8 A = 17.25 A
    expect(only(by(2017), 'dcMaxVoltage').text).toBe('MAXIMUM DC VOLTAGE: 414.1 V. MAXIMUM CIRCUIT CURRENT: 17.25 A.')
  })

  it('load-side connection by the sum rule gets the sum-rule marking instead (NEC 2023 705.12(B)(3)(3), from memory)', () => {
    const doc = demoDesign('gridTied')
    const tie = { method: 'load_side_breaker' as const, panelId: 'MSP', breakerPosition: 'not_at_end' as const, sumOfBreakersA: 180 }
    const { evaluation, labels } = labelsOf({ ...doc, interconnection: tie })
    expect(evaluation.sections.find((s) => s.id === 'interconnection')!.items.find((d) => d.key === 'interconnection.busbarSum')!.status).toBe('pass')
    expect(only(labels, 'busbarSumRule').reference).toBe('NEC 2023 705.12(B)(3)(3)')
    expect(kinds(labels).has('backfedBreakerFixed')).toBe(false)
  })

  it('microinverters: rapid shutdown and interconnection labels, no DC labels; 100 % rule needs no relocation marking', () => {
    const { labels } = labelsOf(demoDesign('microinverter'))
    expect(kinds(labels).has('rapidShutdownSystem')).toBe(true)
    // no PV DC circuits outside the listed module and microinverter // common practice, no source
    expect(kinds(labels).has('dcMaxVoltage')).toBe(false)
    expect(kinds(labels).has('dcConductorMarking')).toBe(false)
    // NEC 2023 690.54: 16 units × 1.21 A = 19.36 A at 240 V
    expect(only(labels, 'powerSourceOutput').text).toBe('RATED AC OUTPUT CURRENT: 19.36 A. NOMINAL OPERATING AC VOLTAGE: 240 V.')
    // 705.12(B)(3)(1), 2023: 200 A main + 1.25 × 19.36 A ≤ 225 A busbar → no 120 % label (value from memory)
    expect(kinds(labels).has('backfedBreakerFixed')).toBe(false)
    expect(only(labels, 'multipleSources').reference).toBe('NEC 2023 705.12(C)')
  })

  it('storage: ESS disconnect label with the nominal voltage; sources include storage (NEC 2023 706.15(C), 2017 706.7(D); from memory)', () => {
    const { labels } = labelsOf(demoDesign('gridTiedStorage'))
    const ess = only(labels, 'essDisconnect')
    expect(ess.reference).toBe('NEC 2023 706.15(C)')
    expect(ess.location).toBe('On Battery DC disconnect, fused (BDC)')
    expect(ess.text).toContain('NOMINAL ESS VOLTAGE: 51.2 V.')
    expect(ess.text).toContain('MAXIMUM AVAILABLE SHORT-CIRCUIT CURRENT: ________ A')
    expect(only(labels, 'multipleSources').text).toContain('AND AN ENERGY STORAGE SYSTEM')
    expect(only(labels, 'sourceDirectory').text).toContain('ENERGY STORAGE \u2013 Battery DC disconnect, fused (BDC)')
    expect(only(labelsOf(inEdition('gridTiedStorage', 2017)).labels, 'essDisconnect').reference).toBe('NEC 2017 706.7(D)')
  })

  it('off-grid ground rack: stand-alone plaque, DC voltage at the charge controller, no utility labels, no rapid shutdown', () => {
    const { labels } = labelsOf(demoDesign('offGrid'))
    // NEC 2023 710.10; 2017 690.56(A) (values from memory)
    expect(only(labels, 'standAloneSystem').reference).toBe('NEC 2023 710.10')
    expect(only(labelsOf(inEdition('offGrid', 2017)).labels, 'standAloneSystem').reference).toBe('NEC 2017 690.56(A)')
    // 690.7(A)(1): 3 × 37.1 V × 1.1161 = 124.2 V
    expect(only(labels, 'dcMaxVoltage').text).toContain('124.2 V')
    expect(only(labels, 'dcMaxVoltage').location).toContain('(CC1)')
    expect(only(labels, 'essDisconnect').location).toContain('integral to Generic 10 kWh LFP battery')
    for (const k of ['rapidShutdownSystem', 'powerSourceOutput', 'sourceDirectory', 'multipleSources'] as const) expect(kinds(labels).has(k), k).toBe(false)
  })

  it('ground-mount farm with a supply-side tap: supply-side labels, one DC voltage label per inverter, no rapid shutdown', () => {
    const { evaluation, labels } = labelsOf(demoDesign('groundMountFarm'))
    // NEC 2023 705.11; 2017 705.12(A) (values from memory)
    expect(only(labels, 'supplySideDisconnect').reference).toBe('NEC 2023 705.11')
    expect(only(labelsOf(inEdition('groundMountFarm', 2017)).labels, 'supplySideDisconnect').reference).toBe('NEC 2017 705.12(A)')
    expect(kinds(labels).has('rapidShutdownSystem')).toBe(false)
    expect(kinds(labels).has('backfedBreakerFixed')).toBe(false)
    const dc = labels.filter((l) => l.kind === 'dcMaxVoltage')
    expect(dc).toHaveLength(3)
    // 690.7(A)(1): 20 × 49.5 V × (1 + 0.0027 × 43) = 1104.9 V
    expect(numberOf(evaluation, 'string.S1.1.vocMax')).toBeCloseTo(20 * 49.5 * (1 + 0.0027 * 43), 6)
    for (const l of dc) expect(l.text).toContain('1104.9 V')
    expect(only(labels, 'powerSourceOutput').text).toContain(`${fmt(numberOf(evaluation, 'interconnection.sourceCurrent'), 2)} A`)
  })

  it.each(['gridTied', 'gridTiedStorage', 'offGrid', 'microinverter', 'groundMountFarm', 'farm1MW'] as DemoDesignKey[])('%s: every value filled, numbered in order, positive quantities', (key) => {
    const { labels } = labelsOf(demoDesign(key))
    expect(labels.length).toBeGreaterThan(2)
    labels.forEach((l, i) => {
      expect(l.number).toBe(i + 1)
      expect(l.quantity).toBeGreaterThan(0)
      expect(l.missing).toEqual([])
      expect(`${l.title} ${l.text} ${l.location}`).not.toMatch(/undefined|NaN|Infinity|\{\w+\}/)
    })
  })

  it('a value the engine could not compute is printed as missing, never undefined or NaN', () => {
    const doc = demoDesign('gridTied')
    // thin film without a Voc coefficient: 690.7(A) gives no table factor, so the engine has no maximum voltage
    const module = { ...doc.equipment.modules[0]!, technology: 'thin_film' as const, vocCoefficient: null }
    const { evaluation, labels } = labelsOf({ ...doc, equipment: { ...doc.equipment, modules: [module] } })
    expect(evaluation.issues.length).toBeGreaterThan(0)
    const dc = only(labels, 'dcMaxVoltage')
    expect(dc.missing).toEqual(['maxVoltage'])
    expect(dc.text).toBe(`MAXIMUM DC VOLTAGE OF PV SYSTEM: ${MISSING_VALUE}.`)
    expect(dc.text).not.toMatch(/undefined|NaN/)
  })
})
