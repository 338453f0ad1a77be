import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import type { Role } from '@shared/auth/roles'
import type { ProjectStatus } from '@shared/schemas/project'
import type { TimelineEntryDto } from '@shared/schemas/workflow'
import { aProject, PROJECT_ID } from '@/components/package/packageFixtures'
import { errorResponse, jsonResponse } from '@/testing/fixtures'
import ProjectTimeline from './ProjectTimeline.vue'
import WorkflowActions from './WorkflowActions.vue'

const anEntry = (overrides: Partial<TimelineEntryDto> = {}): TimelineEntryDto => ({
  id: '5f1d3c2b-0a9e-4d8c-b7a6-112233445566', event: 'request_changes', from: 'in_review', to: 'changes_requested',
  note: 'Show the disconnect on the single-line', actor: { id: 'r', name: 'Tobias Wren', role: 'reviewer' },
  revision: { id: '6a2e4d3c-1b0f-4e9d-a8b7-223344556677', number: 2 }, createdAt: '2026-12-01T14:05:00.000Z', ...overrides,
})

/** The transitions route as the server answers it; `answer` is changed by the spec. */
function fakeWorkflowApi() {
  const state = { answer: (body: { action: string }): Response => jsonResponse(200, { project: aProject({ status: 'changes_requested', version: 4 }), transition: anEntry({ event: body.action as 'request_changes' }) }) }
  const writes: { url: string; body: unknown }[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string, init?: RequestInit) => {
    const body = JSON.parse(String(init?.body ?? '{}'))
    writes.push({ url, body })
    return state.answer(body)
  }))
  return { state, writes }
}

const buttons = () => [...document.querySelectorAll<HTMLButtonElement>('.workflow-actions > button')].map((b) => b.textContent?.trim())
const buttonNamed = (label: string) => [...document.querySelectorAll<HTMLButtonElement>('.el-dialog button')].find((b) => b.textContent?.trim() === label)!

async function mountActions(status: ProjectStatus, role: Role) {
  const wrapper = mount(WorkflowActions, { props: { project: aProject({ status }), role }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

async function takeStep(wrapper: Awaited<ReturnType<typeof mountActions>>, action: string, note: string) {
  await wrapper.get(`[data-test="step-${action}"]`).trigger('click')
  await flushPromises()
  const textarea = document.querySelector<HTMLTextAreaElement>('#step-note')!
  textarea.value = note
  textarea.dispatchEvent(new Event('input'))
  await flushPromises()
  buttonNamed(document.querySelector('.el-dialog__title')!.textContent!.trim()).click()
  await flushPromises()
}

describe('workflow actions', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
  })

  it('offers each role only the steps the state machine opens to it', async () => {
    fakeWorkflowApi()
    await mountActions('in_review', 'reviewer')
    expect(buttons()).toEqual(['Request changes', 'Approve and stamp'])
    document.body.innerHTML = ''
    await mountActions('submitted', 'coordinator')
    expect(buttons()).toEqual(['Record AHJ corrections', 'Record permit issued', 'Withdraw'])
    document.body.innerHTML = ''
    await mountActions('in_review', 'designer')
    expect(buttons()).toEqual([])
    expect(document.body.textContent).toContain('No workflow step is open to you')
  })

  it('asks for a note where the step needs one, sending nothing until it is written', async () => {
    const api = fakeWorkflowApi()
    const wrapper = await mountActions('in_review', 'reviewer')
    await takeStep(wrapper, 'request_changes', '  ')
    await vi.waitFor(() => expect(document.querySelector('.el-form-item__error')?.textContent?.trim()).toBe('this step needs a note saying why'))
    expect(api.writes).toEqual([])

    const textarea = document.querySelector<HTMLTextAreaElement>('#step-note')!
    textarea.value = ' Show the disconnect on the single-line '
    textarea.dispatchEvent(new Event('input'))
    buttonNamed('Request changes').click()
    await flushPromises()
    expect(api.writes).toEqual([{ url: `/api/projects/${PROJECT_ID}/transitions`, body: { action: 'request_changes', version: 3, note: 'Show the disconnect on the single-line' } }])
    expect(wrapper.emitted('moved')?.[0]?.[0]).toMatchObject({ project: { status: 'changes_requested' }, transition: { event: 'request_changes' } })
  })

  it('shows the licence fields a 422 names, and hands a 409 to the page', async () => {
    const api = fakeWorkflowApi()
    api.state.answer = () => errorResponse(422, 'unprocessable', 'Your licence on your profile does not allow stamping yet', [
      { field: 'licenceExpiry', message: 'the licence expired on 2026-06-30; renew it and update your profile before stamping' },
    ])
    const wrapper = await mountActions('in_review', 'reviewer')
    await takeStep(wrapper, 'approve_and_stamp', '')
    expect(document.querySelector('[data-test="step-problem"]')?.textContent).toContain('licenceExpiry: the licence expired on 2026-06-30')
    expect(wrapper.emitted('moved')).toBeUndefined()

    api.state.answer = () => errorResponse(409, 'version_conflict', 'Project was changed by someone else (now version 5)')
    buttonNamed('Approve and stamp').click()
    await flushPromises()
    expect(wrapper.emitted('refused')).toEqual([['Project was changed by someone else (now version 5)']])
  })
})

describe('project timeline', () => {
  it('shows who, from → to, the revision and the note of each step', () => {
    const wrapper = mount(ProjectTimeline, { props: { entries: [anEntry(), anEntry({ id: '7b3f5e4d-2c1a-4f0e-b9c8-334455667788', event: 'request_review', from: 'draft', to: 'in_review', note: null, actor: null })] } })
    const items = wrapper.findAll('[data-test="timeline-entry"]').map((i) => i.text().replace(/\s+/g, ' '))
    expect(items[0]).toContain('Request changes · In review → Changes requested · revision 2')
    expect(items[0]).toContain('Tobias Wren, Reviewing electrician')
    expect(items[0]).toContain('Show the disconnect on the single-line')
    expect(items[1]).toContain('Ask for review · Draft → In review')
    expect(items[1]).toContain('Former member')
  })
  it('says so when there are no steps yet', () => {
    expect(mount(ProjectTimeline, { props: { entries: [] } }).text()).toContain('No workflow steps yet')
  })
})
