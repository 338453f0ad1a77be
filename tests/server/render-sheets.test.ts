import { execFileSync, spawnSync } from 'node:child_process'
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS, demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import { evaluateDesign } from '../../shared/electrical'
import { parseDesign, type DesignDocument } from '../../shared/schemas/design'
import { boxesIntersect, textsOf, type Box, type DrawItem, type Sheet } from '../../server/render/model'
import { arrayLayoutSheets, compassPoint, planArrayLayout, planSetContext, planSetPdf, planSetSheets } from '../../server/render'

const ctxOf = (doc: DesignDocument, size: 'ANSI_B' | 'ANSI_D' = 'ANSI_B') => planSetContext(doc, { preparedBy: 'R. Quill', size })

/** The 1 MW demo with `rows` ground rows of `strings` strings each (20 modules a string). */
function bigFarm(rows: number, strings: number): DesignDocument {
  const base = DEMO_DESIGN_INPUTS.farm1MW
  const arrays = Array.from({ length: rows }, (_, i) => ({ ...base.topology.arrays[0]!, id: `ROW${i + 1}`, name: `Ground row ${i + 1}`, moduleCount: strings * 20 }))
  const parsed = parseDesign({
    ...base,
    topology: {
      arrays,
      strings: arrays.flatMap((a, i) => Array.from({ length: strings }, (_, k) => ({ id: `S${i + 1}.${k + 1}`, arrayId: a.id, modulesInSeries: 20, inverterId: 'INV1', mppt: 1 }))),
      runs: [],
    },
  })
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => `${i.field}: ${i.message}`).join('; '))
  return parsed.value
}

const within = (inner: Box, outer: Box) =>
  inner.x >= outer.x - 0.01 && inner.y >= outer.y - 0.01 && inner.x + inner.width <= outer.x + outer.width + 0.01 && inner.y + inner.height <= outer.y + outer.height + 0.01

function rectsOf(items: DrawItem[]): Box[] {
  return items.flatMap((i) => (i.kind === 'rect' ? [i.box] : i.kind === 'group' ? rectsOf(i.items) : []))
}

/** Overlaps on an E-101 sheet: block × block, text × text, text × module, and anything outside its block. */
function e101Overlaps(doc: DesignDocument, size: 'ANSI_B' | 'ANSI_D'): { pages: number; problems: string[] } {
  const evaluation = evaluateDesign(doc)
  const plan = planArrayLayout(ctxOf(doc, size), evaluation)
  const sheets = arrayLayoutSheets(ctxOf(doc, size), evaluation)
  const problems: string[] = []
  plan.forEach((page, k) => {
    const sheet = sheets[k]!
    page.blocks.forEach((a, i) => {
      if (!within(a.box, page.content)) problems.push(`${sheet.id} ${a.arrayId} leaves the drawing area`)
      if (boxesIntersect(a.box, page.notes)) problems.push(`${sheet.id} ${a.arrayId} × notes`)
      page.blocks.slice(i + 1).forEach((b) => boxesIntersect(a.box, b.box) && problems.push(`${sheet.id} ${a.arrayId}.${a.part} × ${b.arrayId}.${b.part}`))
    })
    for (const group of sheet.items.filter((i): i is Extract<DrawItem, { kind: 'group' }> => i.kind === 'group' && i.role === 'device')) {
      const block = page.blocks.find((b) => b.arrayId === group.data.array && String(b.part) === group.data.part)!
      const texts = textsOf(group.items)
      const modules = rectsOf(group.items).filter((r) => r !== block.box && !(r.x === block.box.x && r.y === block.box.y))
      for (const t of texts) if (!within(t.bounds, block.box)) problems.push(`${sheet.id} "${t.text}" leaves block ${block.arrayId}`)
      for (const r of modules) if (!within(r, block.box)) problems.push(`${sheet.id} a module leaves block ${block.arrayId}`)
      texts.forEach((t, i) => texts.slice(i + 1).forEach((u) => boxesIntersect(t.bounds, u.bounds) && problems.push(`${sheet.id} "${t.text}" × "${u.text}"`)))
      for (const t of texts) if (modules.some((r) => boxesIntersect(t.bounds, r))) problems.push(`${sheet.id} "${t.text}" × module`)
      modules.forEach((r, i) => modules.slice(i + 1).forEach((s) => boxesIntersect(r, s) && problems.push(`${sheet.id} module × module in ${block.arrayId}`)))
    }
  })
  return { pages: sheets.length, problems }
}

