import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import type { Role } from '@shared/auth/roles'
import type { ProjectStatus } from '@shared/schemas/project'
import type { TimelineEntryDto } from '@shared/schemas/workflow'
import { aProject, PROJECT_ID } from '@/components/package/packageFixtures'
import { aMember, errorResponse, jsonResponse } from '@/testing/fixtures'
import { fakeUploads, LETTER_FILE, linkRouter, pickFile, typeInto } from '@/components/submission/submissionFixtures'
import { useAuthStore } from '@/stores/auth'
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

/** The dialog links to other pages (the profile, the review): it needs the app's routes. */
const withRouter = async () => ({ global: { plugins: [await linkRouter()] } })

async function mountActions(status: ProjectStatus, role: Role) {
  const wrapper = mount(WorkflowActions, { props: { project: aProject({ status }), role }, attachTo: document.body, ...(await withRouter()) })
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

  it('shows another reviewer who judges the project instead of the review steps', async () => {
    fakeWorkflowApi()
    useAuthStore().user = aMember('reviewer', { id: 'me' })
    mount(WorkflowActions, { props: { project: aProject({ status: 'in_review', reviewer: { id: 'someone-else', name: 'Tobias Wren' } }), role: 'reviewer' }, attachTo: document.body, ...(await withRouter()) })
    await flushPromises()
    expect(buttons()).toEqual([])
    expect(document.body.textContent).toContain('Tobias Wren is the reviewing electrician of this project')
    document.body.innerHTML = ''
    mount(WorkflowActions, { props: { project: aProject({ status: 'in_review', reviewer: { id: 'me', name: 'Me' } }), role: 'reviewer' }, attachTo: document.body, ...(await withRouter()) })
    await flushPromises()
    expect(buttons()).toEqual(['Request changes', 'Approve and stamp'])
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

  it('hands a stale version (409) to the page', async () => {
    const api = fakeWorkflowApi()
    api.state.answer = () => errorResponse(409, 'version_conflict', 'Project was changed by someone else (now version 5)')
    const wrapper = await mountActions('submitted', 'coordinator')
    await takeStep(wrapper, 'withdraw', 'The owner sold the barn')
    expect(wrapper.emitted('refused')).toEqual([['Project was changed by someone else (now version 5)']])
    expect(wrapper.emitted('moved')).toBeUndefined()
  })
})

const field = <T extends HTMLInputElement | HTMLTextAreaElement = HTMLInputElement>(id: string) => document.querySelector<T>(`#${id}`)!
/** The message Element Plus shows under the form item of the field with this id. */
const errorOf = (id: string) => field(id).closest('.el-form-item')?.querySelector('.el-form-item__error')?.textContent?.trim()
/** Element Plus shows a form item's message a moment after it is set. */
const expectFieldError = (id: string, message: string) => vi.waitFor(() => expect(errorOf(id)).toBe(message))
const problemText = () => document.querySelector('[data-test="step-problem"]')?.textContent?.replace(/\s+/g, ' ').trim()

async function openStep(wrapper: Awaited<ReturnType<typeof mountActions>>, action: string) {
  await wrapper.get(`[data-test="step-${action}"]`).trigger('click')
  await flushPromises()
}
async function confirm(label: string) {
  buttonNamed(label).click()
  await flushPromises()
}

describe('approving and stamping', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
  })

  it('asks for the certificate password, says what signing does, and sends it only in the step', async () => {
    const api = fakeWorkflowApi()
    const wrapper = await mountActions('in_review', 'reviewer')
    await openStep(wrapper, 'approve_and_stamp')
    expect(document.querySelector('.el-dialog')!.textContent).toContain('signs the plan-set PDF with your signing certificate and puts your stamp on every sheet')
    expect(field('step-certificate-password').type).toBe('password')

    await confirm('Approve and stamp')
    await expectFieldError('step-certificate-password', 'is required to sign the plan set')
    expect(api.writes).toEqual([])

    typeInto(field('step-certificate-password'), 'heron-7-kestrel')
    await confirm('Approve and stamp')
    expect(api.writes).toEqual([{ url: `/api/projects/${PROJECT_ID}/transitions`, body: { action: 'approve_and_stamp', version: 3, stamp: { certificatePassword: 'heron-7-kestrel' } } }])
    expect(wrapper.emitted('moved')).toHaveLength(1)
  })

  it('puts a wrong password on the field and names what the profile lacks, with the way to it', async () => {
    const api = fakeWorkflowApi()
    api.state.answer = () => errorResponse(422, 'unprocessable', 'The password does not open your signing certificate', [
      { field: 'stamp.certificatePassword', message: 'does not open the signing certificate' },
    ])
    const wrapper = await mountActions('in_review', 'reviewer')
    await openStep(wrapper, 'approve_and_stamp')
    typeInto(field('step-certificate-password'), 'wrong')
    await confirm('Approve and stamp')
    await expectFieldError('step-certificate-password', 'does not open the signing certificate')

    api.state.answer = () => errorResponse(422, 'unprocessable', 'Your profile lacks what a stamp needs', [
      { field: 'stampImage', message: 'is missing from your profile; upload the PNG image of your stamp' },
      { field: 'licenceExpiry', message: 'the licence expired on 2026-06-30; renew it and update your profile before stamping' },
    ])
    await confirm('Approve and stamp')
    expect(problemText()).toContain('Your profile lacks what a stamp needs')
    expect(problemText()).toContain('Stamp image: is missing from your profile')
    expect(problemText()).toContain('Licence expiry: the licence expired on 2026-06-30')
    expect(document.querySelector('[data-test="step-problem"] a')?.getAttribute('href')).toBe('/profile')
    expect(wrapper.emitted('moved')).toBeUndefined()
    expect(wrapper.emitted('refused')).toBeUndefined()
  })

  it('keeps the dialog open while review comments are open, linking to them', async () => {
    const api = fakeWorkflowApi()
    api.state.answer = () => errorResponse(409, 'conflict', '2 review comments are still open; resolve them or request changes', [{ field: 'comments', message: '2 open' }])
    const wrapper = await mountActions('in_review', 'reviewer')
    await openStep(wrapper, 'approve_and_stamp')
    typeInto(field('step-certificate-password'), 'heron-7-kestrel')
    await confirm('Approve and stamp')
    const notice = document.querySelector('[data-test="step-open-comments"]')!
    expect(notice.textContent).toContain('2 review comments are still open')
    expect(notice.querySelector('a')?.getAttribute('href')).toBe(`/projects/${PROJECT_ID}/review`)
    expect(wrapper.emitted('refused')).toBeUndefined()
  })
})

