import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import type { Role } from '@shared/auth/roles'
import { SAFETY_CAUTION } from '@shared/electrical/caution'
import App from '@/App.vue'
import { aProject, aRevision, PROJECT_ID, stubBlobUrls } from '@/components/package/packageFixtures'
import { aComment, fakeReviewApi } from '@/components/review/reviewFixtures'
import WorkflowActions from '@/components/workflow/WorkflowActions.vue'
import { createAppRouter } from '@/router'
import { errorResponse, jsonResponse } from '@/testing/fixtures'

type Api = ReturnType<typeof fakeReviewApi>

async function openReview(role: Role, prepare: (api: Api) => void = () => undefined) {
  const api = fakeReviewApi(role)
  prepare(api)
  const router = createAppRouter(createMemoryHistory())
  await router.push(`/projects/${PROJECT_ID}/review`)
  const wrapper = mount(App, { global: { plugins: [router] }, attachTo: document.body })
  await flushPromises()
  return { api, wrapper }
}

type Wrapper = Awaited<ReturnType<typeof openReview>>['wrapper']
const text = (wrapper: Wrapper, selector: string) => wrapper.get(selector).text().replace(/\s+/g, ' ').trim()
const buttonNamed = (wrapper: Wrapper, label: string) => wrapper.findAll('button').find((b) => b.text() === label || b.attributes('aria-label') === label)
const commentBadges = (wrapper: Wrapper) => wrapper.findAll('[data-test="comment-anchor"]').map((b) => b.text())

async function typeInto(wrapper: Wrapper, selector: string, value: string) {
  await wrapper.get(selector).setValue(value)
  await flushPromises()
}

