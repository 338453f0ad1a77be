import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  CONDUCTOR_SIZES,
  INSULATIONS,
  type ConductorSelectionInput,
  type Derived,
  type Outcome,
  type VoltageDropInput,
} from '../../shared/electrical/types'
import { conduitFill, selectConductor, sizeEgc, sizeOcpd, voltageDrop } from '../../shared/electrical/rules/conductors'
import { ampacityTableFor } from '../../shared/electrical/rules/conductor'
import { tableAmpacityA } from '../../shared/electrical/tables/ampacity-table'
import { INSULATION_RATING_C } from '../../shared/electrical/tables/insulation-ratings'

const selectionInput: fc.Arbitrary<ConductorSelectionInput> = fc.record({
  key: fc.constant('run.P'),
  edition: fc.constantFrom(2017 as const, 2020 as const, 2023 as const),
  maxCurrentA: fc.double({ min: 0.5, max: 1500, noNaN: true }),
  continuous: fc.boolean(),
  material: fc.constantFrom('Cu' as const, 'Al' as const),
  insulation: fc.constantFrom(...INSULATIONS),
  method: fc.constantFrom('EMT' as const, 'PVC40' as const, 'PVC80' as const, 'RMC' as const, 'FREE_AIR' as const, 'CABLE' as const),
  ambientC: fc.double({ min: -40, max: 50, noNaN: true }),
  rooftopHeightIn: fc.option(fc.double({ min: 0, max: 36, noNaN: true }), { nil: null }),
  currentCarryingConductors: fc.integer({ min: 1, max: 12 }),
  terminalRatingC: fc.constantFrom(60 as const, 75 as const, 90 as const),
})

const index = (size: string) => CONDUCTOR_SIZES.indexOf(size as (typeof CONDUCTOR_SIZES)[number])
const factor = (steps: Derived[], suffix: string) => steps.find((s) => s.key.endsWith(`.${suffix}`))?.value as number

function expectFinite(outcome: Outcome<{ steps: Derived[] }>) {
  if (!outcome.ok) return
  for (const s of outcome.value.steps) {
    expect(Number.isFinite(s.value), s.key).toBe(true)
    expect(s.formula).not.toMatch(/NaN|Infinity|undefined/)
    expect(s.message).not.toMatch(/NaN|Infinity|undefined/)
  }
}

describe('selectConductor properties (fast-check)', () => {
  it('more current never gives a smaller conductor or fewer sets', () => {
    let compared = 0
    fc.assert(
      fc.property(selectionInput, fc.double({ min: 0, max: 300, noNaN: true }), (input, extra) => {
        const low = selectConductor(input)
        const high = selectConductor({ ...input, maxCurrentA: input.maxCurrentA + extra })
        if (!low.ok || !high.ok) return
        const practical = (sets: number, size: string) => sets === 1 || index(size) <= index('600')
        // Parallel sets fall back to sizes above 600 kcmil only when nothing smaller works
        if (!practical(low.value.parallelSets, low.value.size) || !practical(high.value.parallelSets, high.value.size)) return
        expect(high.value.parallelSets).toBeGreaterThanOrEqual(low.value.parallelSets)
        if (high.value.parallelSets === low.value.parallelSets) expect(index(high.value.size)).toBeGreaterThanOrEqual(index(low.value.size))
        compared++
      }),
      { numRuns: 400 },
    )
    // the generators must mostly produce designs that can be built, or the property says little
    expect(compared).toBeGreaterThan(200)
  })

  it('the chosen conductor carries the requirement after every factor, recomputed from the tables', () => {
    let checked = 0
    fc.assert(
      fc.property(selectionInput, (input) => {
        const result = selectConductor(input)
        if (!result.ok) return
        checked++
        const { size, parallelSets, ampacityA, steps } = result.value
        const table = ampacityTableFor(input.method)
        const ft = factor(steps, 'temperatureCorrection')
        const fa = factor(steps, 'adjustmentFactor')
        const insulationA = tableAmpacityA(table, size, input.material, INSULATION_RATING_C[input.insulation]) as number
        const terminalA = tableAmpacityA(table, size, input.material, input.terminalRatingC) as number
        const needed = input.continuous ? 1.25 * input.maxCurrentA : input.maxCurrentA
        expect(parallelSets * insulationA * ft * fa).toBeGreaterThanOrEqual(input.maxCurrentA - 1e-9)
        expect(parallelSets * terminalA).toBeGreaterThanOrEqual(needed - 1e-9)
        expect(parallelSets * ampacityA).toBeGreaterThanOrEqual(input.maxCurrentA - 1e-9)
        expect(ampacityA).toBeLessThanOrEqual(terminalA + 1e-9)
        if (parallelSets > 1) expect(index(size)).toBeGreaterThanOrEqual(index('1/0'))
        // the device 690.9(B) calls for then protects the chosen conductor
        const ocpd = sizeOcpd({ key: 'run.P', edition: input.edition, maxCurrentA: input.maxCurrentA, continuous: input.continuous, conductorAmpacityA: parallelSets * ampacityA, conductorSize: size, material: input.material })
        expect(ocpd.ok && ocpd.value.steps.every((s) => s.status !== 'fail')).toBe(true)
      }),
      { numRuns: 400 },
    )
    expect(checked).toBeGreaterThan(200)
  })

  it('no output is NaN for any valid input', () => {
    fc.assert(
      fc.property(selectionInput, (input) => {
        const result = selectConductor(input)
        expectFinite(result)
        if (result.ok) {
          const { size, ampacityA, parallelSets } = result.value
          expectFinite(sizeOcpd({ key: 'run.P', edition: input.edition, maxCurrentA: input.maxCurrentA, continuous: input.continuous, conductorAmpacityA: parallelSets * ampacityA, conductorSize: size, material: input.material }))
          expectFinite(sizeEgc({ key: 'run.P', edition: input.edition, ocpdRatingA: null, maxCurrentA: input.maxCurrentA, material: input.material, phaseSizeMinimum: size, phaseSizeChosen: size }))
        }
      }),
      { numRuns: 300 },
    )
  })

  it('invalid input always gives an error naming the field', () => {
    const bad = fc.oneof(
      fc.record({ field: fc.constant('maxCurrentA'), value: fc.oneof(fc.double({ max: 0 }), fc.constant(Number.NaN), fc.constant(Number.POSITIVE_INFINITY)) }),
      fc.record({ field: fc.constant('ambientC'), value: fc.oneof(fc.constant(Number.NaN), fc.double({ min: 86, max: 1e6, noNaN: true })) }),
      fc.record({ field: fc.constant('currentCarryingConductors'), value: fc.oneof(fc.integer({ max: 0 }), fc.double({ min: 1.01, max: 1.99, noNaN: true })) }),
      fc.record({ field: fc.constant('rooftopHeightIn'), value: fc.double({ max: -0.001, noNaN: true }) }),
      fc.record({ field: fc.constant('material'), value: fc.string().filter((s) => s !== 'Cu' && s !== 'Al') }),
    )
    fc.assert(
      fc.property(selectionInput, bad, (input, { field, value }) => {
        const result = selectConductor({ ...input, [field]: value })
        expect(result.ok).toBe(false)
        if (!result.ok) expect(result.issues.some((i) => i.field === field && i.severity === 'error')).toBe(true)
      }),
      { numRuns: 300 },
    )
  })
})

