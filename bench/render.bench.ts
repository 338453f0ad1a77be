/**
 * Median time and peak memory to lay out and render the E-601 single-line and E-602 calculation
 * sheets (SVG of the diagram and the vector PDF) for a residential design and the 1 MW demo farm.
 * Prints figures only; the targets are for people to read, not to assert.
 * Run: npx tsx bench/render.bench.ts
 */
import { performance } from 'node:perf_hooks'
import { demoDesign, type DemoDesignKey } from '../shared/demo/designs'
import { evaluateDesign } from '../shared/electrical'
import { electricalSheets, sheetsToPdf, sheetToSvg, type SheetSizeName } from '../server/render'

let peakRss = process.memoryUsage().rss
const sampleRss = () => { peakRss = Math.max(peakRss, process.memoryUsage().rss) }
const sampler = setInterval(sampleRss, 5)

async function renderOnce(key: DemoDesignKey, size: SheetSizeName) {
  const doc = demoDesign(key)
  const evaluation = evaluateDesign(doc)
  const layoutStart = performance.now()
  const sheets = electricalSheets(doc, { preparedBy: 'Bench', size, evaluation, revisions: [{ number: 0, date: '2026-12-01', description: 'Bench' }] })
  const svgStart = performance.now()
  sheets.filter((s) => s.id.startsWith('E-601')).forEach(sheetToSvg)
  const pdfStart = performance.now()
  await sheetsToPdf(sheets, { title: doc.project.name })
  const end = performance.now()
  sampleRss()
  return { pages: sheets.length, layout: svgStart - layoutStart, svg: pdfStart - svgStart, pdf: end - pdfStart, total: end - layoutStart }
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!

const cases: Array<{ key: DemoDesignKey; label: string; size: SheetSizeName; runs: number }> = [
  { key: 'gridTied', label: 'residential, ANSI B', size: 'ANSI_B', runs: 15 },
  { key: 'farm1MW', label: '1 MW farm, ANSI D', size: 'ANSI_D', runs: 5 },
]
for (const c of cases) {
  await renderOnce(c.key, c.size) // warm up fonts and the JIT
  const runs: Awaited<ReturnType<typeof renderOnce>>[] = []
  for (let i = 0; i < c.runs; i++) runs.push(await renderOnce(c.key, c.size))
  const m = (k: 'layout' | 'svg' | 'pdf' | 'total') => median(runs.map((r) => r[k])).toFixed(1)
  console.log(`${c.label.padEnd(22)} ${String(runs[0]!.pages).padStart(3)} pages  median ${m('total')} ms (layout ${m('layout')}, svg ${m('svg')}, pdf ${m('pdf')}) over ${c.runs} runs`)
}
clearInterval(sampler)
console.log(`peak RSS ${(peakRss / 2 ** 20).toFixed(0)} MB`)