describe('E-101 array layout', () => {
  const cases: [string, DesignDocument, 'ANSI_B' | 'ANSI_D'][] = [
    ...(Object.keys(DEMO_DESIGN_INPUTS) as DemoDesignKey[]).map((k) => [k, demoDesign(k), 'ANSI_B'] as [string, DesignDocument, 'ANSI_B']),
    ['farm1MW on ANSI D', demoDesign('farm1MW'), 'ANSI_D'],
    ['40 rows of 12 strings', bigFarm(40, 12), 'ANSI_B'],
    ['one row of 200 strings', bigFarm(1, 200), 'ANSI_B'],
  ]
  it.each(cases)('%s: nothing overlaps, nothing leaves its block or the drawing area', (_, doc, size) => {
    const { problems } = e101Overlaps(doc, size)
    expect(problems).toEqual([])
  })

  it('draws every module once and labels every string and branch', () => {
    for (const key of ['gridTied', 'microinverter', 'farm1MW'] as DemoDesignKey[]) {
      const doc = demoDesign(key)
      const pages = planArrayLayout(ctxOf(doc), evaluateDesign(doc))
      const drawn = pages.flatMap((p) => p.blocks).flatMap((b) => b.groups)
      expect(drawn.reduce((t, g) => t + g.modules, 0)).toBe(doc.topology.arrays.reduce((t, a) => t + a.moduleCount, 0))
      expect(drawn.map((g) => g.id).sort()).toEqual([...doc.topology.strings.map((s) => s.id), ...doc.topology.microBranches.map((b) => b.id)].sort())
    }
  })

  it('splits a large set over E-101.1 … and continues one long array in parts', () => {
    const many = arrayLayoutSheets(ctxOf(bigFarm(40, 12)), evaluateDesign(bigFarm(40, 12)))
    expect(many.length).toBeGreaterThan(1)
    expect(many.map((s) => s.id)).toEqual(many.map((_, k) => `E-101.${k + 1}`))
    const long = planArrayLayout(ctxOf(bigFarm(1, 200)), evaluateDesign(bigFarm(1, 200)))
    const parts = long.flatMap((p) => p.blocks)
    expect(parts.length).toBeGreaterThan(1)
    expect(parts.every((b) => b.parts === parts.length)).toBe(true)
  })

  it('prints tilt, azimuth with its compass point, mount, and the string voltage the engine computed', () => {
    const doc = demoDesign('gridTiedStorage')
    const evaluation = evaluateDesign(doc)
    const texts = textsOf(arrayLayoutSheets(ctxOf(doc), evaluation)[0]!.items).map((t) => t.text).join(' | ')
    expect(texts).toContain('Roof mount, tilt 22°, azimuth 250° (W)')
    const vocMax = evaluation.sections.find((s) => s.id === 'string.S1')!.items.find((d) => d.key === 'string.S1.vocMax')!.value as number
    expect(texts).toContain(`Voc max ${(Math.round(vocMax * 10) / 10).toString()} V`)
    expect(texts).toContain('Schematic, not to scale')
    expect(texts).toMatch(/Roof access pathways, setbacks .* adopted fire and building codes and the AHJ/)
  })

  it('the compass arrow points the way the modules face (azimuth clockwise from north, y down on the sheet)', () => {
    expect([0, 45, 90, 135, 180, 225, 270, 315, 359].map(compassPoint)).toEqual(['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW', 'N'])
    for (const azimuth of [90, 180, 250]) {
      const base = demoDesign('gridTied')
      const doc = { ...base, topology: { ...base.topology, arrays: base.topology.arrays.map((a) => ({ ...a, azimuthDeg: azimuth })) } }
      const sheet = arrayLayoutSheets(ctxOf(doc), evaluateDesign(doc))[0]!
      const block = sheet.items.find((i) => i.kind === 'group' && i.role === 'device')
      if (block?.kind !== 'group') throw new Error('no array block')
      const circle = block.items.find((i) => i.kind === 'circle')
      const head = block.items.find((i) => i.kind === 'path')
      if (circle?.kind !== 'circle' || head?.kind !== 'path') throw new Error('no compass')
      const [tx, ty] = head.d.split(' ').slice(1, 3).map(Number) as [number, number]
      const angle = (Math.atan2(tx - circle.centre.x, -(ty - circle.centre.y)) * 180) / Math.PI
      expect((angle + 360) % 360).toBeCloseTo(azimuth, 1) // path coordinates are printed to 0.01 pt
    }
  })
})

