import { describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS, type DemoDesignKey } from '../../shared/demo/designs'
import { designDocumentJsonSchema, parseDesign, type DesignDocumentInput } from '../../shared/schemas/design'

/** A deep copy of a demo input to edit in a test. */
const copy = (key: DemoDesignKey): DesignDocumentInput => structuredClone(DEMO_DESIGN_INPUTS[key]) as DesignDocumentInput

/** Field paths of the issues a document raises (empty when it parses). */
function fieldsOf(input: unknown): string[] {
  const parsed = parseDesign(input)
  return parsed.ok ? [] : parsed.issues.map((i) => i.field)
}

describe('design document schema', () => {
  it.each(Object.keys(DEMO_DESIGN_INPUTS) as DemoDesignKey[])('accepts the %s demo design, also after a JSON round trip', (key) => {
    expect(fieldsOf(DEMO_DESIGN_INPUTS[key])).toEqual([])
    expect(fieldsOf(JSON.parse(JSON.stringify(DEMO_DESIGN_INPUTS[key])))).toEqual([])
  })

  it('fills the voltage-drop defaults: 2 % PV DC (common practice, no source), 3 % and 5 % (210.19(A) / 215.2(A) informational notes)', () => {
    const parsed = parseDesign(copy('gridTied'))
    if (!parsed.ok) throw new Error('demo must parse')
    expect(parsed.value.codeBasis.voltageDropLimits).toEqual({ pvDcPercent: 2, anyCircuitPercent: 3, totalPercent: 5 })
    expect(parsed.value.codeBasis.cellTemperatureRiseC).toBe(25)
    expect(parsed.value.topology.runs[0]?.racewayId).toBe('C1')
    expect(parsed.value.topology.runs[2]?.racewayId).toBeNull()
  })

  it('keeps the reason for departing from the jurisdiction profile, and names it when too long', () => {
    const parsed = parseDesign(copy('gridTied'))
    expect(parsed.ok && parsed.value.codeBasis.overrideReason).toBeNull()
    const doc = copy('gridTied')
    doc.codeBasis.overrideReason = '  AHJ accepts the 2023 edition for this permit  '
    const withReason = parseDesign(doc)
    expect(withReason.ok && withReason.value.codeBasis.overrideReason).toBe('AHJ accepts the 2023 edition for this permit')
    doc.codeBasis.overrideReason = 'x'.repeat(501)
    expect(fieldsOf(doc)).toEqual(['codeBasis.overrideReason'])
  })

  it('names the field of a wrong type or a value out of range', () => {
    const doc = copy('gridTied') as unknown as { equipment: { modules: Array<Record<string, unknown>> }; codeBasis: Record<string, unknown> }
    doc.equipment.modules[0]!.pmaxW = '400'
    doc.codeBasis.necEdition = 2014
    expect(fieldsOf(doc)).toEqual(expect.arrayContaining(['equipment.modules[0].pmaxW', 'codeBasis.necEdition']))
  })

  it('names a string that points at an unknown inverter', () => {
    const doc = copy('gridTied')
    doc.topology.strings![0]!.inverterId = 'INV9'
    expect(fieldsOf(doc)).toContain('topology.strings[0].inverterId')
  })

  it('names an MPPT index beyond the inverter\u2019s count', () => {
    const doc = copy('gridTied')
    doc.topology.strings![1]!.mppt = 3
    const parsed = parseDesign(doc)
    expect(parsed.ok).toBe(false)
    if (parsed.ok) return
    expect(parsed.issues).toContainEqual({ field: 'topology.strings[1].mppt', message: 'MPPT 3 is beyond the 2 MPPT input(s) of "INV1"', severity: 'error' })
  })

  it('names a run with an unknown endpoint and a run whose kind does not fit its ends', () => {
    const doc = copy('gridTied')
    doc.topology.runs![2]!.to = 'NOWHERE'
    doc.topology.runs![3]!.kind = 'pv_source'
    expect(fieldsOf(doc)).toEqual(expect.arrayContaining(['topology.runs[2].to', 'topology.runs[3].from', 'topology.runs[3].to']))
  })

  it('names duplicate ids and module counts that do not add up', () => {
    const doc = copy('gridTied')
    doc.topology.strings![1]!.id = 'S1'
    doc.topology.arrays[0]!.moduleCount = 21
    expect(fieldsOf(doc)).toEqual(expect.arrayContaining(['topology.strings[1].id', 'topology.arrays[0].moduleCount']))
  })

  it('requires what each system kind needs', () => {
    const offGrid = copy('offGrid')
    offGrid.equipment.batteries = []
    expect(fieldsOf(offGrid)).toContain('equipment.batteries')
    const grid = copy('gridTied')
    grid.interconnection = null
    expect(fieldsOf(grid)).toContain('interconnection')
    const farm = copy('groundMountFarm')
    farm.equipment.transformers = []
    expect(fieldsOf(farm)).toContain('equipment.transformers')
  })

  it('checks the inverter window is consistent', () => {
    const doc = copy('gridTied')
    doc.equipment.inverters![0]!.pvInput = { ...doc.equipment.inverters![0]!.pvInput!, mpptMinV: 500 }
    expect(fieldsOf(doc)).toContain('equipment.inverters[0].pvInput.mpptMinV')
  })

  it('rejects what is not a document at all, naming the document', () => {
    expect(fieldsOf(null)).toEqual(['(document)'])
    expect(fieldsOf({})).toEqual(expect.arrayContaining(['schemaVersion', 'systemKind', 'project', 'topology']))
  })

  it('exports a JSON Schema (draft 2020-12) describing the submitted document', () => {
    const schema = designDocumentJsonSchema() as {
      $schema: string
      required: string[]
      properties: Record<string, { properties?: Record<string, { enum?: unknown[]; required?: string[] }>; required?: string[] }>
    }
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema')
    expect(schema.required).toEqual(expect.arrayContaining(['schemaVersion', 'systemKind', 'project', 'codeBasis', 'equipment', 'interconnection', 'topology']))
    expect(schema.properties.codeBasis?.properties?.necEdition?.enum).toEqual([2017, 2020, 2023])
    // defaulted fields are optional on input
    expect(schema.properties.codeBasis?.required).not.toContain('cellTemperatureRiseC')
    expect(JSON.parse(JSON.stringify(schema))).toEqual(schema)
  })
})
