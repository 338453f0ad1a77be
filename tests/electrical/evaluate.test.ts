import { describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS, demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import { SAFETY_CAUTION } from '../../shared/electrical/caution'
import { evaluateDesign, evaluateDocument, worstStatus, type Evaluation } from '../../shared/electrical/evaluate'
import { ENGINE_VERSION } from '../../shared/electrical/version'
import type { DesignDocumentInput } from '../../shared/schemas/design'

const copy = (key: DemoDesignKey): DesignDocumentInput => structuredClone(DEMO_DESIGN_INPUTS[key]) as DesignDocumentInput
const item = (ev: Evaluation, key: string) => ev.sections.flatMap((s) => s.items).find((d) => d.key === key)
const runOf = (ev: Evaluation, id: string) => {
  const r = ev.runs.find((x) => x.id === id)
  if (!r) throw new Error(`no run ${id}`)
  return r
}

describe('evaluateDesign over the demo designs', () => {
  it.each(Object.keys(DEMO_DESIGN_INPUTS) as DemoDesignKey[])('%s: no errors, the caution and the engine version', (key) => {
    const ev = evaluateDesign(demoDesign(key))
    expect(ev.issues.filter((i) => i.severity === 'error')).toEqual([])
    expect(ev.valid).toBe(true)
    expect(ev.caution).toBe(SAFETY_CAUTION)
    expect(ev.engineVersion).toBe(ENGINE_VERSION)
    expect(ev.status).not.toBe('fail')
    expect(ev.runs.every((r) => r.maxCurrentA !== null)).toBe(true)
  })

  it('sizes the grid-tied demo as a designer would', () => {
    const ev = evaluateDesign(demoDesign('gridTied'))
    // 1.25 × 13.8 A = 17.25 A, 1.25 × 17.25 A = 21.6 A: 10 AWG Cu after 0.91 × 0.8 (Tables 310.15(B)(1), 310.15(C)(1), NFPA 70-2023, values from memory)
    expect(runOf(ev, 'R1')).toMatchObject({ maxCurrentA: 17.25, size: '10', ocpdA: null, egcSize: '12', conduitTradeSize: '1/2' })
    // 32 A inverter: 40 A OCPD (690.9(B), 240.6(A)); 8 AWG Cu at 75 °C = 50 A (Table 310.16, value from memory); EGC 10 AWG (Table 250.122 for 40 A)
    expect(runOf(ev, 'R3')).toMatchObject({ maxCurrentA: 32, size: '8', ocpdA: 40, egcSize: '10' })
    expect(runOf(ev, 'R4').maxCurrentA).toBe(32)
    expect(item(ev, 'interconnection.busbar120')?.status).toBe('pass')
    expect(item(ev, 'interconnection.busbar100')?.status).toBe('info')
    expect(ev.sections.find((s) => s.id === 'paths')?.items).toHaveLength(2)
  })

  it('summarises the 1 MW farm: 2,400 modules, 120 strings, 10 inverters', () => {
    const ev = evaluateDesign(demoDesign('farm1MW'))
    const summary = Object.fromEntries(ev.summary.map((d) => [d.key, d.value]))
    expect(summary).toMatchObject({ 'summary.modules': 2400, 'summary.strings': 120, 'summary.inverters': 10, 'summary.acKw': 1000 })
    expect(summary['summary.dcKw']).toBeCloseTo(1008, 9)
    // 12 strings in parallel per combiner: each string is fused, 1.25 × 1.25 × 10.9 A = 17 A → 20 A ≤ 25 A series fuse
    expect(runOf(ev, 'RS1.1').ocpdA).toBe(20)
    expect(item(ev, 'run.RT2.mediumVoltage')?.status).toBe('warn')
  })

  it('stays pure and deterministic', () => {
    const doc = demoDesign('gridTiedStorage')
    const before = structuredClone(doc)
    const a = evaluateDesign(doc)
    const b = evaluateDesign(doc)
    expect(doc).toEqual(before)
    expect(JSON.stringify(a)).toBe(JSON.stringify(b))
  })

  it('fails a string whose cold Voc exceeds the inverter rating, and the status follows', () => {
    const doc = copy('gridTied')
    doc.equipment.inverters![0]!.pvInput = { ...doc.equipment.inverters![0]!.pvInput!, maxDcVoltageV: 400, mpptMaxV: 380 }
    const ev = evaluateDocument(doc)
    expect(item(ev, 'string.S1.inverterLimit')?.status).toBe('fail')
    expect(ev.sections.find((s) => s.id === 'string.S1')?.status).toBe('fail')
    expect(ev.status).toBe('fail')
  })

  it('upsizes a long run for voltage drop and shows why', () => {
    const doc = copy('gridTied')
    doc.topology.runs![0]!.lengthFt = 250
    const ev = evaluateDocument(doc)
    const r1 = runOf(ev, 'R1')
    expect(r1.sizeForAmpacity).toBe('10')
    expect(r1.size).not.toBe('10')
    expect(r1.voltageDropPercent).toBeLessThanOrEqual(2)
    expect(item(ev, 'run.R1.voltageDropUpsize')?.formula).toMatch(/^10 AWG → 8 AWG: /)
  })

  it('fails a microinverter branch with too many units and an ESS without a disconnect', () => {
    const micro = copy('microinverter')
    micro.topology.microBranches = [{ id: 'B1', arrayId: 'A1', inverterId: 'MIC', units: 14 }, { id: 'B2', arrayId: 'A1', inverterId: 'MIC', units: 2 }]
    expect(item(evaluateDocument(micro), 'branch.B1.units')?.status).toBe('fail')
    const offGrid = copy('offGrid')
    offGrid.equipment.batteries![0]!.integralDisconnect = false
    expect(item(evaluateDocument(offGrid), 'equipment.BAT1.disconnect')?.status).toBe('fail')
  })

  it('suggests a main-breaker derate when no busbar rule passes', () => {
    const doc = copy('gridTied')
    doc.equipment.inverters![0]!.maxContinuousOutputA = 48
    const ev = evaluateDocument(doc)
    expect(item(ev, 'interconnection.busbar120')?.status).toBe('fail')
    expect(item(ev, 'interconnection.derate')?.value).toBe(175)
    expect(ev.sections.find((s) => s.id === 'interconnection')?.status).toBe('fail')
  })

  it('evaluates a main-breaker derate the designer chose', () => {
    const doc = copy('gridTied')
    doc.equipment.inverters![0]!.maxContinuousOutputA = 48
    doc.interconnection = { method: 'main_breaker_derate', panelId: 'MSP', breakerPosition: 'end_opposite_main', deratedMainBreakerA: 175 }
    expect(item(evaluateDocument(doc), 'interconnection.busbar120')?.status).toBe('pass')
  })
})

describe('evaluateDocument on untrusted input', () => {
  it('returns field-named issues and no results for an invalid document', () => {
    const doc = copy('gridTied')
    doc.topology.strings![0]!.inverterId = 'INV9'
    const ev = evaluateDocument(doc)
    expect(ev.valid).toBe(false)
    expect(ev.status).toBe('fail')
    expect(ev.sections).toEqual([])
    expect(ev.caution).toBe(SAFETY_CAUTION)
    expect(ev.issues.map((i) => i.field)).toContain('topology.strings[0].inverterId')
  })

  it('never throws on junk', () => {
    for (const junk of [undefined, null, 42, 'design', [], { schemaVersion: 1 }]) {
      expect(evaluateDocument(junk).valid).toBe(false)
    }
  })
})

describe('worstStatus', () => {
  it('orders fail > warn > pass > info', () => {
    expect(worstStatus([])).toBe('info')
    expect(worstStatus(['info', 'pass'])).toBe('pass')
    expect(worstStatus(['pass', 'warn', 'info'])).toBe('warn')
    expect(worstStatus(['warn', 'fail', 'pass'])).toBe('fail')
  })
})

describe('engine issues name the field', () => {
  it('puts a missing Voc coefficient of a thin-film module on that module, once', () => {
    const doc = copy('gridTied')
    doc.equipment.modules[0] = { ...doc.equipment.modules[0]!, technology: 'thin_film', vocCoefficient: null }
    const ev = evaluateDocument(doc)
    expect(ev.valid).toBe(true)
    expect(ev.status).toBe('fail')
    expect(ev.issues).toEqual([expect.objectContaining({ field: 'equipment.modules[0].vocCoefficient', severity: 'error' })])
  })
})

describe('raceways', () => {
  // NFPA 70-2023 Table 310.15(C)(1): adjustment counts every current-carrying conductor in the raceway
  it('warns when a run declares fewer current-carrying conductors than its raceway holds', () => {
    const ok = evaluateDesign(demoDesign('gridTied'))
    expect(item(ok, 'raceway.C1.currentCarrying')).toMatchObject({ value: 4, status: 'pass' })
    const doc = copy('gridTied')
    doc.topology.runs![0]!.currentCarryingConductors = 2
    const ev = evaluateDocument(doc)
    expect(item(ev, 'raceway.C1.currentCarrying')?.status).toBe('warn')
    expect(item(ev, 'raceway.C1.currentCarrying')?.message).toContain('R1')
  })

  it('gives each parallel set of a lone run its own raceway', () => {
    const ev = evaluateDesign(demoDesign('farm1MW'))
    const rt1 = runOf(ev, 'RT1')
    expect(rt1.parallelSets).toBeGreaterThan(1)
    expect(ev.sections.find((s) => s.id === 'raceway.run.RT1')?.title).toContain(`each of ${rt1.parallelSets}`)
  })
})