describe('the paperwork steps', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
    // "today" is fixed so the default and future dates are known
    vi.useFakeTimers({ toFake: ['Date'], now: new Date(2026, 11, 10, 12) })
  })
  afterEach(() => vi.useRealTimers())

  it('records the submission: method, dates, reference and fee, checked as typed', async () => {
    const api = fakeWorkflowApi()
    const wrapper = await mountActions('stamped', 'coordinator')
    await openStep(wrapper, 'record_submission')
    expect(field('step-submitted-on').value).toBe('2026-12-10')
    expect([...document.querySelectorAll('.el-dialog .el-radio')].map((r) => r.textContent?.trim())).toEqual(['Online portal', 'E-mail', 'At the counter'])

    typeInto(field('step-submitted-on'), '2026-12-11')
    typeInto(field('step-fee-amount'), '$350')
    await flushPromises()
    await expectFieldError('step-submitted-on', 'must not be after today')
    await vi.waitFor(() => expect(errorOf('step-fee-amount')).toContain('no currency sign'))
    await confirm('Record submission to the AHJ')
    await expectFieldError('step-submitted-on', 'must not be after today')
    expect(api.writes).toEqual([])

    document.querySelector<HTMLInputElement>('.el-dialog .el-radio input[value="counter"]')!.click()
    typeInto(field('step-submitted-on'), '2026-12-09')
    typeInto(field('step-ahj-reference'), ' FX-BLD-26-0417 ')
    typeInto(field('step-fee-amount'), '350.00')
    typeInto(field('step-fee-due-on'), '2026-12-23')
    await confirm('Record submission to the AHJ')
    expect(api.writes).toEqual([{
      url: `/api/projects/${PROJECT_ID}/transitions`,
      body: { action: 'record_submission', version: 3, submission: { method: 'counter', submittedOn: '2026-12-09', ahjReference: 'FX-BLD-26-0417', feeAmount: '350.00', feeDueOn: '2026-12-23' } },
    }])
  })

  it('leaves empty optional details out and puts the server’s field messages on their fields', async () => {
    const api = fakeWorkflowApi()
    api.state.answer = () => errorResponse(422, 'unprocessable', 'The submission details are incomplete or wrong', [{ field: 'submission.ahjReference', message: 'is already used by project KF-0093' }])
    const wrapper = await mountActions('stamped', 'admin')
    await openStep(wrapper, 'record_submission')
    document.querySelector<HTMLInputElement>('.el-dialog .el-radio input[value="portal"]')!.click()
    typeInto(field('step-ahj-reference'), 'FX-BLD-26-0417')
    await confirm('Record submission to the AHJ')
    expect(api.writes[0]!.body).toEqual({ action: 'record_submission', version: 3, submission: { method: 'portal', submittedOn: '2026-12-10', ahjReference: 'FX-BLD-26-0417' } })
    await expectFieldError('step-ahj-reference', 'is already used by project KF-0093')
    expect(problemText()).toBe('The submission details are incomplete or wrong')
  })

  it('records corrections: the letter uploaded first with progress, its dates and items, and the note', async () => {
    const api = fakeWorkflowApi()
    const uploads = fakeUploads(() => ({ status: 201, body: { file: LETTER_FILE } }))
    const wrapper = await mountActions('submitted', 'coordinator')
    await openStep(wrapper, 'record_corrections')
    await confirm('Record AHJ corrections')
    await expectFieldError('step-letter', 'must be the id of an uploaded correction letter')
    await expectFieldError('step-items', 'must list at least one item of the letter')
    await expectFieldError('step-note', 'this step needs a note saying why')

    pickFile(field('step-letter'), new File(['%PDF-1.7'], 'fenwick-corrections-1.pdf', { type: 'application/pdf' }))
    await flushPromises()
    expect(uploads.sent.map((u) => [u.url, u.file.name])).toEqual([[`/api/projects/${PROJECT_ID}/submission/letters`, 'fenwick-corrections-1.pdf']])
    expect(document.querySelector('.el-dialog .el-progress')?.getAttribute('aria-valuenow')).toBe('40')
    uploads.finish()
    await flushPromises()
    expect(document.querySelector('.el-dialog .el-progress')).toBeNull()
    expect(document.querySelector('[data-test="uploaded-file"]')?.textContent).toContain('fenwick-corrections-1.pdf (86 KiB)')
    expect(errorOf('step-letter')).toBeFalsy()

    typeInto(field('step-received-on'), '2026-12-08')
    typeInto(field('step-response-due-on'), '2026-12-05')
    await flushPromises()
    await expectFieldError('step-response-due-on', 'must not be before the letter was received')
    typeInto(field('step-response-due-on'), '2026-12-22')
    typeInto(field<HTMLTextAreaElement>('step-items'), 'Show the rapid-shutdown initiator on the single-line\n\n  Give the conduit fill of run R3 \n')
    typeInto(field<HTMLTextAreaElement>('step-note'), 'First plan check: two items')
    await confirm('Record AHJ corrections')
    expect(api.writes).toEqual([{
      url: `/api/projects/${PROJECT_ID}/transitions`,
      body: {
        action: 'record_corrections', version: 3, note: 'First plan check: two items',
        submission: { letterFileId: LETTER_FILE.id, receivedOn: '2026-12-08', responseDueOn: '2026-12-22', items: ['Show the rapid-shutdown initiator on the single-line', 'Give the conduit fill of run R3'] },
      },
    }])
  })

  it('says why a letter upload was refused', async () => {
    fakeWorkflowApi()
    const uploads = fakeUploads(() => ({ status: 415, body: { error: { code: 'unsupported_media_type', message: 'A correction letter must be a PDF' } } }))
    const wrapper = await mountActions('resubmitted', 'coordinator')
    await openStep(wrapper, 'record_corrections')
    pickFile(field('step-letter'), new File(['PK'], 'letter.zip', { type: 'application/zip' }))
    uploads.finish()
    await flushPromises()
    expect(document.querySelector('.el-dialog .el-alert')?.textContent).toContain('A correction letter must be a PDF')
    expect(document.querySelector('[data-test="uploaded-file"]')).toBeNull()
  })

  it('records the resubmittal on the day it went back', async () => {
    const api = fakeWorkflowApi()
    const wrapper = await mountActions('ahj_corrections', 'coordinator')
    await openStep(wrapper, 'record_resubmittal')
    expect(field('step-resubmitted-on').value).toBe('2026-12-10')
    typeInto(field('step-resubmitted-on'), '2026-12-09')
    await confirm('Record resubmittal')
    expect(api.writes.map((w) => w.body)).toEqual([{ action: 'record_resubmittal', version: 3, submission: { resubmittedOn: '2026-12-09' } }])
  })

  it('records the permit with its number, dates and inspection', async () => {
    const api = fakeWorkflowApi()
    const wrapper = await mountActions('resubmitted', 'coordinator')
    await openStep(wrapper, 'record_permit')
    await confirm('Record permit issued')
    await expectFieldError('step-permit-number', 'must not be empty')
    typeInto(field('step-permit-number'), 'EP-26-01884')
    typeInto(field('step-issued-on'), '2026-12-09')
    typeInto(field('step-expires-on'), '2026-12-09')
    await flushPromises()
    await expectFieldError('step-expires-on', 'must be after the permit was issued')
    typeInto(field('step-expires-on'), '2027-12-09')
    typeInto(field('step-inspection-on'), '2027-01-14')
    await confirm('Record permit issued')
    expect(api.writes.map((w) => w.body)).toEqual([{
      action: 'record_permit', version: 3,
      submission: { permitNumber: 'EP-26-01884', issuedOn: '2026-12-09', expiresOn: '2027-12-09', inspectionOn: '2027-01-14' },
    }])
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