describe('project review page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined)
    stubBlobUrls()
    document.body.innerHTML = ''
  })

  it('shows the revision handed to review with its status, steps, caution and calculations', async () => {
    const { api, wrapper } = await openReview('reviewer', ({ state }) => {
      state.comments = [aComment(), aComment({ id: '9d1e2f3a-4b5c-4d6e-8f70-000000000002', resolved: { at: '2026-12-04T10:00:00.000Z', by: null } })]
    })

    expect(wrapper.get('h1').text()).toBe('Review of KF-0107 · Heronsgate barn roof')
    expect(text(wrapper, '[data-test="review-status"]')).toBe('In review')
    // the latest "ask for review" named revision 1, though revision 2 is newer
    expect(text(wrapper, '[data-test="review-revision"]')).toBe('Revision 1')
    expect(wrapper.text()).toContain('by Ines Okafor, PV designer')
    expect(text(wrapper, '[data-test="open-comments"]')).toBe('1 open comment')
    expect(wrapper.text()).toContain('1 comment is open: approval and stamping wait until every comment is resolved.')
    expect(wrapper.text()).toContain(SAFETY_CAUTION)
    expect(wrapper.findAll('.workflow-actions > button').map((b) => b.text())).toEqual(['Request changes', 'Approve and stamp'])
    expect(api.fileCalls()).toEqual(['1/files/calculations.json', '1/files/design.json'])

    const sections = wrapper.findAll('[data-test="calc-section"]')
    expect(sections.map((s) => [s.get('.calculations__section-title').text(), s.get('.el-collapse-item__header .el-tag').text()])).toEqual([
      ['String S1', 'Pass'],
      ['Run R3 (INV1 → MSP)', 'Check'],
    ])
    await sections[1]!.get('.el-collapse-item__header').trigger('click')
    const step = sections[1]!.get('[data-key="run.R3.voltageDrop"]').text()
    expect(step).toContain('2.37 %')
    expect(step).toContain('2 × 92 ft × 24 A × 1.24 Ω/kft ÷ 240 V')
    expect(step).toContain('NEC 2023 210.19(A) Informational Note')
    expect(step).toContain('above the 2 % the design aims for')

    const rows = wrapper.findAll('.calculations__runs .el-table__body tr.el-table__row').map((row) => row.findAll('td').slice(0, 7).map((td) => td.text()))
    expect(rows).toEqual([
      ['R1', 'S1 → INV1', '10 AWG Cu', '34.8 A', '—', '0.52 %', 'Pass'],
      ['R3', 'INV1 → MSP', '8 AWG Cu', '50 A', '30 A', '2.37 %', 'Check'],
    ])
  })

  it('lets the reviewer pin a comment to a run from its row, and counts it as open', async () => {
    const { api, wrapper } = await openReview('reviewer', ({ state }) => {
      state.writes['review-comments'] = (body) => jsonResponse(201, { comment: aComment({ id: '9d1e2f3a-4b5c-4d6e-8f70-000000000009', ...(body as object), createdAt: '2026-12-05T08:00:00.000Z' }) })
    })
    expect(text(wrapper, '[data-test="open-comments"]')).toBe('0 open comments')

    await buttonNamed(wrapper, 'Comment on run R3')!.trigger('click')
    await flushPromises()
    expect(wrapper.get('#comment-circuit').element.closest('.el-select')!.textContent).toContain('R3')
    await typeInto(wrapper, '#comment-body', ' Upsize R3 to 6 AWG or shorten the run. ')
    await buttonNamed(wrapper, 'Add comment')!.trigger('click')
    await flushPromises()

    expect(api.writes()).toEqual([{ method: 'POST', url: `/api/projects/${PROJECT_ID}/review-comments`, body: { anchor: { kind: 'circuit', circuitId: 'R3' }, body: 'Upsize R3 to 6 AWG or shorten the run.' } }])
    expect(commentBadges(wrapper)).toEqual(['Circuit R3'])
    expect(text(wrapper, '[data-test="open-comments"]')).toBe('1 open comment')
    expect((wrapper.get('#comment-body').element as HTMLTextAreaElement).value).toBe('')
  })

  it('checks a comment as it is typed and puts the API’s refusal on the form', async () => {
    const { api, wrapper } = await openReview('reviewer', ({ state }) => {
      state.writes['review-comments'] = () => errorResponse(422, 'unprocessable', 'Revision 1 has no run or string S9', [{ field: 'anchor.circuitId', message: 'must be one of R1, R3, S1, S2' }])
    })

    await wrapper.get('[data-test="anchor-sheet"] input').setValue(true)
    await flushPromises()
    await typeInto(wrapper, '#comment-sheet', 'E601')
    await buttonNamed(wrapper, 'Add comment')!.trigger('click')
    await flushPromises()
    const errors = () => wrapper.findAll('.composer .el-form-item__error').map((e) => e.text())
    await vi.waitFor(() => expect(errors()).toEqual(['must be a sheet id such as E-601, E-602.2 or ATT-A', 'must not be empty']))
    expect(api.writes()).toEqual([])

    await wrapper.get('[data-test="anchor-circuit"] input').setValue(true)
    await flushPromises()
    await wrapper.get('.composer .el-select__wrapper').trigger('click')
    await flushPromises()
    const options = () => [...document.querySelectorAll<HTMLElement>('.el-select-dropdown__item')]
    expect(options().map((o) => o.textContent?.trim())).toEqual(['R1', 'R3', 'S1', 'S2'])
    options().find((o) => o.textContent?.trim() === 'S2')!.click()
    await typeInto(wrapper, '#comment-body', 'String S2 needs its own source-circuit label.')
    await buttonNamed(wrapper, 'Add comment')!.trigger('click')
    await flushPromises()

    expect(api.writes().map((w) => w.body)).toEqual([{ anchor: { kind: 'circuit', circuitId: 'S2' }, body: 'String S2 needs its own source-circuit label.' }])
    await vi.waitFor(() => expect(errors()).toEqual(['must be one of R1, R3, S1, S2']))
    expect(text(wrapper, '[data-test="composer-problem"]')).toBe('Revision 1 has no run or string S9')
  })

  it('lets the designer reply and resolve while changes are requested, and moves the resolved comment last', async () => {
    const second = aComment({ id: '9d1e2f3a-4b5c-4d6e-8f70-000000000002', anchor: { kind: 'general' }, body: 'Add the utility meter number.', createdAt: '2026-12-03T14:00:00.000Z' })
    const { api, wrapper } = await openReview('designer', ({ state }) => {
      state.project = aProject({ status: 'changes_requested' })
      state.comments = [aComment(), second]
      state.writes.replies = (body) => jsonResponse(201, { comment: aComment({ replies: [{ id: '1c2d3e4f-5a6b-4c7d-8e9f-000000000001', body: (body as { body: string }).body, author: { id: 'd', name: 'Ines Okafor', role: 'designer' }, createdAt: '2026-12-04T09:00:00.000Z' }] }) })
      state.writes.resolve = () => jsonResponse(200, { comment: aComment({ resolved: { at: '2026-12-04T09:05:00.000Z', by: { id: 'd', name: 'Ines Okafor', role: 'designer' } } }) })
    })
    expect(wrapper.find('.composer').exists()).toBe(false)
    expect(commentBadges(wrapper)).toEqual(['Sheet E-601', 'General'])

    const first = () => wrapper.findAll('[data-test="comment"]').find((c) => c.text().includes('Label the rapid-shutdown'))!
    await first().get('textarea').setValue('Added the label callout on E-601.')
    await first().get('form').trigger('submit')
    await flushPromises()
    const replies = first().findAll('[data-test="comment-reply"]')
    expect(replies).toHaveLength(1)
    expect(replies[0]!.get('.thread__who').text()).toBe('Ines Okafor, PV designer')
    expect(replies[0]!.get('time').attributes('datetime')).toBe('2026-12-04T09:00:00.000Z')
    expect(replies[0]!.get('.thread__body').text()).toBe('Added the label callout on E-601.')

    await first().findAll('button').find((b) => b.text() === 'Resolve')!.trigger('click')
    await flushPromises()
    expect(api.writes()).toEqual([
      { method: 'POST', url: `/api/projects/${PROJECT_ID}/review-comments/${aComment().id}/replies`, body: { body: 'Added the label callout on E-601.' } },
      { method: 'POST', url: `/api/projects/${PROJECT_ID}/review-comments/${aComment().id}/resolve`, body: undefined },
    ])
    expect(commentBadges(wrapper)).toEqual(['General', 'Sheet E-601'])
    expect(text(wrapper, '[data-test="comment-resolved"]')).toMatch(/^Resolved by Ines Okafor, PV designer, /)
    expect(text(wrapper, '[data-test="open-comments"]')).toBe('1 open comment')
    expect(first().findAll('button').map((b) => b.text())).toEqual(['Reply'])
  })

  it('offers the reviewer to reopen a resolved comment, and shows a refusal on the thread', async () => {
    const { wrapper } = await openReview('reviewer', ({ state }) => {
      state.comments = [aComment({ resolved: { at: '2026-12-04T10:00:00.000Z', by: { id: 'd', name: 'Ines Okafor', role: 'designer' } } })]
      state.writes.reopen = () => errorResponse(409, 'conflict', 'Someone changed this comment meanwhile; reload it')
    })
    await buttonNamed(wrapper, 'Reopen')!.trigger('click')
    await flushPromises()
    expect(text(wrapper, '[data-test="thread-problem"]')).toBe('Someone changed this comment meanwhile; reload it')
  })

  it('gives a coordinator the threads to read only', async () => {
    const { wrapper } = await openReview('coordinator', ({ state }) => {
      state.comments = [aComment()]
    })
    expect(commentBadges(wrapper)).toEqual(['Sheet E-601'])
    expect(wrapper.find('[data-test="comment"] textarea').exists()).toBe(false)
    expect(wrapper.find('.composer').exists()).toBe(false)
    expect(buttonNamed(wrapper, 'Comment on run R3')).toBeUndefined()
  })

  it('shows the newest revision before any review was asked for, and its drawings when their tab opens', async () => {
    const { api, wrapper } = await openReview('designer', ({ state }) => {
      state.project = aProject({ status: 'draft' })
      state.timeline = []
    })
    expect(text(wrapper, '[data-test="review-revision"]')).toBe('Revision 2')
    expect(wrapper.text()).toContain('not handed to review yet')
    expect(api.fileCalls()).toEqual(['2/files/calculations.json', '2/files/design.json'])

    await wrapper.findAll('.el-tabs__item').find((t) => t.text() === 'Drawings')!.trigger('click')
    await flushPromises()
    expect(api.fileCalls().at(-1)).toBe('2/files/single-line.svg')
    expect(wrapper.get('img.preview__diagram').attributes('alt')).toBe('Single-line diagram of revision 2')
  })

  it('shows a revision’s stamp, and reloads after a step moved the project or was refused', async () => {
    const stamp = { verificationId: '7K2M-9QXR-4T1H', stampedAt: '2026-12-06T11:00:00.000Z', holderName: 'Tobias Wren', licenceNumber: 'EC-204417', licenceRegion: 'Northmarch', signedPdfSha256: 'a'.repeat(64), demo: false }
    const { api, wrapper } = await openReview('reviewer')
    const projectReads = () => api.calls.filter((c) => c.url === `/api/projects/${PROJECT_ID}`).length
    expect(projectReads()).toBe(1)

    api.state.project = aProject({ status: 'stamped' })
    api.state.revisions = [aRevision(2), aRevision(1, { stamp }), aRevision(0)]
    wrapper.findComponent(WorkflowActions).vm.$emit('moved', { project: api.state.project, transition: api.state.timeline[0] })
    await flushPromises()
    expect(projectReads()).toBe(2)
    expect(text(wrapper, '[data-test="review-status"]')).toBe('Stamped')
    const shownStamp = wrapper.get('[data-test="revision-stamp"]')
    expect(shownStamp.findAll('.el-tag').map((t) => t.text())).toEqual(['Stamped'])
    expect(shownStamp.get('.revision-stamp__who').text()).toMatch(/^Tobias Wren, .*2026$/)
    expect(shownStamp.get('code').text()).toBe('7K2M-9QXR-4T1H')
    expect(document.querySelector('.el-message')?.textContent).toContain('Now Stamped.')
    // the same revision: its calculations are not fetched again
    expect(api.fileCalls().filter((f) => f.endsWith('calculations.json'))).toHaveLength(1)

    wrapper.findComponent(WorkflowActions).vm.$emit('refused', '1 review comment is still open; resolve it or request changes')
    await flushPromises()
    expect(projectReads()).toBe(3)
    expect(document.body.textContent).toContain('1 review comment is still open; resolve it or request changes. The project is shown as it is now.')
  })
})
