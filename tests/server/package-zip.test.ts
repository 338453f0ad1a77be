import { createHash } from 'node:crypto'
import Papa from 'papaparse'
import { PDFParse } from 'pdf-parse'
import { describe, expect, it } from 'vitest'
import { buildPackage, packageFileName, type BuiltPackage } from '../../server/package/build'
import { calculationsCsv } from '../../server/package/calculations-csv'
import { DEMO_DESIGN_INPUTS, demoDesign } from '../../shared/demo/designs'
import { evaluateDesign, SAFETY_CAUTION } from '../../shared/electrical'
import { parseDesign, type DesignDocument } from '../../shared/schemas/design'
import { PACKAGE_FILE_NAMES, type PackageStep } from '../../shared/schemas/revision'
import { parseSvg, type XmlDocument } from './support/xml-dom'
import { zipEntries, type ZipEntry } from '../support/unzip'

const CREATED = new Date('2026-12-01T15:30:00Z')

async function build(doc: DesignDocument, steps: PackageStep[] = [], size?: 'ANSI_B' | 'ANSI_D') {
  const evaluation = evaluateDesign(doc)
  const built = await buildPackage({
    doc, evaluation, size, preparedBy: 'R. Quill', revisions: [{ number: 3, date: '2026-12-01', description: 'Issued for permit' }],
    revision: 3, description: 'Issued for permit', created: CREATED, productVersion: '0.1.0',
  }, (s) => steps.push(s))
  return { built, evaluation, entries: await zipEntries(built.zip) }
}

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex')
const entry = (entries: ZipEntry[], name: string) => entries.find((e) => e.name === name)!.bytes

