import { PDFParse } from 'pdf-parse'
import { describe, expect, it } from 'vitest'
import { demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import { evaluateDesign, fmt, SAFETY_CAUTION } from '../../shared/electrical'
import { electricalSheets, sheetsToPdf } from '../../server/render'
import { boxesIntersect, stampBoxOf, textsOf } from '../../server/render/model'

const flat = (s: string) => s.replace(/\s+/g, ' ')

async function pagesOf(key: DemoDesignKey, size: 'ANSI_B' | 'ANSI_D' = 'ANSI_B') {
  const doc = demoDesign(key)
  const evaluation = evaluateDesign(doc)
  const sheets = electricalSheets(doc, { preparedBy: 'R. Quill', size, evaluation, revisions: [{ number: 0, date: '2026-12-01', description: 'Issued for permit' }] })
  const bytes = await sheetsToPdf(sheets, { title: doc.project.name })
  const parser = new PDFParse({ data: bytes })
  const result = await parser.getText()
  await parser.destroy()
  return { doc, evaluation, sheets, pages: result.pages.map((p) => flat(p.text)) }
}

describe('electrical sheets PDF', () => {
  it.each(['gridTied', 'gridTiedStorage', 'offGrid', 'microinverter'] as DemoDesignKey[])('%s: E-601 shows the computed conductors, OCPD and voltage drop; E-602 every step; caution everywhere', async (key) => {
    const { evaluation, sheets, pages } = await pagesOf(key)
    expect(pages).toHaveLength(sheets.length)
    const e601 = pages[0]!
    expect(e601).toContain('E-601')
    for (const run of evaluation.runs) {
      expect(run.size).not.toBeNull()
      expect(e601).toContain(`#${run.size} AWG ${run.material}`)
      if (run.ocpdA !== null) expect(e601).toContain(`${fmt(run.ocpdA, 0)} A`)
      expect(e601).toContain(fmt(run.voltageDropPercent!, 2))
      expect(e601).toContain(run.id)
    }
    // each run's voltage-drop step is printed on the calculation page that carries its section
    const calc = pages.slice(1)
    for (const run of evaluation.runs) {
      const page = calc.find((p) => p.includes(`Circuit ${run.id}:`))
      expect(page, `section of ${run.id}`).toBeDefined()
    }
    const everyItem = evaluation.sections.flatMap((s) => s.items)
    for (const d of everyItem) expect(calc.some((p) => p.includes(flat(d.label).slice(0, 30)))).toBe(true)
    for (const p of pages) expect(p).toContain(flat(SAFETY_CAUTION))
  })

  it('every sheet carries the title block: project, sheet id, revision row, preparer, and an empty stamp box', async () => {
    const { doc, sheets, pages } = await pagesOf('gridTied')
    sheets.forEach((sheet, k) => {
      for (const expected of [doc.project.name, doc.project.installer, 'R. Quill', 'Issued for permit', "REVIEWER'S STAMP AND SIGNATURE", sheet.id]) expect(pages[k]).toContain(expected)
      // the frame marks the stamp box, so stamping finds it on the published page
      const stamp = stampBoxOf(sheet)
      if (!stamp) throw new Error('no stamp box')
      expect(stamp.height).toBeGreaterThan(100)
      expect(textsOf(sheet.items).filter((t) => boxesIntersect(t.bounds, stamp))).toEqual([])
    })
  })

  it('prints hostile user text safely: no control or direction characters, missing glyphs replaced', async () => {
    const doc = demoDesign('gridTied')
    const hostile = { ...doc, project: { ...doc.project, name: 'Job <script>&\u202E\u0007 \u6f22 end', owner: 'x'.repeat(120) } }
    const sheets = electricalSheets(hostile, { preparedBy: 'Eve \u0000\u200F' })
    const parser = new PDFParse({ data: await sheetsToPdf(sheets, { title: hostile.project.name }) })
    const text = (await parser.getText()).text
    await parser.destroy()
    expect(text).toContain('Job <script>& ? end')
    // eslint-disable-next-line no-control-regex
    expect(text).not.toMatch(/[\u0000-\u0008\u202a-\u202e\u200f]/)
    // a name longer than the title block wraps and ends with an ellipsis instead of running off the sheet
    expect(text).toContain('\u2026')
  })

  it('the 1 MW farm on ANSI D: pages numbered, caution on every page, values on the right pages', async () => {
    const { evaluation, sheets, pages } = await pagesOf('farm1MW', 'ANSI_D')
    expect(sheets[0]!.id).toBe('E-601')
    expect(sheets.at(-1)!.id).toMatch(/^E-602\.\d+$/)
    for (const p of pages) expect(p).toContain(flat(SAFETY_CAUTION))
    const output = evaluation.runs.find((r) => r.id === 'RC1')!
    const size = Number(output.size) >= 250 ? `${output.size} kcmil` : `#${output.size} AWG`
    expect(pages[0]).toContain(`${output.parallelSets > 1 ? `${output.parallelSets} sets of ` : ''}${size} ${output.material}`)
    expect(pages[0]).toContain(`${fmt(output.ocpdA!, 0)} A`)
    const vd = evaluation.sections.find((s) => s.id === 'run.RS1.1')!.items.find((d) => d.key.endsWith('.voltageDropPercent'))!
    const page = pages.findIndex((p) => p.includes('Circuit RS1.1:'))
    expect(page).toBeGreaterThan(0)
    expect(pages[page]).toContain(`${fmt(vd.value as number, 2)} %`)
  })
})
