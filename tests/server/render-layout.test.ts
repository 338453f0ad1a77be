import { describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS, demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import { evaluateDesign } from '../../shared/electrical'
import { parseDesign, type DesignDocument, type DesignDocumentInput } from '../../shared/schemas/design'
import { boxesIntersect } from '../../server/render/model'
import { compactIds, layoutSingleLine, planSetContext, singleLineSheets, type SingleLineLayout } from '../../server/render'

/** A farm of `inverters` inverters with `perInverter` strings each, built from the 1 MW demo's parts. */
function farm(inverters: number, perInverter: number): DesignDocument {
  const base = DEMO_DESIGN_INPUTS.farm1MW
  const inverterTemplate = base.equipment.inverters![0]!
  const combinerTemplate = base.equipment.combiners![0]!
  const ids = Array.from({ length: inverters }, (_, i) => i + 1)
  const strings = ids.flatMap((i) => Array.from({ length: perInverter }, (_, k) => ({ id: `S${i}.${k + 1}`, arrayId: `ROW${i}`, modulesInSeries: 20, inverterId: `INV${i}`, mppt: 1, combinerId: `CB${i}` })))
  const runTemplate = base.topology.runs!
  const pvRun = runTemplate.find((r) => r.kind === 'pv_source')!
  const combRun = runTemplate.find((r) => r.kind === 'pv_output')!
  const invRun = runTemplate.find((r) => r.kind === 'inverter_output')!
  const input: DesignDocumentInput = {
    ...base,
    equipment: {
      ...base.equipment,
      inverters: ids.map((i) => ({ ...inverterTemplate, id: `INV${i}` })),
      combiners: [...ids.map((i) => ({ ...combinerTemplate, id: `CB${i}` })), { ...base.equipment.combiners!.at(-1)!, inputs: Math.max(12, inverters) }],
      transformers: [{ ...base.equipment.transformers![0]!, kva: 2500 }],
    },
    topology: {
      arrays: ids.map((i) => ({ ...base.topology.arrays[0]!, id: `ROW${i}`, moduleCount: perInverter * 20 })),
      strings,
      runs: [
        ...strings.map((s, k) => ({ ...pvRun, id: `RS${s.id.slice(1)}`, from: s.id, to: s.combinerId, lengthFt: 40 + (k % perInverter) * 15 })),
        ...ids.flatMap((i) => [{ ...combRun, id: `RC${i}`, from: `CB${i}`, to: `INV${i}` }, { ...invRun, id: `RI${i}`, from: `INV${i}`, lengthFt: 60 + i * 25 }]),
        ...runTemplate.filter((r) => r.kind.startsWith('transformer')),
      ],
    },
  }
  const parsed = parseDesign(input)
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => `${i.field}: ${i.message}`).join('; '))
  return parsed.value
}

function overlaps(layout: SingleLineLayout): string[] {
  const found: string[] = []
  const boxes = layout.collisions
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i]!
      const b = boxes[j]!
      if (a.within === b.id || b.within === a.id) continue
      if (boxesIntersect(a.box, b.box)) found.push(`${a.id} × ${b.id}`)
    }
  }
  return found
}

const KEYS = Object.keys(DEMO_DESIGN_INPUTS) as DemoDesignKey[]