const dropInput: fc.Arbitrary<VoltageDropInput> = fc.record({
  key: fc.constant('run.V'),
  edition: fc.constantFrom(2017 as const, 2020 as const, 2023 as const),
  system: fc.constantFrom('dc' as const, 'ac1' as const, 'ac3' as const),
  currentA: fc.double({ min: 0.1, max: 2000, noNaN: true }),
  voltageV: fc.double({ min: 12, max: 1500, noNaN: true }),
  lengthFt: fc.double({ min: 1, max: 2000, noNaN: true }),
  size: fc.constantFrom(...CONDUCTOR_SIZES),
  material: fc.constantFrom('Cu' as const, 'Al' as const),
  parallelSets: fc.integer({ min: 1, max: 6 }),
  method: fc.constantFrom('EMT' as const, 'PVC40' as const, 'RMC' as const, 'CABLE' as const),
  powerFactor: fc.option(fc.double({ min: 0.5, max: 1, noNaN: true }), { nil: undefined }),
  limitPercent: fc.double({ min: 0.5, max: 5, noNaN: true }),
})

describe('voltageDrop properties (fast-check)', () => {
  it('longer never lowers the drop; a larger DC conductor never raises it', () => {
    fc.assert(
      fc.property(dropInput, fc.double({ min: 0, max: 1000, noNaN: true }), (input, extra) => {
        const short = voltageDrop(input)
        const long = voltageDrop({ ...input, lengthFt: input.lengthFt + extra })
        if (!short.ok || !long.ok) return
        expect(long.value.dropV).toBeGreaterThanOrEqual(short.value.dropV)
        expectFinite(long)
      }),
      { numRuns: 400 },
    )
    fc.assert(
      fc.property(dropInput, fc.integer({ min: 1, max: 10 }), (input, steps) => {
        const larger = CONDUCTOR_SIZES[Math.min(index(input.size) + steps, CONDUCTOR_SIZES.length - 1)] as (typeof CONDUCTOR_SIZES)[number]
        const small = voltageDrop({ ...input, system: 'dc' })
        const big = voltageDrop({ ...input, system: 'dc', size: larger })
        if (small.ok && big.ok) expect(big.value.dropV).toBeLessThanOrEqual(small.value.dropV)
      }),
    )
  })

  it('invalid lengths and currents always name the field', () => {
    fc.assert(
      fc.property(dropInput, fc.constantFrom('lengthFt', 'currentA', 'voltageV'), fc.oneof(fc.double({ max: 0 }), fc.constant(Number.NaN)), (input, field, value) => {
        const result = voltageDrop({ ...input, [field]: value })
        expect(result.ok ? [] : result.issues.map((i) => i.field)).toContain(field)
      }),
    )
  })
})

describe('conduitFill properties (fast-check)', () => {
  it('more conductors never need a smaller raceway, and fill never exceeds the limit', () => {
    const trade = ['1/2', '3/4', '1', '1-1/4', '1-1/2', '2', '2-1/2', '3', '3-1/2', '4', '5', '6']
    fc.assert(
      fc.property(
        fc.constantFrom('EMT' as const, 'PVC40' as const, 'PVC80' as const, 'RMC' as const),
        fc.constantFrom('14' as const, '12' as const, '10' as const, '8' as const, '6' as const, '4' as const, '1/0' as const),
        fc.integer({ min: 3, max: 30 }),
        (raceway, size, count) => {
          const group = (n: number) => ({ key: 'run.C', edition: 2023 as const, raceway, conductors: [{ size, insulation: 'THWN-2' as const, count: n }] })
          const fewer = conduitFill(group(count))
          const more = conduitFill(group(count + 1))
          if (!fewer.ok || !more.ok) return
          expect(trade.indexOf(more.value.tradeSize)).toBeGreaterThanOrEqual(trade.indexOf(fewer.value.tradeSize))
          expect(more.value.fillPercent).toBeLessThanOrEqual(40)
        },
      ),
    )
  })
})