describe('submission package', () => {
  it('packs exactly the package files, in order, each matching the manifest', async () => {
    const steps: PackageStep[] = []
    const { built, evaluation, entries } = await build(demoDesign('gridTied'), steps)
    expect(built.fileName).toBe('CH-0101_rev03.zip')
    expect(entries.map((e) => e.name)).toEqual([...PACKAGE_FILE_NAMES])
    expect(steps).toEqual(['drawing', 'attachments', 'labels', 'packing'])

    const manifest = JSON.parse(entry(entries, 'manifest.json').toString('utf8')) as BuiltPackage['manifest']
    expect(manifest).toMatchObject({
      product: 'Stringline', version: '0.1.0', engineVersion: evaluation.engineVersion, project: { code: 'CH-0101', name: 'Marsh residence PV' },
      revision: 3, description: 'Issued for permit', created: '2026-12-01T15:30:00.000Z', stampedBy: null, caution: SAFETY_CAUTION,
    })
    expect(manifest.files.map((f) => f.name)).toEqual(PACKAGE_FILE_NAMES.filter((n) => n !== 'manifest.json'))
    for (const f of manifest.files) {
      const bytes = entry(entries, f.name)
      expect(f.bytes, f.name).toBe(bytes.length)
      expect(f.sha256, f.name).toBe(sha(bytes))
    }
    // zip dates are DOS local time at 2 s resolution: compare to the second, rounded down to even
    for (const e of entries) expect(Math.abs(e.modified.getTime() - CREATED.getTime())).toBeLessThan(2000)
    expect(built.sheetCount).toBeGreaterThanOrEqual(6)
    expect(built.files.map((f) => [f.name, f.sha256])).toEqual(entries.map((e) => [e.name, sha(e.bytes)]))
  })

  it('carries the evaluation, the CSV rows, the design and both PDFs faithfully', async () => {
    const doc = demoDesign('gridTiedStorage')
    const { evaluation, entries } = await build(doc)
    expect(JSON.parse(entry(entries, 'calculations.json').toString('utf8'))).toEqual(JSON.parse(JSON.stringify(evaluation)))

    const csv = Papa.parse<Record<string, string>>(entry(entries, 'calculations.csv').toString('utf8'), { header: true, skipEmptyLines: true })
    expect(csv.errors).toEqual([])
    const derivations = evaluation.sections.flatMap((s) => s.items)
    // the caution row, the input problems, then one row per derivation
    expect(csv.data).toHaveLength(1 + evaluation.issues.length + derivations.length)
    expect(csv.data[0]!.message).toBe(SAFETY_CAUTION)
    const vocMax = derivations.find((d) => d.key.endsWith('.vocMax'))!
    const row = csv.data.find((r) => r.key === vocMax.key)!
    expect(Number(row.value)).toBe(vocMax.value)
    expect(row).toMatchObject({ formula: vocMax.formula, unit: vocMax.unit, reference: vocMax.reference, status: vocMax.status })

    const design = parseDesign(JSON.parse(entry(entries, 'design.json').toString('utf8')))
    expect(design.ok && design.value).toEqual(doc)

    for (const name of ['plan-set.pdf', 'labels.pdf']) {
      const parser = new PDFParse({ data: new Uint8Array(entry(entries, name)) })
      const { pages } = await parser.getText()
      await parser.destroy()
      for (const p of pages) expect(p.text.replace(/\s+/g, ' '), `${name} page ${p.num}`).toContain('CAUTION: These results are design aids only.')
    }
  })

  it('guards CSV cells a spreadsheet would run as formulas, and keeps numbers numbers', () => {
    const evaluation = evaluateDesign(demoDesign('gridTied'))
    const step = evaluation.sections[1]!.items[0]!
    Object.assign(step, { message: '=HYPERLINK("http://x.invalid","open")', formula: '+1+2', label: '@SUM(A1)', value: -5, unit: '-' })
    const rows = Papa.parse<Record<string, string>>(calculationsCsv(evaluation), { header: true, skipEmptyLines: true }).data
    const row = rows.find((r) => r.key === step.key)!
    expect(row).toMatchObject({ message: `'=HYPERLINK("http://x.invalid","open")`, formula: "'+1+2", step: "'@SUM(A1)", value: '-5', unit: '' })
  })

  /** A device node for every run end and a tag for every run, across all parts. */
  const expectNodesAndTags = (svg: XmlDocument, doc: DesignDocument) => {
    const devices = [...svg.querySelectorAll('g.sl-device[data-members]')].flatMap((g) => g.getAttribute('data-members')!.split(' '))
    for (const id of new Set(doc.topology.runs.flatMap((r) => [r.from, r.to]))) expect(devices).toContain(id)
    const tagged = [...svg.querySelectorAll('g.sl-tag')].flatMap((g) => g.getAttribute('data-runs')!.split(' '))
    for (const run of doc.topology.runs) expect(tagged).toContain(run.id)
  }

  it('single-line.svg of a one-part diagram is that part, with a node per device', async () => {
    const doc = demoDesign('gridTied')
    const { entries } = await build(doc)
    const svg = parseSvg(entry(entries, 'single-line.svg').toString('utf8'))
    expect(svg.documentElement.getAttribute('data-sheet')).toBe('E-601')
    expectNodesAndTags(svg, doc)
  })

  it('single-line.svg stacks a diagram of several E-601 parts in one viewBox', async () => {
    // the 1 MW farm on ANSI B runs over several parts
    const doc = demoDesign('farm1MW')
    const { entries } = await build(doc, [], 'ANSI_B')
    const svg = parseSvg(entry(entries, 'single-line.svg').toString('utf8'))
    const parts = [...svg.querySelectorAll('svg > svg[data-sheet]')]
    expect(parts.length).toBeGreaterThan(1)
    expect(svg.documentElement.getAttribute('data-parts')).toBe(String(parts.length))
    const ys = parts.map((p) => Number(p.getAttribute('y')))
    const heights = parts.map((p) => Number(p.getAttribute('height')))
    ys.forEach((y, k) => { if (k > 0) expect(y).toBeGreaterThanOrEqual(ys[k - 1]! + heights[k - 1]!) })
    const [, , , total] = svg.documentElement.getAttribute('viewBox')!.split(' ').map(Number)
    expect(total).toBe(ys.at(-1)! + heights.at(-1)!)
    expect(parts.map((p) => p.getAttribute('data-sheet'))).toEqual(parts.map((_, k) => `E-601.${k + 1}`))
    expectNodesAndTags(svg, doc)
  })

  it('escapes hostile project text in the SVG and the JSON files', async () => {
    const hostile = '<script>alert("x")</script> & \u202Eevil\u0007'
    const input = structuredClone(DEMO_DESIGN_INPUTS.gridTied)
    input.project = { ...input.project, name: `Job ${hostile}`, owner: hostile }
    const parsed = parseDesign(input)
    if (!parsed.ok) throw new Error('bad test design')
    const { entries } = await build(parsed.value)
    const text = entry(entries, 'single-line.svg').toString('utf8')
    const svg = parseSvg(text)
    expect(svg.getElementsByTagName('script')).toHaveLength(0)
    expect(text).not.toMatch(/<script/i)
    expect(text).toContain('&lt;script&gt;')
    const design = JSON.parse(entry(entries, 'design.json').toString('utf8')) as DesignDocument
    expect(design.project.owner).toBe(hostile)
  })

  it('names the revision with two digits and refuses a bad revision number', async () => {
    expect(packageFileName('CH-0101', 0)).toBe('CH-0101_rev00.zip')
    expect(packageFileName('CH-0101', 12)).toBe('CH-0101_rev12.zip')
    const doc = demoDesign('gridTied')
    await expect(buildPackage({ doc, evaluation: evaluateDesign(doc), preparedBy: 'R', revision: -1, description: 'x', created: CREATED, productVersion: '0.1.0' }))
      .rejects.toThrow(/^revision: must be a whole number/)
  })
})