describe('G-001 cover', () => {
  it('the sheet index of a very long set lists every page, parts of one sheet as a range, without overlaps', () => {
    const doc = demoDesign('farm1MW')
    const sheets: Sheet[] = planSetSheets({ doc, evaluation: evaluateDesign(doc), preparedBy: 'R. Quill', size: 'ANSI_B' })
    expect(sheets.length).toBeGreaterThan(100)
    // the cover's own content; the title block is checked with the frame
    const texts = textsOf(sheets[0]!.items.filter((i) => !(i.kind === 'group' && i.role === 'frame')))
    const ranges = texts.map((t) => /^(E-\d{3})\.(\d+) – E-\d{3}\.(\d+)$/.exec(t.text)).filter((m) => m !== null)
    const listed = (id: string) => texts.some((t) => t.text === id) || ranges.some(([, base, first, last]) => {
      const [b, part] = id.split('.')
      return b === base && Number(part) >= Number(first) && Number(part) <= Number(last)
    })
    for (const s of sheets) expect(listed(s.id), s.id).toBe(true)
    const e602 = sheets.filter((s) => s.id.startsWith('E-602')).length
    expect(texts.some((t) => t.text === `Calculations (${e602} pages)`)).toBe(true)
    // wrapped table lines sit at 1.3 × size, a hair under the font's ascender-to-descender box: compare inked cores
    const core = (b: Box) => ({ ...b, y: b.y + b.height * 0.06, height: b.height * 0.88 })
    texts.forEach((t, i) => texts.slice(i + 1).forEach((u) => expect(boxesIntersect(core(t.bounds), core(u.bounds)), `"${t.text}" × "${u.text}"`).toBe(false)))
  })
})

const hasPdftoppm = spawnSync('pdftoppm', ['-v']).error === undefined
describe.skipIf(!hasPdftoppm)('G-001 and E-101 rendered by pdftoppm', () => {
  it('rasterises both sheets at 50 dpi with ink on them (written to /tmp/stringline-sheets for a look)', async () => {
    const dir = '/tmp/stringline-sheets'
    mkdirSync(dir, { recursive: true })
    for (const key of ['gridTied', 'microinverter'] as DemoDesignKey[]) {
      const doc = demoDesign(key)
      const { pdf } = await planSetPdf({ doc, evaluation: evaluateDesign(doc), preparedBy: 'R. Quill' })
      writeFileSync(`${dir}/${key}.pdf`, pdf)
      execFileSync('pdftoppm', ['-r', '50', '-f', '1', '-l', '2', '-png', `${dir}/${key}.pdf`, `${dir}/${key}`])
      for (const page of ['1', '2']) {
        const png = readFileSync(`${dir}/${key}-${page}.png`)
        expect(png.readUInt32BE(16)).toBe(850) // 17 in × 50 dpi
        expect(png.readUInt32BE(20)).toBe(550)
        expect(png.length).toBeGreaterThan(15_000)
      }
    }
  })
})
