/**
 * Median time and peak memory to build the whole submission package (plan set, single-line SVG,
 * CSV and JSON, labels, manifest, zip) for the residential demo and the 1 MW demo farm on ANSI D,
 * and the ratio to pdf-lib drawing the same vector operations raw: every leaf item the drawing
 * model emits (plan set and label sheet) drawn straight onto pages with the same embedded fonts.
 * Prints figures and the targets; asserts nothing.
 * Run: npx tsx bench/package.bench.ts
 */
import fontkit from '@pdf-lib/fontkit'
import { execFileSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { performance } from 'node:perf_hooks'
import { PDFDocument, rgb } from 'pdf-lib'
import { buildPackage, type PackageInput } from '../server/package/build'
import { planSetContext, type DrawItem, type Sheet, type SheetSizeName } from '../server/render'
import { fontBytes } from '../server/render/fonts'
import { PLAIN_SHAPING } from '../server/render/pdf'
import { labelPages } from '../server/render/labels-pdf'
import { planSetSheets } from '../server/render/plan-set'
import { demoDesign, type DemoDesignKey } from '../shared/demo/designs'
import { evaluateDesign } from '../shared/electrical'

let peakRss = process.memoryUsage().rss
const sampleRss = () => { peakRss = Math.max(peakRss, process.memoryUsage().rss) }
const sampler = setInterval(sampleRss, 5)
/** `--peak KEY SIZE`: this process only builds that package three times and prints its peak RSS. */
const peakOnly = process.argv.indexOf('--peak')
const productVersion = (JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string }).version

function packageInput(key: DemoDesignKey, size: SheetSizeName): PackageInput {
  const doc = demoDesign(key)
  return {
    doc, evaluation: evaluateDesign(doc), size, preparedBy: 'Bench', revisions: [{ number: 0, date: '2026-12-01', description: 'Issued for permit' }],
    revision: 0, description: 'Issued for permit', created: new Date('2026-12-01T12:00:00Z'), productVersion,
  }
}

/** Leaf items of the sheets, groups flattened (a group's transform is one operator; it is not counted). */
function leaves(sheets: readonly Sheet[]): { sheet: Sheet; items: Exclude<DrawItem, { kind: 'group' }>[] }[] {
  const flat = (items: readonly DrawItem[]): Exclude<DrawItem, { kind: 'group' }>[] => items.flatMap((i) => (i.kind === 'group' ? flat(i.items) : [i]))
  return sheets.map((sheet) => ({ sheet, items: flat(sheet.items) }))
}

/** The same leaves drawn with pdf-lib's primitives, no drawing model in between; positions as given. */
async function drawRaw(pages: ReturnType<typeof leaves>): Promise<Uint8Array> {
  const pdf = await PDFDocument.create()
  pdf.registerFontkit(fontkit)
  const fonts = { regular: await pdf.embedFont(fontBytes('regular'), { subset: true, features: PLAIN_SHAPING }), bold: await pdf.embedFont(fontBytes('bold'), { subset: true, features: PLAIN_SHAPING }) }
  const black = rgb(0, 0, 0)
  for (const { sheet, items } of pages) {
    const page = pdf.addPage([sheet.widthPt, sheet.heightPt])
    const h = sheet.heightPt
    for (const item of items) {
      switch (item.kind) {
        case 'polyline': {
          const [a, b] = [item.points[0]!, item.points.at(-1)!]
          page.drawLine({ start: { x: a.x, y: h - a.y }, end: { x: b.x, y: h - b.y }, thickness: item.strokeWidth ?? 0.9, color: black })
          break
        }
        case 'rect':
          page.drawRectangle({ x: item.box.x, y: h - item.box.y - item.box.height, width: item.box.width, height: item.box.height, borderColor: black, borderWidth: item.strokeWidth ?? 0.9 })
          break
        case 'circle':
          page.drawCircle({ x: item.centre.x, y: h - item.centre.y, size: item.radius, borderColor: black, borderWidth: item.strokeWidth ?? 0.9 })
          break
        case 'path':
          page.drawSvgPath(item.d, { x: 0, y: h, borderColor: black, borderWidth: item.strokeWidth ?? 0.9 })
          break
        case 'text':
          page.drawText(item.text, { x: item.x, y: h - item.y, size: item.size, font: fonts[item.weight], color: black })
      }
    }
  }
  return pdf.save()
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!
const time = async (f: () => Promise<unknown>) => {
  const start = performance.now()
  await f()
  sampleRss()
  return performance.now() - start
}

if (peakOnly >= 0) {
  const input = packageInput(process.argv[peakOnly + 1] as DemoDesignKey, process.argv[peakOnly + 2] as SheetSizeName)
  for (let i = 0; i < 3; i++) await buildPackage(input)
  sampleRss()
  console.log(String(peakRss))
  process.exit(0)
}

/** Peak RSS of a process that does nothing but generate the package (the raw comparison runs elsewhere) [MB]. */
function packagePeakMb(key: DemoDesignKey, size: SheetSizeName): number {
  const out = execFileSync(process.execPath, ['--import', 'tsx', fileURLToPath(import.meta.url), '--peak', key, size], { encoding: 'utf8' })
  return Number(out.trim().split('\n').at(-1)) / 2 ** 20
}

const cases: Array<{ key: DemoDesignKey; label: string; size: SheetSizeName; runs: number; targetMs: number }> = [
  { key: 'gridTied', label: 'residential, ANSI B', size: 'ANSI_B', runs: 9, targetMs: 400 },
  { key: 'farm1MW', label: '1 MW farm, ANSI D', size: 'ANSI_D', runs: 5, targetMs: 4000 },
]
for (const c of cases) {
  const input = packageInput(c.key, c.size)
  const built = await buildPackage(input) // warm up fonts and the JIT
  const pages = leaves([...planSetSheets(input), ...labelPages(planSetContext(input.doc, input), input.evaluation)])
  const operations = pages.reduce((t, p) => t + p.items.length, 0)
  await drawRaw(pages)
  const packageMs: number[] = []
  const rawMs: number[] = []
  for (let i = 0; i < c.runs; i++) {
    packageMs.push(await time(() => buildPackage(input)))
    rawMs.push(await time(() => drawRaw(pages)))
  }
  const pkg = median(packageMs)
  const raw = median(rawMs)
  console.log(
    `${c.label.padEnd(20)} ${String(built.sheetCount).padStart(3)} sheets, ${pages.length} pages drawn, ${operations} vector operations, zip ${(built.zip.length / 1024).toFixed(0)} KiB\n` +
    `  package median ${pkg.toFixed(0)} ms over ${c.runs} runs (target <= ${c.targetMs} ms)\n` +
    `  raw pdf-lib     ${raw.toFixed(0)} ms  ratio ${(pkg / raw).toFixed(2)} (target <= 1.5)\n` +
    `  peak RSS of a process generating it ${packagePeakMb(c.key, c.size).toFixed(0)} MB (target <= 400 MB)`,
  )
}
clearInterval(sampler)
console.log(`peak RSS of this process, package and raw runs together: ${(peakRss / 2 ** 20).toFixed(0)} MB`)
