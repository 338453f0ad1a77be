import { PDFDocument, StandardFonts } from 'pdf-lib'
import { PDFParse } from 'pdf-parse'
import { describe, expect, it } from 'vitest'
import { demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import { evaluateDesign, fmt, SAFETY_CAUTION } from '../../shared/electrical'
import type { DesignDocument } from '../../shared/schemas/design'
import { equipmentLines, planSetPdf, sheetToSvg, planSetSheets, type DatasheetAttachment, type PlanSetInput } from '../../server/render'

const flat = (s: string) => s.replace(/\s+/g, ' ')

const input = (doc: DesignDocument, attachments: DatasheetAttachment[] = [], size: PlanSetInput['size'] = 'ANSI_B'): PlanSetInput => ({
  doc, evaluation: evaluateDesign(doc), preparedBy: 'R. Quill', size, attachments,
  revisions: [{ number: 0, date: '2026-12-01', description: 'Issued for permit' }],
})

async function readPdf(bytes: Uint8Array) {
  const parser = new PDFParse({ data: bytes })
  const [text, info] = [await parser.getText(), await parser.getInfo()]
  await parser.destroy()
  return { pages: text.pages.map((p) => flat(p.text)), info: info.info as Record<string, string> }
}

/** A small datasheet of `pages` pages drawn with pdf-lib's standard font. */
async function datasheet(title: string, pages: number): Promise<Uint8Array> {
  const pdf = await PDFDocument.create()
  const font = await pdf.embedFont(StandardFonts.Helvetica)
  for (let k = 0; k < pages; k++) pdf.addPage([612, 792]).drawText(`${title} sheet ${k + 1}`, { x: 72, y: 700, size: 18, font })
  return pdf.save()
}

const ORDER = /^(G-001|E-101(\.\d+)?|E-601(\.\d+)?|E-602(\.\d+)?|E-603(\.\d+)?|E-604(\.\d+)?|ATT-[A-Z]+)$/
const RANK = ['G-001', 'E-101', 'E-601', 'E-602', 'E-603', 'E-604', 'ATT']

describe('plan-set PDF', () => {
  it.each(['gridTied', 'gridTiedStorage', 'offGrid', 'microinverter', 'groundMountFarm'] as DemoDesignKey[])('%s: sheets in plan-set order, cover figures from the engine, index of every page, E-604 lists every item, caution on every sheet', async (key) => {
    const doc = demoDesign(key)
    const set = input(doc)
    const sheets = planSetSheets(set)
    const out = await planSetPdf(set)
    const { pages, info } = await readPdf(out.pdf)
    expect(pages).toHaveLength(sheets.length)
    expect(out.pageCount).toBe(sheets.length)
    // ids in order: G-001 first, then E-101 …, E-601 …, E-602 …, (E-603 …), E-604 …
    const ids = sheets.map((s) => s.id)
    for (const id of ids) expect(id).toMatch(ORDER)
    const ranks = ids.map((id) => RANK.findIndex((r) => id.startsWith(r)))
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b))
    for (const needed of ['G-001', 'E-101', 'E-601', 'E-602', 'E-604']) expect(ids.some((id) => id.startsWith(needed))).toBe(true)
    ids.forEach((id, k) => expect(pages[k]).toContain(id))

    // the cover prints the engine's DC size at STC and module count (summary.dcKw, summary.modules)
    const evaluation = set.evaluation
    const dcKw = evaluation.summary.find((d) => d.key === 'summary.dcKw')!.value as number
    const modules = evaluation.summary.find((d) => d.key === 'summary.modules')!.value as number
    expect(modules).toBe(doc.topology.arrays.reduce((t, a) => t + a.moduleCount, 0))
    // cross-check against the nameplates: Σ count × Pmax
    expect(dcKw).toBeCloseTo(doc.topology.arrays.reduce((t, a) => t + a.moduleCount * doc.equipment.modules.find((m) => m.id === a.moduleId)!.pmaxW, 0) / 1000, 9)
    expect(pages[0]).toContain(`DC system size (STC) ${fmt(dcKw, 3)} kW`)
    expect(pages[0]).toContain(`Modules ${modules}`)
    expect(pages[0]).toContain(`NFPA 70 (NEC) ${doc.codeBasis.necEdition}`)
    expect(pages[0]).toContain(`${doc.codeBasis.designLowC} °C`)
    // the sheet index names every page of the set, with its title
    const index = pages[0]!.slice(pages[0]!.indexOf('SHEET INDEX'))
    expect(index).toContain(`SHEET INDEX (${sheets.length} pages)`)
    for (const s of sheets) expect(index).toContain(`${s.id} ${s.title}`)

    // E-604: every equipment item with its tag and quantity
    const e604 = pages.filter((_, k) => ids[k]!.startsWith('E-604')).join(' ')
    const lines = equipmentLines(doc)
    expect(lines.length).toBe(Object.values(doc.equipment).reduce((t, list) => t + list.length, 0) - doc.equipment.dcLoads.length - doc.equipment.pointsOfInterconnection.length)
    for (const l of lines) expect(e604).toContain(l.name)
    for (const l of lines) expect(e604).toMatch(new RegExp(`${l.id.replace('.', '\\.')} ${l.name.slice(0, 12)}`))
    expect(e604).toContain('not attached')

    for (const p of pages) expect(p).toContain(flat(SAFETY_CAUTION))
    expect(info.Title).toBe(`${doc.project.name} \u2014 permit plan set`)
    expect(info.Subject).toBe(doc.project.code)
    expect(info.Author).toBe(doc.project.installer)
  })

  it('the microinverter set shows the branches on E-101 and the unit count on E-604', async () => {
    const doc = demoDesign('microinverter')
    const { pages } = await readPdf((await planSetPdf(input(doc))).pdf)
    const e101 = pages.find((p) => p.includes('ARRAY LAYOUT (SCHEMATIC, NOT TO SCALE)'))!
    for (const b of doc.topology.microBranches) expect(e101).toContain(`${b.id}: branch`)
    const units = doc.topology.microBranches.reduce((t, b) => t + b.units, 0)
    expect(pages.find((p) => p.includes('EQUIPMENT SCHEDULE'))).toMatch(new RegExp(`MIC Generic 290 VA microinverter ${units} `))
  })

  it("prints the jurisdiction profile's own notes on G-001 after the general notes", async () => {
    const doc = demoDesign('gridTied')
    const ahj = { notes: ['1. Keep the approved set on site for the inspector.', '2. Call 48 hours ahead for the final.'], requiredLabelSections: [] }
    const { pages } = await readPdf((await planSetPdf({ ...input(doc), ahj })).pdf)
    const cover = pages[0]!
    expect(cover).toContain(`NOTES REQUIRED BY ${doc.project.jurisdiction.toUpperCase()}`)
    expect(cover.indexOf('Keep the approved set on site')).toBeGreaterThan(cover.indexOf('GENERAL NOTES'))
    expect(cover).toContain('2. Call 48 hours ahead for the final.')
    // without a profile there is no such block
    expect((await readPdf((await planSetPdf(input(doc))).pdf)).pages[0]).not.toContain('NOTES REQUIRED BY')
  })

  it('merges datasheets after E-604 with a margin line, and turns a broken or encrypted one into a placeholder page', async () => {
    const doc = demoDesign('gridTied')
    const encrypted = new TextEncoder().encode('%PDF-1.7\n1 0 obj <</Type/Catalog/Pages 2 0 R>> endobj\n2 0 obj <</Type/Pages/Kids[]/Count 0>> endobj\n3 0 obj <</Filter/Standard/V 2/R 3/O(x)/U(y)/P -4>> endobj\ntrailer <</Root 1 0 R/Encrypt 3 0 R/Size 4>>\n%%EOF')
    const attachments: DatasheetAttachment[] = [
      { equipmentName: 'Generic 400 W mono module', fileName: 'module-datasheet.pdf', bytes: await datasheet('Module', 2) },
      { equipmentName: 'INV1', fileName: 'inverter.pdf', bytes: new TextEncoder().encode('this is not a PDF at all') },
      { equipmentName: 'Main service panel', fileName: 'panel.pdf', bytes: encrypted },
      { equipmentName: 'AC disconnect, non-fused', fileName: 'disconnect.pdf', bytes: await datasheet('Disconnect', 1) },
    ]
    const out = await planSetPdf(input(doc, attachments))
    const { pages } = await readPdf(out.pdf)
    expect(out.pageCount).toBe(out.sheets.length + 2 + 1)
    expect(pages).toHaveLength(out.pageCount)
    const e604 = pages.findIndex((p) => p.includes('EQUIPMENT SCHEDULE'))
    const after = pages.slice(e604 + 1)
    expect(after).toHaveLength(5)
    expect(after[0]).toContain('Module sheet 1')
    expect(after[0]).toContain('ATT-A \u2014 datasheet: Generic 400 W mono module \u2014 module-datasheet.pdf \u2014 page 1 of 2')
    expect(after[1]).toContain('Module sheet 2')
    expect(after[1]).toContain('page 2 of 2')
    expect(after[2]).toContain('ATTACHMENT B \u2014 DATASHEET COULD NOT BE MERGED')
    expect(after[2]).toContain('inverter.pdf')
    expect(after[2]).toContain('not a readable PDF')
    expect(after[3]).toContain('panel.pdf')
    expect(after[3]).toContain('encrypted')
    expect(after[4]).toContain('Disconnect sheet 1')
    expect(after[4]).toContain('ATT-D')
    // E-604 points at the right pages (1-based)
    expect(pages[e604]).toContain(`Datasheet: attachment A, page ${e604 + 2}`)
    expect(pages[e604]).toContain(`Datasheet: attachment D, page ${e604 + 6}`)
    expect(pages[e604]).toContain(`attachment B: could not be merged, see page ${e604 + 4}`)
    // placeholders are sheets: framed, with the caution; the index lists every attachment
    for (const p of after.slice(2, 4)) expect(p).toContain(flat(SAFETY_CAUTION))
    for (const id of ['ATT-A', 'ATT-B', 'ATT-C', 'ATT-D']) expect(pages[0]).toContain(id)
    // every framed sheet has its stamp box on the page it ended up on; merged datasheets have none
    const boxed = out.stampBoxes.map((b) => b.page)
    expect(boxed).toEqual([...pages.keys()].filter((k) => k <= e604 || k === e604 + 3 || k === e604 + 4))
    for (const b of out.stampBoxes) expect(pages[b.page]).toContain("REVIEWER'S STAMP AND SIGNATURE")
  })

  it('hostile project text neither breaks the PDF nor escapes into the SVG', async () => {
    const base = demoDesign('gridTied')
    const hostile = '<script>alert(1)</script> \u202Egnp.exe\u200F \u0007\u0000 & "quoted" '
    const doc: DesignDocument = {
      ...base,
      project: { ...base.project, name: `${hostile}${'N'.repeat(300)}`, owner: hostile, siteAddress: `${'Long address '.repeat(25)}`, jurisdiction: hostile },
      topology: { ...base.topology, arrays: base.topology.arrays.map((a) => ({ ...a, name: `${hostile}${'R'.repeat(300)}` })) },
    }
    const set = input(doc, [{ equipmentName: hostile, fileName: `${hostile}.pdf`, bytes: await datasheet('X', 1) }])
    const out = await planSetPdf(set)
    const { pages } = await readPdf(out.pdf)
    expect(pages).toHaveLength(out.pageCount)
    const all = pages.join(' ')
    // eslint-disable-next-line no-control-regex
    expect(all).not.toMatch(/[\u0000-\u0008\u202a-\u202e\u200f]/)
    expect(all).toContain('<script>alert(1)</script>')
    for (const sheet of planSetSheets(set).filter((s) => /^(G-001|E-101|E-604)/.test(s.id))) {
      const svg = sheetToSvg(sheet)
      expect(svg).not.toContain('<script')
      expect(svg).toContain('&lt;script&gt;')
      // eslint-disable-next-line no-control-regex
      expect(svg).not.toMatch(/[\u0000-\u0008\u202a-\u202e\u200f]/)
    }
  })
})
