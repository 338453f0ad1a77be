import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import type { RevisionDto } from '@shared/schemas/revision'
import { aRevision, PROJECT_ID } from '@/components/package/packageFixtures'
import { formatDate } from '@/format/dates'
import { jsonResponse } from '@/testing/fixtures'
import { aStamp, linkRouter } from './submissionFixtures'
import StampSummary from './StampSummary.vue'

function fakeRevisions(items: RevisionDto[]) {
  const calls: string[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string) => {
    calls.push(url)
    return jsonResponse(200, { items, activeJob: null })
  }))
  return calls
}

async function mountSummary() {
  const wrapper = mount(StampSummary, { props: { projectId: PROJECT_ID, status: 'stamped' }, global: { plugins: [await linkRouter()] } })
  await flushPromises()
  return wrapper
}

describe('the stamp on the project page', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('shows the newest stamped revision: holder, licence, date and the id to verify it by', async () => {
    const calls = fakeRevisions([aRevision(3), aRevision(2, { stamp: aStamp() }), aRevision(1, { stamp: aStamp({ verificationId: '0000-0000-0001' }) })])
    const wrapper = await mountSummary()
    expect(calls).toEqual([`/api/projects/${PROJECT_ID}/revisions`])
    const text = wrapper.text().replace(/\s+/g, ' ')
    expect(text).toContain('Revision 2: Resubmittal 2')
    expect(wrapper.get('[data-test="revision-stamp"]').text()).toContain(`Tobias Wren, ${formatDate('2026-11-28T15:30:00.000Z')}`)
    expect(wrapper.get('[data-test="revision-stamp"]').text()).toContain('7K2M-9QXR-4T1H')
    expect(wrapper.get('[data-test="revision-stamp"]').text()).not.toContain('demo')
    expect(text).toContain('Licence EC-204417 (Northmarch) · Verify this stamp')
    expect(wrapper.get('a').attributes('href')).toBe('/verify/7K2M-9QXR-4T1H')
  })

  it('marks a stamp made with the demo certificate', async () => {
    fakeRevisions([aRevision(0, { stamp: aStamp({ demo: true }) })])
    const wrapper = await mountSummary()
    expect(wrapper.get('[data-test="revision-stamp"]').text()).toContain('demo')
  })

  it('says so when no revision carries a stamp', async () => {
    fakeRevisions([aRevision(0)])
    expect((await mountSummary()).text()).toContain('No revision of this project carries a stamp.')
  })
})
