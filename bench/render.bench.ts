/**
 * Median time and peak memory to render a whole plan set (G-001 … E-604, vector PDF) plus the
 * single-line SVG, for a residential design and the 1 MW demo farm, with RSS after each stage.
 * Prints figures only; the targets (≤ 0.4 s, ≤ 4 s, peak RSS ≤ 400 MB) are for people to
 * read, not to assert.
 * Run: npx tsx bench/render.bench.ts            (add --expose-gc through NODE_OPTIONS for settled stage figures)
 */
import { performance } from 'node:perf_hooks'
import { demoDesign, type DemoDesignKey } from '../shared/demo/designs'
import { evaluateDesign } from '../shared/electrical'
import { planSetPdf, planSetSheets, sheetToSvg, type SheetSizeName } from '../server/render'

let peakRss = process.memoryUsage().rss
const sampleRss = () => { peakRss = Math.max(peakRss, process.memoryUsage().rss) }
const sampler = setInterval(sampleRss, 5)
const mb = (bytes: number) => `${(bytes / 2 ** 20).toFixed(0)} MB`
const gc = (globalThis as { gc?: () => void }).gc

async function renderOnce(key: DemoDesignKey, size: SheetSizeName, stages?: string[]) {
  const mark = (stage: string) => { sampleRss(); gc?.(); stages?.push(`${stage} ${mb(process.memoryUsage().rss)} rss / ${mb(process.memoryUsage().heapUsed)} heap`) }
  const doc = demoDesign(key)
  const start = performance.now()
  const evaluation = evaluateDesign(doc)
  mark('evaluated')
  const options = { doc, evaluation, preparedBy: 'Bench', size, revisions: [{ number: 0, date: '2026-12-01', description: 'Bench' }] }
  const svgStart = performance.now()
  planSetSheets(options).filter((s) => s.id.startsWith('E-601')).forEach(sheetToSvg)
  mark('sheets and SVG')
  const pdfStart = performance.now()
  const { pdf, pageCount } = await planSetPdf(options)
  const end = performance.now()
  mark(`PDF (${mb(pdf.byteLength)})`)
  return { pages: pageCount, evaluate: svgStart - start, svg: pdfStart - svgStart, pdf: end - pdfStart, total: end - start }
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!

const cases: Array<{ key: DemoDesignKey; label: string; size: SheetSizeName; runs: number }> = [
  { key: 'gridTied', label: 'residential, ANSI B', size: 'ANSI_B', runs: 15 },
  { key: 'farm1MW', label: '1 MW farm, ANSI D', size: 'ANSI_D', runs: 5 },
]
for (const c of cases) {
  const stages: string[] = []
  await renderOnce(c.key, c.size, stages) // warm up fonts and the JIT; stage memory from this run
  const runs: Awaited<ReturnType<typeof renderOnce>>[] = []
  for (let i = 0; i < c.runs; i++) runs.push(await renderOnce(c.key, c.size))
  const m = (k: 'evaluate' | 'svg' | 'pdf' | 'total') => median(runs.map((r) => r[k])).toFixed(1)
  console.log(`${c.label.padEnd(22)} ${String(runs[0]!.pages).padStart(3)} pages  median ${m('total')} ms (evaluate ${m('evaluate')}, sheets+svg ${m('svg')}, plan-set pdf ${m('pdf')}) over ${c.runs} runs`)
  console.log(`  memory after each stage: ${stages.join('; ')}`)
}
clearInterval(sampler)
console.log(`peak RSS ${mb(peakRss)}`)
