import { describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS, demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import { parseDesign, type DesignDocument } from '../../shared/schemas/design'
import { singleLineSvg } from '../../server/render'
import { parseSvg } from './support/xml-dom'

const HOSTILE = '<script>alert("x")</script> & \'Q\' "R" \u202Eevil\u202C \u200F\u0007bell\u0000'

function hostileDesign(): DesignDocument {
  const input = structuredClone(DEMO_DESIGN_INPUTS.gridTied)
  input.project = { ...input.project, name: `Job ${HOSTILE}`, owner: HOSTILE, siteAddress: `1 Main ${HOSTILE}`, utility: `Co-op ${HOSTILE}` }
  input.equipment = { ...input.equipment, disconnects: input.equipment.disconnects!.map((d) => ({ ...d, name: `Switch ${HOSTILE}` })) }
  const parsed = parseDesign(input)
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues))
  return parsed.value
}

describe('single-line SVG', () => {
  it.each(Object.keys(DEMO_DESIGN_INPUTS) as DemoDesignKey[])('%s parses, with a node per device and a tag per run', (key) => {
    const design = demoDesign(key)
    // the 1 MW farm splits over several ANSI B sheets: every part is its own document
    const docs = singleLineSvg(design, { preparedBy: 'A. Drafter' }).map(parseSvg)
    for (const doc of docs) expect(doc.documentElement.getAttribute('data-sheet')).toMatch(/^E-601(\.\d+)?$/)
    const all = (selector: string) => docs.flatMap((doc) => [...doc.querySelectorAll(selector)])
    const devices = all('g.sl-device[data-members]').flatMap((g) => g.getAttribute('data-members')!.split(' '))
    for (const id of new Set(design.topology.runs.flatMap((r) => [r.from, r.to]))) expect(devices).toContain(id)
    const tagged = all('g.sl-tag').flatMap((g) => g.getAttribute('data-runs')!.split(' '))
    for (const run of design.topology.runs) expect(tagged).toContain(run.id)
  })

  it('escapes hostile user text and drops control and direction characters', () => {
    const [svg] = singleLineSvg(hostileDesign(), { preparedBy: `Eve ${HOSTILE}` })
    const doc = parseSvg(svg!)
    expect(doc.getElementsByTagName('script')).toHaveLength(0)
    expect(svg).not.toMatch(/<script/i)
    expect(svg).toContain('&lt;script&gt;')
    expect(svg).toContain('&amp;')
    // eslint-disable-next-line no-control-regex
    expect(svg).not.toMatch(/[\u0000-\u0008\u202a-\u202e\u200f]/)
    const texts = [...doc.getElementsByTagName('text')].map((t) => t.textContent ?? '')
    expect(texts.some((t) => t.includes('<script>alert("x")</script>'))).toBe(true)
    expect(texts.some((t) => t.includes('evil') && t.includes('bell'))).toBe(true)
  })

  it('refuses an unknown sheet size, naming the option', () => {
    expect(() => singleLineSvg(demoDesign('gridTied'), { preparedBy: 'A', size: 'LETTER' as never })).toThrow(/sheetSize: "LETTER" is not a sheet size/)
    expect(() => singleLineSvg(demoDesign('gridTied'), { preparedBy: ' ' })).toThrow(/preparedBy/)
  })
})
