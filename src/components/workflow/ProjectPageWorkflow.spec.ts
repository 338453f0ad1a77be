import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import type { Role } from '@shared/auth/roles'
import { SAFETY_CAUTION } from '@shared/electrical/caution'
import type { ProjectStatus } from '@shared/schemas/project'
import type { TimelineEntryDto } from '@shared/schemas/workflow'
import App from '@/App.vue'
import { aProject, aRevision, PROJECT_ID } from '@/components/package/packageFixtures'
import { aStamp, aSubmission, typeInto } from '@/components/submission/submissionFixtures'
import { createAppRouter } from '@/router'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'

const REVIEW_ASKED: TimelineEntryDto = {
  id: '8c4a6f5e-3d2b-4a1f-8e0d-445566778899', event: 'request_review', from: 'draft', to: 'in_review', note: null,
  actor: { id: 'd', name: 'Ines Okafor', role: 'designer' }, revision: { id: '9d5b7a6f-4e3c-4b2a-9f1e-556677889900', number: 0 },
  createdAt: '2026-12-01T09:00:00.000Z',
}

/** The project page's API as the server answers it, with the project in review (or `status`) and its revision 0 stamped. */
function openProjectPage(role: Role, status: ProjectStatus = 'in_review', timeline: TimelineEntryDto[] = [REVIEW_ASKED]) {
  const base = `/api/projects/${PROJECT_ID}`
  const posts: unknown[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string, init?: RequestInit) => {
    if (url === '/api/auth/refresh') return jsonResponse(200, sessionOf(aMember(role)))
    if (url === base) return jsonResponse(200, { project: aProject({ status }) })
    if (url === `${base}/timeline`) return jsonResponse(200, { items: timeline })
    if (url === `${base}/revisions`) return jsonResponse(200, { items: [aRevision(0, { stamp: aStamp() })], activeJob: null })
    if (url === `${base}/submission`) return jsonResponse(200, { submission: status === 'submitted' ? aSubmission() : null, earlier: [], due: [] })
    if (url.startsWith('/api/jurisdictions')) return jsonResponse(200, { items: [], total: 0, page: 1, pageSize: 100 })
    if (url === '/api/members') return jsonResponse(200, { items: [] })
    if (url === `${base}/transitions` && init?.method === 'POST') {
      posts.push(JSON.parse(String(init.body)))
      return jsonResponse(200, {
        project: aProject({ status: 'stamped', version: 4 }),
        transition: { ...REVIEW_ASKED, id: '0e6c8b7a-5f4d-4c3b-8a2f-667788990011', event: 'approve_and_stamp', from: 'in_review', to: 'stamped', actor: { id: 'r', name: 'Tobias Wren', role: 'reviewer' }, createdAt: '2026-12-02T09:00:00.000Z' },
      })
    }
    return errorResponse(404, 'not_found', 'Not found')
  }))
  return { posts }
}

async function mountAt() {
  const router = createAppRouter(createMemoryHistory())
  await router.push(`/projects/${PROJECT_ID}`)
  mount(App, { global: { plugins: [router] }, attachTo: document.body })
  await flushPromises()
  return router
}

const card = () => document.querySelector('[aria-labelledby="workflow-title"]')!
const stepButtons = () => [...card().querySelectorAll('.workflow-actions > button')].map((b) => b.textContent?.trim())
const submissionCard = () => document.querySelector('[aria-labelledby="submission-title"]')
const entries = () => [...card().querySelectorAll('[data-test="timeline-entry"]')].map((e) => e.textContent?.replace(/\s+/g, ' ') ?? '')

describe('the workflow on the project page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined) // jsdom has no layout to scroll
    document.body.innerHTML = ''
  })

  it('offers the coordinator only withdrawal while the set is in review, with the timeline and the caution', async () => {
    openProjectPage('coordinator')
    await mountAt()
    expect(stepButtons()).toEqual(['Withdraw'])
    expect(entries()).toHaveLength(1)
    expect(entries()[0]).toContain('Ask for review · Draft → In review · revision 0')
    expect(card().textContent).toContain(SAFETY_CAUTION)
  })

  it('lets the reviewer approve; the new status and the new step appear at once', async () => {
    const api = openProjectPage('reviewer')
    await mountAt()
    expect(stepButtons()).toEqual(['Request changes', 'Approve and stamp'])
    expect(submissionCard()).toBeNull()
    card().querySelector<HTMLButtonElement>('[data-test="step-approve_and_stamp"]')!.click()
    await flushPromises()
    typeInto(document.querySelector<HTMLInputElement>('#step-certificate-password')!, 'heron-7-kestrel')
    ;[...document.querySelectorAll<HTMLButtonElement>('.el-dialog button')].find((b) => b.textContent?.trim() === 'Approve and stamp')!.click()
    await flushPromises()
    expect(api.posts).toEqual([{ action: 'approve_and_stamp', version: 3, stamp: { certificatePassword: 'heron-7-kestrel' } }])
    expect(card().querySelector('[data-test="project-status"]')?.textContent).toBe('Stamped')
    expect(entries()[0]).toContain('Approve and stamp · In review → Stamped')
    expect(entries()).toHaveLength(2)
    expect(stepButtons()).toEqual([])
    expect(submissionCard()?.textContent).toContain('Licence EC-204417 (Northmarch)')
    expect(submissionCard()?.textContent).toContain('Not submitted to the AHJ yet.')
  })

  it('links every role to the review once a revision was handed to it', async () => {
    openProjectPage('coordinator', 'changes_requested')
    const router = await mountAt()
    const push = vi.spyOn(router, 'push').mockResolvedValue(undefined)
    document.querySelector<HTMLButtonElement>('[data-test="open-review"]')!.click()
    expect(push).toHaveBeenCalledWith({ name: 'project-review', params: { projectId: PROJECT_ID } })

    document.body.innerHTML = ''
    setActivePinia(createPinia())
    openProjectPage('designer', 'draft', [])
    await mountAt()
    expect(document.querySelector('[data-test="open-review"]')).toBeNull()
  })

  it('shows the stamp and the submission from stamping on, editable by the coordinator only', async () => {
    openProjectPage('designer', 'submitted')
    await mountAt()
    expect(submissionCard()!.querySelector('[data-test="stamp-summary"]')!.textContent).toContain('7K2M-9QXR-4T1H')
    expect(submissionCard()!.querySelector('[data-test="submission-panel"]')!.textContent).toContain('FX-BLD-26-0417')
    expect(submissionCard()!.querySelectorAll('input[type="date"]')).toHaveLength(0)

    document.body.innerHTML = ''
    setActivePinia(createPinia())
    openProjectPage('coordinator', 'submitted')
    await mountAt()
    expect(submissionCard()!.querySelector('#submission-fee-paid-on')).not.toBeNull()
  })
})