describe('single-line layout', () => {
  const cases: [string, DesignDocument][] = [...KEYS.map((k) => [k, demoDesign(k)] as [string, DesignDocument]), ['20 inverters / 200 strings', farm(20, 10)]]

  it.each(cases)('%s: no two symbol, tag or text boxes intersect', (_name, doc) => {
    const layout = layoutSingleLine(doc, evaluateDesign(doc))
    expect(layout.collisions.length).toBeGreaterThan(5)
    expect(overlaps(layout)).toEqual([])
  })

  it.each(cases)('%s: every device is drawn and every run is tagged and scheduled', (_name, doc) => {
    const evaluation = evaluateDesign(doc)
    const layout = layoutSingleLine(doc, evaluation)
    const endpoints = new Set(doc.topology.runs.flatMap((r) => [r.from, r.to]))
    for (const id of endpoints) expect(layout.deviceIds).toContain(id)
    const scheduled = new Set(layout.schedule.flatMap((l) => l.runIds))
    expect([...scheduled].sort()).toEqual(doc.topology.runs.map((r) => r.id).sort())
    const tagged = new Set(layout.items.filter((i) => i.kind === 'group' && i.role === 'tag').flatMap((i) => (i.kind === 'group' ? i.data.runs!.split(' ') : [])))
    expect([...tagged].sort()).toEqual(doc.topology.runs.map((r) => r.id).sort())
  })

  it('draws power flowing left to right: array, inverter, disconnect, service, utility', () => {
    const doc = demoDesign('gridTied')
    const layout = layoutSingleLine(doc, evaluateDesign(doc))
    const x = (id: string) => layout.collisions.find((c) => c.id === `symbol:${id}`)!.box.x
    const group = layout.collisions.find((c) => c.id.startsWith('symbol:group:'))!.box.x
    expect(group).toBeLessThan(x('INV1'))
    expect(x('INV1')).toBeLessThan(x('ACD'))
    expect(x('ACD')).toBeLessThan(x('MSP'))
    expect(x('MSP')).toBeLessThan(x('service:meter'))
    expect(x('service:meter')).toBeLessThan(x('service:utility'))
  })

  it('groups identical strings as "(n) strings of m modules"', () => {
    const doc = demoDesign('farm1MW')
    const layout = layoutSingleLine(doc, evaluateDesign(doc))
    const labels = JSON.stringify(layout.items)
    expect(labels.match(/\(12\) strings of 20 modules/g)).toHaveLength(10)
    const micro = demoDesign('microinverter')
    expect(JSON.stringify(layoutSingleLine(micro, evaluateDesign(micro)).items)).toContain('(2) branches of 8 microinverters')
  })

  it('keeps 20 inverters and 200 strings on one ANSI D sheet and splits the 1 MW farm on ANSI B', () => {
    const big = farm(20, 10)
    expect(singleLineSheets(planSetContext(big, { size: 'ANSI_D', preparedBy: 'Test' }), evaluateDesign(big)).map((s) => s.id)).toEqual(['E-601'])
    const mw = demoDesign('farm1MW')
    const parts = singleLineSheets(planSetContext(mw, { size: 'ANSI_B', preparedBy: 'Test' }), evaluateDesign(mw))
    expect(parts.length).toBeGreaterThan(1)
    expect(parts[0]!.id).toBe('E-601.1')
    // every run appears on some part
    const runsShown = new Set(parts.flatMap((p) => JSON.stringify(p.items).match(/"runs":"[^"]*"/g) ?? []).flatMap((m) => m.slice(8, -1).split(' ')))
    for (const r of mw.topology.runs) expect(runsShown).toContain(r.id)
  })

  it('draws DC optimisers as module-level electronics on the string group', () => {
    const input = structuredClone(DEMO_DESIGN_INPUTS.gridTied) as DesignDocumentInput
    input.equipment.optimizers = [{ id: 'OPT', name: 'Generic module optimiser', maxOutputVoltageV: 80, maxOutputCurrentA: 15, maxInputVoltageV: 80 }]
    input.topology.strings = input.topology.strings!.map((st) => ({ ...st, optimizerId: 'OPT' }))
    input.topology.runs = input.topology.runs!.map((r) => (r.kind === 'pv_source' ? { ...r, kind: 'dc_dc_output' as const } : r))
    const parsed = parseDesign(input)
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues))
    const layout = layoutSingleLine(parsed.value, evaluateDesign(parsed.value))
    expect(overlaps(layout)).toEqual([])
    expect(JSON.stringify(layout.items)).toContain('optimizers: Generic module optimiser')
    const group = layout.collisions.find((c) => c.id.startsWith('symbol:group:'))!
    expect(group.box.width).toBeGreaterThan(40)
  })

  it('writes consecutive ids as ranges', () => {
    expect(compactIds(['S1.1', 'S1.2', 'S1.3', 'S2.1', 'X'])).toBe('S1.1\u2013S1.3, S2.1, X')
  })
})
