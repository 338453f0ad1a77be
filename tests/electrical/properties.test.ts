import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS, type DemoDesignKey } from '../../shared/demo/designs'
import { evaluateDocument } from '../../shared/electrical/evaluate'
import { maxStringVoltage } from '../../shared/electrical/rules/max-voltage'
import { pvOutputMaxCurrent } from '../../shared/electrical/rules/currents'
import { parseDesign, type DesignDocumentInput } from '../../shared/schemas/design'

const keys = Object.keys(DEMO_DESIGN_INPUTS).filter((k) => k !== 'farm1MW') as DemoDesignKey[]

/** Every number anywhere in a value. */
function numbersIn(value: unknown, out: number[] = []): number[] {
  if (typeof value === 'number') out.push(value)
  else if (Array.isArray(value)) value.forEach((v) => numbersIn(v, out))
  else if (value && typeof value === 'object') Object.values(value).forEach((v) => numbersIn(v, out))
  return out
}

describe('properties', () => {
  it('colder never lowers the maximum string voltage, with a coefficient or with Table 690.7(A)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 80, noNaN: true }),
        fc.option(fc.double({ min: -0.6, max: -0.05, noNaN: true }), { nil: null }),
        fc.integer({ min: 1, max: 30 }),
        fc.double({ min: -40, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 30, noNaN: true }),
        (vocV, percent, modules, warmC, colderBy) => {
          const module = { vocV, vocCoefficient: percent === null ? null : { value: percent, unit: '%/°C' as const }, technology: 'crystalline' as const }
          const warm = maxStringVoltage(2023, 'k', module, modules, warmC)
          const cold = maxStringVoltage(2023, 'k', module, modules, Math.max(-40, warmC - colderBy))
          if (!warm.ok || !cold.ok) return false
          return cold.value.value >= warm.value.value - 1e-9
        },
      ),
    )
  })

  it('another parallel string never lowers the output circuit current', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0.1, max: 30, noNaN: true }), { maxLength: 20 }), fc.double({ min: 0.1, max: 30, noNaN: true }), (currents, more) =>
        pvOutputMaxCurrent(2023, 'k', [...currents, more]).value >= pvOutputMaxCurrent(2023, 'k', currents).value,
      ),
    )
  })

  it('no output is NaN or Infinity for any valid document, and every conductor carries its current', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...keys),
        fc.double({ min: 1, max: 800, noNaN: true }),
        fc.double({ min: -45, max: 10, noNaN: true }),
        fc.double({ min: 15, max: 50, noNaN: true }),
        fc.double({ min: 0.5, max: 2, noNaN: true }),
        fc.constantFrom(2017, 2020, 2023),
        (key, lengthFt, lowC, highC, currentScale, edition) => {
          const doc = structuredClone(DEMO_DESIGN_INPUTS[key]) as DesignDocumentInput
          doc.codeBasis = { ...doc.codeBasis, necEdition: edition as 2017 | 2020 | 2023, designLowC: lowC, designHighC: highC }
          for (const run of doc.topology.runs ?? []) run.lengthFt = lengthFt
          for (const m of doc.equipment.modules) {
            m.iscA *= currentScale
            m.impA = m.iscA * 0.93
          }
          const ev = evaluateDocument(doc)
          fc.pre(ev.valid) // the property is about valid documents; too many invalid ones fail the run
          // and the chosen conductor always carries the circuit's maximum current after every factor
          const carries = ev.runs.every((r) => r.ampacityA === null || r.maxCurrentA === null || r.ampacityA >= r.maxCurrentA)
          return carries && numbersIn(ev).every(Number.isFinite)
        },
      ),
      { numRuns: 60 },
    )
  })

  it('invalid documents always give field errors and never throw', () => {
    const leaves = (value: unknown, path: (string | number)[] = []): (string | number)[][] =>
      value && typeof value === 'object'
        ? Object.entries(value).flatMap(([k, v]) => leaves(v, [...path, Array.isArray(value) ? Number(k) : k]))
        : [path]
    const doc = DEMO_DESIGN_INPUTS.gridTiedStorage
    const paths = leaves(doc).filter((p) => p.length > 0)
    fc.assert(
      fc.property(
        fc.constantFrom(...paths),
        fc.constantFrom<unknown>('not a number', -1, Number.NaN, null, { nested: true }, [], 1e12, ''),
        (path, junk) => {
          const broken = structuredClone(doc) as Record<string, unknown>
          let at: Record<string | number, unknown> = broken
          for (const step of path.slice(0, -1)) at = at[step] as Record<string | number, unknown>
          at[path[path.length - 1]!] = junk
          const parsed = parseDesign(broken)
          if (parsed.ok) return true // some junk is valid for some fields (e.g. null where nullable)
          return parsed.issues.length > 0 && parsed.issues.every((i) => i.field.length > 0 && i.message.length > 0 && i.severity === 'error')
        },
      ),
      { numRuns: 300 },
    )
    fc.assert(fc.property(fc.anything(), (junk) => evaluateDocument(junk).valid === false))
  })

  it('NaN never gets through the schema', () => {
    const doc = structuredClone(DEMO_DESIGN_INPUTS.gridTied) as DesignDocumentInput
    doc.topology.runs![0]!.lengthFt = Number.NaN
    const parsed = parseDesign(doc)
    expect(parsed.ok).toBe(false)
    if (!parsed.ok) expect(parsed.issues[0]?.field).toBe('topology.runs[0].lengthFt')
  })
})
