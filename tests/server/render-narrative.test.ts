import { execFileSync, spawnSync } from 'node:child_process'
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { PDFParse } from 'pdf-parse'
import { afterAll, describe, expect, it } from 'vitest'
import { planSetContext } from '../../server/render'
import { revisionNarrativePdf } from '../../server/render/narrative-pdf'
import { DEMO_DESIGN_INPUTS, demoDesign } from '../../shared/demo/designs'
import { evaluateDesign, SAFETY_CAUTION } from '../../shared/electrical'
import { diffRevisions, type RevisionSide } from '../../shared/revisions/diff'
import { parseDesign, type DesignDocument } from '../../shared/schemas/design'

const flat = (s: string) => s.replace(/\s+/g, ' ')
const side = (number: number, doc: DesignDocument): RevisionSide => ({ number, doc, evaluation: evaluateDesign(doc) })
const dir = mkdtempSync(path.join(os.tmpdir(), 'stringline-narrative-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

async function pages(pdf: Uint8Array): Promise<string[]> {
  const parser = new PDFParse({ data: pdf })
  const result = await parser.getText()
  await parser.destroy()
  return result.pages.map((p) => flat(p.text))
}

/** Revision 1 of the residential demo: R3 upsized to #6 AWG and a 410 W module. */
function revisedResidence(): DesignDocument {
  const input = structuredClone(DEMO_DESIGN_INPUTS.gridTied)
  input.topology.runs!.find((r) => r.id === 'R3')!.minimumSize = '6'
  Object.assign(input.equipment.modules[0]!, { pmaxW: 410 })
  const parsed = parseDesign(input)
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues))
  return parsed.value
}

describe('revision narrative PDF', () => {
  it('prints the introduction, every change with its values, and the caution', async () => {
    const before = side(0, demoDesign('gridTied'))
    const after = side(1, revisedResidence())
    const diff = diffRevisions(before, after)
    const ctx = planSetContext(after.doc, { preparedBy: 'R. Quill', revisions: [{ number: 0, date: '2026-11-20', description: 'Issued for permit' }, { number: 1, date: '2026-12-01', description: 'Corrections round 1' }] })
    const pdf = await revisionNarrativePdf(ctx, diff)
    writeFileSync(path.join(dir, 'narrative.pdf'), pdf)
    const [page, ...rest] = await pages(pdf)
    expect(rest).toEqual([])
    expect(page).toContain('RESUBMITTAL NARRATIVE')
    expect(page).toContain('RN-1')
    expect(page).toContain('To: Cedar Hollow Building Department, plan review.')
    expect(page).toContain('replaces revision 0')
    const oldSize = before.evaluation.runs.find((r) => r.id === 'R3')!.size
    expect(page).toContain(`#${oldSize} AWG`)
    expect(page).toContain('#6 AWG')
    expect(page).toContain('400 W')
    expect(page).toContain('410 W')
    for (const g of diff.groups) expect(page).toContain(`${g.title} (${g.changes.length})`)
    expect(page).toContain(flat(SAFETY_CAUTION).slice(0, 60))
    expect(page).not.toMatch(/complies with|code compliant/i)
  })

  it('says "No changes" for equal revisions and runs a long list over several sheets, each with the caution', async () => {
    const same = diffRevisions(side(0, demoDesign('gridTied')), side(1, demoDesign('gridTied')))
    const ctx = planSetContext(demoDesign('gridTied'), { preparedBy: 'R. Quill' })
    expect((await pages(await revisionNarrativePdf(ctx, same))).join(' ')).toContain('No changes between revision 0 and revision 1.')

    // a different system altogether: hundreds of changes
    const long = diffRevisions(side(0, demoDesign('groundMountFarm')), side(1, demoDesign('farm1MW')))
    const farmCtx = planSetContext(demoDesign('farm1MW'), { preparedBy: 'R. Quill' })
    const all = await pages(await revisionNarrativePdf(farmCtx, long))
    expect(all.length).toBeGreaterThan(1)
    all.forEach((p, k) => {
      expect(p).toContain(`RN-${k + 1}`)
      expect(p).toContain(`page ${k + 1} of ${all.length}`)
      expect(p).toContain('CAUTION: These results are design aids only.')
    })
  })

  it.skipIf(spawnSync('pdftoppm', ['-v']).error !== undefined)('rasterises at 50 dpi with ink on it', () => {
    execFileSync('pdftoppm', ['-r', '50', '-png', path.join(dir, 'narrative.pdf'), path.join(dir, 'narrative')])
    const png = readFileSync(path.join(dir, readdirSync(dir).find((f) => f.endsWith('.png'))!))
    // ANSI B landscape, 17 × 11 in at 50 dpi
    expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([850, 550])
    expect(png.length).toBeGreaterThan(15_000)
  })
})
