/**
 * Median time to evaluate a residential design and the 1 MW demo farm. Prints figures only; the
 * targets (≤ 0.2 ms residential, ≤ 20 ms for 1 MW) are for people to read, not to assert.
 * Run: npm run bench:engine
 */
import { performance } from 'node:perf_hooks'
import { demoDesign, type DemoDesignKey } from '../shared/demo/designs'
import { evaluateDesign } from '../shared/electrical/evaluate'

function medianMs(key: DemoDesignKey, runs: number): number {
  const doc = demoDesign(key)
  for (let i = 0; i < Math.min(runs, 50); i++) evaluateDesign(doc) // warm up the JIT
  const times: number[] = []
  for (let i = 0; i < runs; i++) {
    const start = performance.now()
    evaluateDesign(doc)
    times.push(performance.now() - start)
  }
  times.sort((a, b) => a - b)
  return times[Math.floor(times.length / 2)]!
}

const cases: Array<{ key: DemoDesignKey; label: string; targetMs: number; runs: number }> = [
  { key: 'gridTied', label: 'residential, 2 strings', targetMs: 0.2, runs: 2000 },
  { key: 'farm1MW', label: '1 MW farm, 120 strings, 10 inverters', targetMs: 20, runs: 100 },
]
for (const c of cases) {
  const ms = medianMs(c.key, c.runs)
  console.log(`${c.label.padEnd(40)} median ${ms.toFixed(3)} ms over ${c.runs} runs (target ≤ ${c.targetMs} ms)`)
}
