/**
 * The full fuzz run: 10,000 arbitrary design documents (plausible and broken) through the engine,
 * and 10,000 through POST /api/calculations on a throwaway server over loopback. Prints the counts
 * and every violation (5xx, NaN/Infinity in a result, an error without a field). `npm test` runs a
 * sample of the same generator (tests/electrical/fuzz.test.ts, tests/server/fuzz-calculations.test.ts).
 * Run: npx tsx bench/fuzz.bench.ts [cases]
 */
import fc from 'fast-check'
import { performance } from 'node:perf_hooks'
import { DEMO_PASSWORD } from '../server/demo/seed'
import { evaluateDocument } from '../shared/electrical/evaluate'
import { anyDesign, numbersIn } from '../tests/support/design-fuzz'
import { signIn, startThrowawayServer } from './support/throwaway-server'

const CASES = Number(process.argv[2] ?? 10_000)
const seed = Date.now() % 2 ** 31
const cases = fc.sample(anyDesign, { numRuns: CASES, seed })
const violations: string[] = []
const note = (where: string, doc: unknown, what: string) => {
  if (violations.length < 20) violations.push(`${where}: ${what} — ${JSON.stringify(doc).slice(0, 160)}`)
  else if (violations.length === 20) violations.push('… (further violations not listed)')
}

let engineValid = 0
const engineStart = performance.now()
for (const { doc } of cases) {
  try {
    const ev = evaluateDocument(doc)
    if (!numbersIn(ev).every(Number.isFinite)) note('engine', doc, 'NaN or Infinity in the result')
    if (ev.valid) engineValid++
    else if (ev.issues.length === 0 || ev.issues.some((i) => !i.field || !i.message)) note('engine', doc, 'invalid without a field-named issue')
  } catch (err) {
    note('engine', doc, `threw ${(err as Error).message}`)
  }
}
const engineMs = performance.now() - engineStart

const server = await startThrowawayServer()
const token = await signIn(server.url, 'designer@larkspur-solar.example', DEMO_PASSWORD)
const statuses = new Map<number, number>()
const routeStart = performance.now()
const CONCURRENCY = 8
let next = 0
await Promise.all(Array.from({ length: CONCURRENCY }, async () => {
  while (next < cases.length) {
    const { doc } = cases[next++]!
    const res = await fetch(`${server.url}/api/calculations`, {
      method: 'POST', headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${token}` }, body: JSON.stringify(doc ?? null),
    })
    statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1)
    const body = (await res.json()) as { sections?: { items: { key: string; value: unknown }[] }[]; error?: { fields?: { field: string; message: string }[] } }
    if (res.status >= 500) note('route', doc, `answered ${res.status}`)
    else if (res.status === 200) {
      if (body.sections?.some((s) => s.items.some((i) => i.value === null)) || !numbersIn(body).every(Number.isFinite)) note('route', doc, 'lost number (null) in a 200 answer')
    } else if (!body.error?.fields?.length || body.error.fields.some((f) => !f.field || !f.message)) note('route', doc, `${res.status} without field-named errors`)
  }
}))
const routeMs = performance.now() - routeStart
await server.stop()

console.log(`Fuzz run, ${CASES} cases, seed ${seed}`)
console.log(`  engine: ${engineValid} valid, ${CASES - engineValid} refused, ${(engineMs / 1000).toFixed(1)} s`)
console.log(`  POST /api/calculations: ${[...statuses].map(([s, n]) => `${n} × ${s}`).join(', ')}, ${(routeMs / 1000).toFixed(1)} s`)
console.log(violations.length === 0 ? '  no violations' : `  VIOLATIONS:\n    ${violations.join('\n    ')}`)
process.exitCode = violations.length === 0 ? 0 : 1
