import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { aRevision } from './packageFixtures'
import RevisionsTable from './RevisionsTable.vue'

async function mountTable() {
  const wrapper = mount(RevisionsTable, { props: { revisions: [aRevision(1, { evaluationStatus: 'warn' }), aRevision(0)], selected: 0 }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

const dataRows = (wrapper: Awaited<ReturnType<typeof mountTable>>) => wrapper.findAll('.revisions > .el-table__inner-wrapper .el-table__body > tbody > tr.el-table__row')

describe('revisions table', () => {
  beforeEach(() => {
    document.body.innerHTML = ''
  })

  it('lists each revision with its date, author, engine, edition, result, sheets and size, and marks the chosen one', async () => {
    const wrapper = await mountTable()
    const rows = dataRows(wrapper)

    expect(rows.map((row) => row.findAll('td').slice(1, 9).map((td) => td.text()))).toEqual([
      ['1', expect.stringMatching(/2026/), 'Resubmittal 1', 'Ines Okafor', '0.1.0 · 2023', 'Check', '7', expect.stringMatching(/^470 KiB$/)],
      ['0', expect.stringMatching(/2026/), 'Issued for permit', 'Ines Okafor', '0.1.0 · 2023', 'Pass', '7', '470 KiB'],
    ])
    expect(rows[1]!.classes()).toContain('revisions__selected')
    expect(rows[0]!.get('button[aria-label="Preview revision 1"]').attributes('aria-pressed')).toBe('false')
  })

  it('offers the zip and, unfolded, each manifest file with a short hash whose full value is on hover', async () => {
    const wrapper = await mountTable()
    await dataRows(wrapper)[0]!.get('button[aria-label="Download KF-0107_rev01.zip"]').trigger('click')
    expect(wrapper.emitted('downloadPackage')?.[0]?.[0]).toMatchObject({ number: 1 })
    expect(wrapper.emitted('select')).toBeUndefined()

    await dataRows(wrapper)[0]!.get('.el-table__expand-icon').trigger('click')
    await flushPromises()
    const hashes = wrapper.findAll('[data-test="short-hash"]')
    expect(hashes.map((h) => h.text())).toEqual(['ab12cd34ef56…', '888888888888…'])
    expect(hashes[0]!.attributes('title')).toBe(`ab12cd34ef56${'7'.repeat(52)}`)

    await wrapper.get('button[aria-label="Download single-line.svg of revision 1"]').trigger('click')
    expect(wrapper.emitted('downloadFile')?.[0]).toEqual([expect.objectContaining({ number: 1 }), 'single-line.svg'])
  })

  it('copies the full SHA-256', async () => {
    const writeText = vi.fn(async () => undefined)
    vi.stubGlobal('navigator', { ...navigator, clipboard: { writeText } })
    const wrapper = await mountTable()
    await dataRows(wrapper)[1]!.get('.el-table__expand-icon').trigger('click')
    await flushPromises()

    await wrapper.get('button[aria-label="Copy the SHA-256 of plan-set.pdf"]').trigger('click')
    expect(writeText).toHaveBeenCalledWith(`ab12cd34ef56${'7'.repeat(52)}`)
  })

  it('shows a stamped revision’s holder, date and verification id, marks a demo stamp, and says when none is stamped', async () => {
    const stamp = { verificationId: '7K2M-9QXR-4T1H', stampedAt: '2026-12-06T11:00:00.000Z', holderName: 'Tobias Wren', licenceNumber: 'EC-204417', licenceRegion: 'Northmarch', signedPdfSha256: 'c'.repeat(64), demo: false }
    const wrapper = mount(RevisionsTable, {
      props: { revisions: [aRevision(2, { stamp: { ...stamp, verificationId: 'Q3W8-T0PA-6N2C', demo: true } }), aRevision(1, { stamp }), aRevision(0)], selected: 2 },
      attachTo: document.body,
    })
    await flushPromises()
    const stampCells = dataRows(wrapper).map((row) => row.findAll('td')[9]!)

    expect(stampCells[1]!.findAll('.el-tag').map((t) => t.text())).toEqual(['Stamped'])
    expect(stampCells[1]!.get('.revision-stamp__who').text()).toMatch(/^Tobias Wren, .*2026$/)
    expect(stampCells[1]!.get('code').text()).toBe('7K2M-9QXR-4T1H')
    expect(stampCells[0]!.findAll('.el-tag').map((t) => t.text())).toEqual(['Stamped', 'demo'])
    expect(stampCells[0]!.get('code').text()).toBe('Q3W8-T0PA-6N2C')
    expect(stampCells[2]!.text()).toBe('Not stamped')
  })
})
