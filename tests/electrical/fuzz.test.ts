import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { evaluateDocument } from '../../shared/electrical/evaluate'
import { anyDesign, numbersIn } from '../support/design-fuzz'

/** A sample of the fuzz run (the benchmark runs 10,000 cases): the engine on arbitrary documents. */
describe('engine fuzz sample (fast-check)', () => {
  it('never throws, never yields NaN or Infinity, and names the field of every problem', () => {
    let valid = 0
    fc.assert(
      fc.property(anyDesign, ({ doc }) => {
        const evaluation = evaluateDocument(doc)
        expect(numbersIn(evaluation).every(Number.isFinite)).toBe(true)
        if (evaluation.valid) valid++
        else {
          expect(evaluation.issues.length).toBeGreaterThan(0)
          for (const issue of evaluation.issues) {
            expect(issue.field.length).toBeGreaterThan(0)
            expect(issue.message.length).toBeGreaterThan(0)
          }
        }
      }),
      { numRuns: 300 },
    )
    // the generator must reach the engine's computing paths, not only the schema's refusals
    expect(valid, `${valid} of 300 valid`).toBeGreaterThan(40)
  })
})
