import { execFileSync, spawnSync } from 'node:child_process'
import { mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { PDFParse } from 'pdf-parse'
import { describe, expect, it } from 'vitest'
import { demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import { evaluateDesign, SAFETY_CAUTION, type DesignDocument } from '../../shared/electrical'
import { requiredLabels } from '../../shared/electrical/rules/labels'
import { sheetsToPdf } from '../../server/render/pdf'
import { sheetToSvg } from '../../server/render/svg'
import { labelPages, labelsPdf } from '../../server/render/labels-pdf'
import { labelSheets } from '../../server/render/sheets/e603-labels'
import { textsOf, type DrawItem } from '../../server/render/model'
import type { PlanSetContext } from '../../server/render/sheets/frame'

const flat = (s: string) => s.replace(/\s+/g, ' ')
const context = (doc: DesignDocument, size: PlanSetContext['size'] = 'ANSI_B', ahj: PlanSetContext['ahj'] = { notes: [], requiredLabelSections: [] }): PlanSetContext => ({
  doc, size, preparedBy: 'R. Quill', revisions: [{ number: 0, date: '2026-12-01', description: 'Issued for permit' }], ahj,
})

async function pdfPages(bytes: Uint8Array): Promise<string[]> {
  const parser = new PDFParse({ data: bytes })
  const result = await parser.getText()
  await parser.destroy()
  return result.pages.map((p) => flat(p.text))
}

const groupsOf = (items: DrawItem[]) => items.filter((i): i is Extract<DrawItem, { kind: 'group' }> => i.kind === 'group' && i.data.label !== undefined)

describe('E-603 labels and placards', () => {
  it.each(['gridTied', 'gridTiedStorage', 'offGrid', 'microinverter', 'farm1MW'] as DemoDesignKey[])('%s: every label, its value, location and reference are printed; caution on every page', async (key) => {
    const doc = demoDesign(key)
    const evaluation = evaluateDesign(doc)
    const labels = requiredLabels(doc, evaluation)
    const sheets = labelSheets(context(doc, key === 'farm1MW' ? 'ANSI_D' : 'ANSI_B'), evaluation)
    const pages = await pdfPages(await sheetsToPdf(sheets, { title: doc.project.name }))
    expect(pages).toHaveLength(sheets.length)
    sheets.forEach((s, k) => expect(s.id).toBe(sheets.length === 1 ? 'E-603' : `E-603.${k + 1}`))
    const all = pages.join(' ')
    for (const l of labels) {
      if (l.title !== null) expect(all, `#${l.number} title`).toContain(l.title.slice(0, 20))
      expect(all).toContain(l.reference.replace(/^NEC \d+ /, ''))
    }
    for (const v of all.match(/\d+(\.\d+)? V\./g) ?? []) expect(labels.some((l) => l.text.includes(v))).toBe(true)
    for (const p of pages) {
      expect(p).toContain(flat(SAFETY_CAUTION))
      expect(p).toContain('110.21(B)')
      expect(p).not.toMatch(/undefined|NaN/)
    }
  })

  it('a long label list continues over E-603.1 … E-603.n, each page framed with the caution and the material note', async () => {
    // thirty AC disconnects in a row between the inverter and the service: three labels each
    const base = demoDesign('gridTied')
    const ids = Array.from({ length: 30 }, (_, i) => `D${i + 1}`)
    const outputRun = base.topology.runs.find((r) => r.id === 'R3')!
    const doc: DesignDocument = {
      ...base,
      equipment: { ...base.equipment, disconnects: ids.map((id) => ({ ...base.equipment.disconnects[0]!, id, name: `AC disconnect ${id}` })) },
      topology: {
        ...base.topology,
        runs: [
          ...base.topology.runs.filter((r) => r.kind !== 'inverter_output'),
          ...['INV1', ...ids].map((from, i) => ({ ...outputRun, id: `RA${i}`, from, to: ids[i] ?? 'MSP', lengthFt: 5 })),
        ],
      },
    }
    const evaluation = evaluateDesign(doc)
    const sheets = labelSheets(context(doc), evaluation)
    expect(sheets.length).toBeGreaterThan(1)
    expect(sheets.map((s) => s.id)).toEqual(sheets.map((_, k) => `E-603.${k + 1}`))
    const pages = await pdfPages(await sheetsToPdf(sheets, { title: 't' }))
    pages.forEach((p, k) => {
      expect(p).toContain(`page ${k + 1} of ${pages.length}`)
      expect(p).toContain(flat(SAFETY_CAUTION))
      expect(p).toContain('LABEL MATERIAL')
    })
    // every inverter's 690.53 label is on some page, none lost at a page break
    const all = pages.join(' ')
    for (const id of ids) expect(all).toContain(`On AC disconnect ${id} (${id})`)
  })

  it('grid-tied: the 690.53 and 690.54 values from the engine are on the sheet', async () => {
    const doc = demoDesign('gridTied')
    const evaluation = evaluateDesign(doc)
    const text = (await pdfPages(await sheetsToPdf(labelSheets(context(doc), evaluation), { title: 't' }))).join(' ')
    // 690.7(A)(1): 10 × 37.1 V × (1 + 0.0027 × 43) = 414.1 V; 690.54: 32 A at 240 V
    expect(text).toContain('414.1 V')
    expect(text).toContain('32 A')
    expect(text).toContain('690.56(C)(1)')
  })

  it("lists each label section the jurisdiction profile requires, with the label that answers it or a bold request to ask the AHJ", async () => {
    const doc = demoDesign('gridTied')
    const evaluation = evaluateDesign(doc)
    const ahj = { notes: [], requiredLabelSections: ['690.56(C)', '705.10', '690.15(D)'] }
    const labels = requiredLabels(doc, evaluation)
    const text = (await pdfPages(await sheetsToPdf(labelSheets(context(doc, 'ANSI_B', ahj), evaluation), { title: 't' }))).join(' ')
    expect(text).toContain(`Labels ${doc.project.jurisdiction} requires on every job`)
    // 690.56(C) (rapid shutdown, NEC 2023 690.56(C)(1) and (C)(2)) is answered by the labels above that cite it
    const rapidShutdown = labels.filter((l) => l.reference.includes('690.56(C)')).map((l) => `#${l.number}`)
    expect(rapidShutdown.length).toBeGreaterThan(0)
    expect(text).toContain(`Section 690.56(C): see label ${rapidShutdown.join(', ')} above.`)
    expect(text).toMatch(/Section 705\.10: see label #\d+ above\./)
    // a section no label of this system cites is not silently dropped
    expect(text).toContain('Section 690.15(D): no label of this system answers to it in the adopted edition')
  })
})

describe('labels.pdf', () => {
  it.each(['gridTied', 'gridTiedStorage', 'offGrid', 'groundMountFarm'] as DemoDesignKey[])('%s: every copy drawn at its size on Letter pages, with texts, foot line and caution', async (key) => {
    const doc = demoDesign(key)
    const evaluation = evaluateDesign(doc)
    const labels = requiredLabels(doc, evaluation)
    const sheets = labelPages(context(doc), evaluation)
    for (const s of sheets) expect([s.widthPt, s.heightPt]).toEqual([612, 792])
    const drawn = sheets.flatMap((s) => groupsOf(s.items))
    expect(drawn).toHaveLength(labels.reduce((t, l) => t + l.quantity, 0))
    for (const g of drawn) {
      const label = labels[Number(g.data.label) - 1]!
      const edge = g.items[0]!
      if (edge.kind !== 'rect') throw new Error('label edge is not a rectangle')
      expect(edge.box.width).toBeCloseTo(label.sizeIn.width * 72, 6)
      expect(edge.box.height).toBeGreaterThanOrEqual(label.sizeIn.height * 72 - 1e-6)
      // text stays inside the label
      for (const t of textsOf(g.items)) {
        expect(t.bounds.x).toBeGreaterThanOrEqual(edge.box.x - 0.5)
        expect(t.bounds.x + t.bounds.width).toBeLessThanOrEqual(edge.box.x + edge.box.width + 0.5)
        expect(t.bounds.y + t.bounds.height).toBeLessThanOrEqual(edge.box.y + edge.box.height + 0.5)
      }
      if (label.signalWord !== null) {
        expect(g.items.some((i) => i.kind === 'rect' && i.fill === 'black')).toBe(true)
        expect(textsOf(g.items).find((t) => t.text === label.signalWord)?.fill).toBe('white')
      }
      if (label.letterHeightIn) {
        // capital height 0.714 em (Open Sans) must reach the code's letter height
        const title = textsOf(g.items).find((t) => t.weight === 'bold')!
        expect(title.size * 0.714).toBeGreaterThanOrEqual(label.letterHeightIn.title * 72 - 1e-6)
      }
    }
    // nothing but the foot line reaches into the foot (its rule is the page's last polyline)
    for (const s of sheets) {
      const footRule = s.items.filter((i) => i.kind === 'polyline').at(-1)!
      if (footRule.kind !== 'polyline') throw new Error('no foot rule')
      const above = textsOf(s.items).filter((t) => !t.text.startsWith(doc.project.code) && !flat(SAFETY_CAUTION).includes(t.text))
      for (const t of above) expect(t.bounds.y + t.bounds.height, t.text).toBeLessThanOrEqual(footRule.points[0]!.y)
    }
    const pages = await pdfPages(await labelsPdf(context(doc), evaluation))
    expect(pages).toHaveLength(sheets.length)
    const all = pages.join(' ')
    for (const l of labels) {
      expect(all).toContain(flat(l.text).split(' ').slice(0, 6).join(' '))
      if (l.signalWord) expect(all).toContain(l.signalWord)
    }
    pages.forEach((p, k) => {
      expect(p).toContain(`${doc.project.code} \u00b7 labels.pdf \u00b7 page ${k + 1} of ${pages.length}`)
      expect(p).toContain(flat(SAFETY_CAUTION))
    })
  })

  it('the SVG renderer reverses the signal word too (white text on the black band)', () => {
    const doc = demoDesign('gridTied')
    const svg = labelPages(context(doc), evaluateDesign(doc)).map(sheetToSvg).join('')
    expect(svg).toMatch(/<text[^>]*fill="#fff(fff)?"[^>]*>WARNING<\/text>/)
  })

  it('hostile names in the design print safely in E-603 and labels.pdf', async () => {
    const doc = demoDesign('gridTied')
    const evil = 'ACD <script>alert(1)</script> & \u202Eevil\u0007 \u6f22 {maxVoltage} undefined'
    const hostile: DesignDocument = {
      ...doc,
      project: { ...doc.project, name: 'Job <b>&\u202E\u0000 end' },
      equipment: { ...doc.equipment, disconnects: doc.equipment.disconnects.map((d) => ({ ...d, name: evil })) },
    }
    const evaluation = evaluateDesign(hostile)
    const labels = requiredLabels(hostile, evaluation)
    expect(labels.every((l) => l.missing.length === 0)).toBe(true)
    for (const bytes of [await labelsPdf(context(hostile), evaluation), await sheetsToPdf(labelSheets(context(hostile), evaluation), { title: 'x' })]) {
      const text = (await pdfPages(bytes)).join(' ')
      expect(text).toContain('<script>alert(1)</script>')
      // eslint-disable-next-line no-control-regex
      expect(text).not.toMatch(/[\u0000-\u0008\u202a-\u202e]/)
      expect(text).toContain('414.1 V')
    }
  })

  it.skipIf(spawnSync('pdftoppm', ['-v']).error !== undefined)('renders to PNG with pdftoppm at 60 dpi: Letter size, with ink', async () => {
    const doc = demoDesign('gridTiedStorage')
    const dir = '/tmp/stringline-labels-png'
    mkdirSync(dir, { recursive: true })
    const file = path.join(dir, 'labels.pdf')
    writeFileSync(file, await labelsPdf(context(doc), evaluateDesign(doc)))
    execFileSync('pdftoppm', ['-r', '60', '-f', '1', '-l', '1', '-gray', '-png', file, path.join(dir, 'page')])
    const png = readFileSync(path.join(dir, readdirSync(dir).find((f) => f.startsWith('page') && f.endsWith('.png'))!))
    expect(png.readUInt32BE(16)).toBe(510) // 8.5 in × 60 dpi
    expect(png.readUInt32BE(20)).toBe(660) // 11 in × 60 dpi
    expect(png.length).toBeGreaterThan(8_000)
  })
})
