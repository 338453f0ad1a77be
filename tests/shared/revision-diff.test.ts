import { describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS, demoDesign } from '../../shared/demo/designs'
import { evaluateDesign, type Evaluation } from '../../shared/electrical'
import { diffRevisions, type RevisionSide } from '../../shared/revisions/diff'
import { parseDesign, type DesignDocumentInput } from '../../shared/schemas/design'
import type { DiffArea, RevisionDiff } from '../../shared/schemas/revision'

const side = (number: number, input: DesignDocumentInput): RevisionSide => {
  const parsed = parseDesign(input)
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues))
  return { number, doc: parsed.value, evaluation: evaluateDesign(parsed.value) }
}
const base = () => structuredClone(DEMO_DESIGN_INPUTS.gridTied) as DesignDocumentInput
const areas = (d: RevisionDiff) => d.groups.map((g) => g.area)
const group = (d: RevisionDiff, area: DiffArea) => d.groups.find((g) => g.area === area)?.changes ?? []
const run = (e: Evaluation, id: string) => e.runs.find((r) => r.id === id)!

describe('revision difference', () => {
  it('finds no changes between equal revisions', () => {
    const d = diffRevisions(side(0, base()), side(1, base()))
    expect(d.groups).toEqual([])
    expect(d.summary).toBe('No changes between revision 0 and revision 1.')
  })

  it('a larger minimum conductor size on R3 changes its conductor and its voltage drop, nothing else', () => {
    const input = base()
    input.topology.runs!.find((r) => r.id === 'R3')!.minimumSize = '6'
    const a = side(0, base())
    const b = side(1, input)
    const d = diffRevisions(a, b)
    expect(areas(d)).toEqual(['conductors', 'results'])
    const sizeChanges = group(d, 'conductors').filter((c) => c.field === 'conductor size')
    // the engine's own sizes before and after, in trade notation
    expect(sizeChanges).toEqual([{ kind: 'changed', subject: 'Run R3 (INV1 \u2192 ACD)', field: 'conductor size', before: `#${run(a.evaluation, 'R3').size} AWG`, after: '#6 AWG' }])
    expect(group(d, 'conductors').every((c) => c.subject.startsWith('Run R3'))).toBe(true)
    const drop = group(d, 'results').find((c) => c.subject.startsWith('Run R3') && c.field === 'voltage drop')!
    expect(Number.parseFloat(drop.after!)).toBeLessThan(Number.parseFloat(drop.before!))
    expect(d.summary).toContain('Run R3 (INV1 \u2192 ACD): conductor size changed from')
  })

  it('a larger inverter output raises the AC OCPD: the OCPD change carries the engine values', () => {
    const input = base()
    input.equipment.inverters![0]!.maxContinuousOutputA = 40
    const a = side(0, base())
    const b = side(1, input)
    const d = diffRevisions(a, b)
    const ocpd = group(d, 'ocpd')
    expect(ocpd.length).toBeGreaterThan(0)
    for (const c of ocpd) {
      const id = /^Run (\S+)/.exec(c.subject)![1]!
      expect(c).toMatchObject({ kind: 'changed', field: 'OCPD rating', before: `${run(a.evaluation, id).ocpdA} A`, after: `${run(b.evaluation, id).ocpdA} A` })
    }
    // 1.25 × 40 A = 50 A, a standard rating (NEC 2023 690.9(B), 240.6(A); value from memory)
    expect(run(b.evaluation, 'R3').ocpdA).toBe(50)
    expect(group(d, 'equipment')).toEqual([{ kind: 'changed', subject: 'Inverter INV1', field: 'maximum continuous output current', before: '32 A', after: '40 A' }])
    expect(areas(d)).not.toContain('strings')
  })

  it('adding a string lists the string (and its run) as added', () => {
    const input = base()
    input.topology.arrays[0]!.moduleCount = 30
    input.topology.strings!.push({ id: 'S3', arrayId: 'A1', modulesInSeries: 10, inverterId: 'INV1', mppt: 2 })
    input.topology.runs!.push({ ...input.topology.runs![1]!, id: 'R5', from: 'S3' })
    const d = diffRevisions(side(2, base()), side(3, input))
    expect(group(d, 'strings')).toEqual([
      { kind: 'changed', subject: 'Array A1', field: 'module count', before: '20 modules', after: '30 modules' },
      { kind: 'added', subject: 'String S3', field: null, before: null, after: '10 modules in series on array A1, to INV1 MPPT 2' },
    ])
    expect(group(d, 'conductors').filter((c) => c.kind !== 'changed').map((c) => c.subject)).toEqual(['Run R5 (S3 \u2192 INV1)'])
    expect(group(d, 'equipment')).toEqual([])
    const strings = group(d, 'results').find((c) => c.subject === 'Strings')!
    expect([strings.before, strings.after]).toEqual(['2', '3'])
  })

  it('changing the module lists its ratings and the new cold Voc', () => {
    const input = base()
    Object.assign(input.equipment.modules[0]!, { name: 'Generic 410 W mono module', pmaxW: 410, vocV: 37.6 })
    const a = side(0, base())
    const b = side(1, input)
    const d = diffRevisions(a, b)
    expect(group(d, 'equipment')).toEqual([
      { kind: 'changed', subject: 'Module MOD400', field: 'name', before: 'Generic 400 W mono module', after: 'Generic 410 W mono module' },
      { kind: 'changed', subject: 'Module MOD400', field: 'Pmax', before: '400 W', after: '410 W' },
      { kind: 'changed', subject: 'Module MOD400', field: 'Voc', before: '37.1 V', after: '37.6 V' },
    ])
    expect(areas(d)).not.toContain('conductors')
    const vocMax = b.evaluation.sections.flatMap((s) => s.items).find((i) => i.key === 'string.S1.vocMax')!
    const change = group(d, 'results').find((c) => c.subject === vocMax.label && c.after === `${Math.round((vocMax.value as number) * 100) / 100} V`)
    expect(change).toBeDefined()
    // 20 × 410 W = 8.2 kW DC at STC
    expect(group(d, 'results')).toContainEqual({ kind: 'changed', subject: 'DC system size (STC)', field: 'value', before: '8 kW', after: '8.2 kW' })
  })

  it('compares two different demo systems without throwing and names every area that differs', () => {
    const a = { number: 0, doc: demoDesign('gridTied'), evaluation: evaluateDesign(demoDesign('gridTied')) }
    const b = { number: 1, doc: demoDesign('gridTiedStorage'), evaluation: evaluateDesign(demoDesign('gridTiedStorage')) }
    const d = diffRevisions(a, b)
    expect(areas(d)).toEqual(expect.arrayContaining(['project', 'equipment', 'conductors', 'results']))
    expect(d.summary).toMatch(/^Revision 1 makes \d+ design changes to revision 0: .*and \d+ more\./)
  })
})
