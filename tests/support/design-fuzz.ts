import fc from 'fast-check'
import { DEMO_DESIGN_INPUTS, type DemoDesignKey } from '../../shared/demo/designs'

/**
 * Arbitrary design documents for fuzzing the engine and the calculation route: demo documents with
 * every number moved within or beyond its range ("plausible"), and the same documents broken at a
 * random place (junk values, missing keys, dangling references, wrong types at the top).
 * Used by the test sample and by `bench/fuzz.bench.ts` (10,000 cases).
 */

const KEYS = Object.keys(DEMO_DESIGN_INPUTS).filter((k) => k !== 'farm1MW') as DemoDesignKey[]

type Path = (string | number)[]

function leafPaths(value: unknown, path: Path = []): Path[] {
  if (value && typeof value === 'object') {
    return Object.entries(value).flatMap(([k, v]) => leafPaths(v, [...path, Array.isArray(value) ? Number(k) : k]))
  }
  return path.length > 0 ? [path] : []
}

function objectPaths(value: unknown, path: Path = []): Path[] {
  if (!value || typeof value !== 'object') return []
  const own = path.length > 0 ? [path] : []
  return [...own, ...Object.entries(value).flatMap(([k, v]) => objectPaths(v, [...path, Array.isArray(value) ? Number(k) : k]))]
}

const NUMBER_PATHS = Object.fromEntries(
  KEYS.map((key) => {
    const doc = DEMO_DESIGN_INPUTS[key]
    return [key, leafPaths(doc).filter((p) => typeof get(doc, p) === 'number')]
  }),
) as Record<DemoDesignKey, Path[]>
const ALL_PATHS = Object.fromEntries(KEYS.map((key) => [key, [...leafPaths(DEMO_DESIGN_INPUTS[key]), ...objectPaths(DEMO_DESIGN_INPUTS[key])]])) as Record<DemoDesignKey, Path[]>

function get(root: unknown, path: Path): unknown {
  return path.reduce<unknown>((at, step) => (at as Record<string | number, unknown>)?.[step], root)
}

function set(root: unknown, path: Path, value: unknown, remove = false): void {
  const parent = get(root, path.slice(0, -1)) as Record<string | number, unknown>
  const last = path[path.length - 1]!
  if (remove) delete parent[last]
  else parent[last] = value
}

const JUNK = fc.constantFrom<unknown>(
  'not a number', '', '<script>alert(1)</script>', "'; DROP TABLE projects; --", '\u202Eevil', 'x'.repeat(5000),
  -1, 0, -0, 1e300, -1e300, 0.1 + 0.2, Number.MAX_SAFE_INTEGER, null, true, [], {}, { nested: { deeper: [1, 2] } }, [null, 'a'],
)

/** One numeric change: scaled, set to a boundary, or made negative. */
const numericChange = fc.oneof(
  { weight: 6, arbitrary: fc.double({ min: 0.7, max: 1.4, noNaN: true }).map((k) => (v: number) => v * k) },
  { weight: 2, arbitrary: fc.double({ min: 0.05, max: 20, noNaN: true }).map((k) => (v: number) => v * k) },
  { weight: 2, arbitrary: fc.constantFrom((v: number) => -v, () => 0, () => 1, (v: number) => Math.round(v) + 1, (v: number) => v + 0.5) },
)

export interface FuzzCase { key: DemoDesignKey; kind: 'plausible' | 'broken'; doc: unknown }

/** A demo document with 1–4 of its numbers changed, mostly by a little. */
export const plausibleDesign: fc.Arbitrary<FuzzCase> = fc.constantFrom(...KEYS).chain((key) =>
  fc.array(fc.tuple(fc.constantFrom(...NUMBER_PATHS[key]), numericChange), { minLength: 1, maxLength: 4 }).map((changes) => {
    const doc = structuredClone(DEMO_DESIGN_INPUTS[key])
    for (const [path, change] of changes) {
      const before = get(doc, path) as number
      // counts, editions and ratings stay whole numbers, as a user would type them
      set(doc, path, Number.isInteger(before) ? Math.round(change(before)) : change(before))
    }
    return { key, kind: 'plausible' as const, doc }
  }),
)

/** A demo document broken in 1–3 places, or not a document at all. */
export const brokenDesign: fc.Arbitrary<FuzzCase> = fc.oneof(
  { weight: 9, arbitrary: fc.constantFrom(...KEYS).chain((key) =>
    fc.array(fc.tuple(fc.constantFrom(...ALL_PATHS[key]), JUNK, fc.boolean()), { minLength: 1, maxLength: 3 }).map((breaks) => {
      const doc = structuredClone(DEMO_DESIGN_INPUTS[key])
      for (const [path, junk, remove] of breaks) {
        // an earlier break may have replaced this value's parent
        const parent = get(doc, path.slice(0, -1))
        if (parent !== null && typeof parent === 'object') set(doc, path, junk, remove)
      }
      return { key, kind: 'broken' as const, doc }
    })) },
  { weight: 1, arbitrary: fc.oneof(fc.anything(), fc.constant([]), fc.constant(null)).map((doc) => ({ key: KEYS[0]!, kind: 'broken' as const, doc })) },
)

export const anyDesign = fc.oneof(plausibleDesign, brokenDesign)

/** Every number anywhere in a value (JSON `null` from a lost NaN shows up separately). */
export function numbersIn(value: unknown, out: number[] = []): number[] {
  if (typeof value === 'number') out.push(value)
  else if (Array.isArray(value)) value.forEach((v) => numbersIn(v, out))
  else if (value && typeof value === 'object') Object.values(value).forEach((v) => numbersIn(v, out))
  return out
}
