import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import type { ProjectSubmissionDto, SubmissionDto } from '@shared/schemas/submission'
import { PROJECT_ID, stubBlobUrls } from '@/components/package/packageFixtures'
import { formatDate } from '@/format/dates'
import { errorResponse, jsonResponse } from '@/testing/fixtures'
import { aDueItem, aLetter, aSubmission, catchDownloads, fakeUploads, linkRouter, LETTER_FILE, pickFile, RECEIPT_FILE, typeInto } from './submissionFixtures'
import SubmissionPanel from './SubmissionPanel.vue'

const base = `/api/projects/${PROJECT_ID}/submission`

/** The project's submission routes as the server answers them; `state` is the server's, changed by the spec. */
function fakeSubmissionApi(answer: ProjectSubmissionDto) {
  const state = {
    answer,
    /** What a PATCH answers; by default the submission with the change applied, one version on. */
    patch: (body: Record<string, unknown>): Response => {
      const current = state.answer.submission!
      const { version: _version, correctionItems, feeReceiptFileId, ...rest } = body as { version: number; feeReceiptFileId?: string; correctionItems?: { letterId: string; index: number; done: boolean }[] }
      if (feeReceiptFileId) Object.assign(rest, { feeReceipt: RECEIPT_FILE })
      const letters = current.letters.map((l) => ({ ...l, items: l.items.map((item, index) => ({ ...item, done: correctionItems?.find((t) => t.letterId === l.id && t.index === index)?.done ?? item.done })) }))
      state.answer = { ...state.answer, submission: { ...current, ...rest, letters, version: current.version + 1 } }
      return jsonResponse(200, state.answer)
    },
  }
  const calls: { method: string; url: string; body: unknown }[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string, init?: RequestInit) => {
    const method = init?.method ?? 'GET'
    const body = init?.body ? JSON.parse(String(init.body)) : undefined
    calls.push({ method, url, body })
    if (url === base && method === 'PATCH') return state.patch(body)
    if (url === base) return jsonResponse(200, state.answer)
    if (url.startsWith(`${base}/files/`)) return new Response('%PDF-1.7', { status: 200, headers: { 'Content-Type': 'application/pdf' } })
    return errorResponse(404, 'not_found', 'Not found')
  }))
  return { state, calls, patches: () => calls.filter((c) => c.method === 'PATCH').map((c) => c.body) }
}

const withSubmission = (overrides: Partial<SubmissionDto> = {}, rest: Partial<ProjectSubmissionDto> = {}): ProjectSubmissionDto => ({
  submission: aSubmission(overrides), earlier: [], due: [], ...rest,
})

async function mountPanel(mayEdit: boolean) {
  const wrapper = mount(SubmissionPanel, { props: { projectId: PROJECT_ID, status: 'ahj_corrections', mayEdit }, attachTo: document.body, global: { plugins: [await linkRouter()] } })
  await flushPromises()
  return wrapper
}

/** Each row of facts as "label: value". */
const facts = (root: Element) => [...root.querySelectorAll(':scope > div')].map((row) => `${row.querySelector('dt')!.textContent!.trim()}: ${row.querySelector('dd')!.textContent!.replace(/\s+/g, ' ').trim()}`)
/** The current submission's item checkboxes (earlier submissions have their own). */
const checkboxes = (wrapper: Awaited<ReturnType<typeof mountPanel>>) => wrapper.findAll('.submission')[0]!.findAll('[data-test="letter"] input[type="checkbox"]').map((c) => c.element as HTMLInputElement)

describe('the submission panel', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
  })

  it('shows a designer the whole submission, read only: fee, letters, permit, what is due, earlier ones folded', async () => {
    fakeSubmissionApi(withSubmission(
      { permitNumber: 'EP-26-01884', permitIssuedOn: '2026-12-09', permitExpiresOn: '2027-12-09', inspectionOn: null, letters: [aLetter({ resubmittedOn: '2026-12-08' })] },
      {
        due: [aDueItem({ kind: 'fee_payment', summary: 'Pay the permit fee of 350.00', dueOn: '2026-12-02', overdue: true })],
        earlier: [aSubmission({ id: '0a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c4d', revision: { id: '1b2c3d4e-5f60-4b7c-8d9e-0f1a2b3c4d5e', number: 1 }, submittedOn: '2026-10-20', ahjReference: 'FX-BLD-26-0299' })],
      },
    ))
    const wrapper = await mountPanel(false)
    const [general, fee, permit] = [...wrapper.element.querySelectorAll('.submission')[0]!.querySelectorAll('dl')]
    expect(facts(general!)).toEqual(['Revision: 2', 'Method: Online portal', `Submitted on: ${formatDate('2026-12-01')}`, 'AHJ reference: FX-BLD-26-0417'])
    expect(facts(fee!)).toEqual(['Amount: 350.00', `Due on: ${formatDate('2026-12-15')}`, 'Paid on: —', 'Receipt: —'])
    expect(facts(permit!)).toEqual(['Permit number: EP-26-01884', `Issued on: ${formatDate('2026-12-09')}`, `Expires on: ${formatDate('2027-12-09')}`, 'Inspection on: —'])

    const letter = wrapper.get('[data-test="letter"]')
    expect(letter.text().replace(/\s+/g, ' ')).toContain(`Round 1 · received ${formatDate('2026-12-04')} · response due ${formatDate('2026-12-18')} · resubmitted ${formatDate('2026-12-08')}`)
    expect(letter.get('[data-test="letter-download"]').text()).toBe(LETTER_FILE.name)
    expect(letter.findAll('li').map((li) => li.text())).toEqual(['Show the rapid-shutdown initiator on the single-line', 'Give the conduit fill of run R3'])
    expect(checkboxes(wrapper).map((c) => [c.checked, c.disabled])).toEqual([[true, true], [false, true]])
    expect(letter.text()).toContain('1 of 2 items open')

    const due = wrapper.get('[data-test="due-item"]')
    expect(due.classes()).toContain('due-list__item--overdue')
    expect(due.text()).toContain('Fee payment · Pay the permit fee of 350.00')

    expect(wrapper.get('.el-collapse-item__header').text()).toBe(`Earlier: revision 1, submitted ${formatDate('2026-10-20')}`)
    expect(wrapper.get('.el-collapse-item').classes()).not.toContain('is-active')
    expect(wrapper.findAll('input[type="date"]')).toEqual([])
    expect(wrapper.find('input[type="file"]').exists()).toBe(false)
  })

  it('says when nothing has gone to the AHJ yet', async () => {
    fakeSubmissionApi({ submission: null, earlier: [], due: [] })
    const wrapper = await mountPanel(true)
    expect(wrapper.text()).toContain('Not submitted to the AHJ yet.')
  })

  it('lets a coordinator tick a correction item, sent at the version read', async () => {
    const api = fakeSubmissionApi(withSubmission())
    const wrapper = await mountPanel(true)
    expect(checkboxes(wrapper).map((c) => c.disabled)).toEqual([false, false])
    checkboxes(wrapper)[1]!.click()
    await flushPromises()
    expect(api.patches()).toEqual([{ version: 6, correctionItems: [{ letterId: aLetter().id, index: 1, done: true }] }])
    expect(checkboxes(wrapper).map((c) => c.checked)).toEqual([true, true])
    expect(wrapper.text()).toContain('0 of 2 items open')

    checkboxes(wrapper)[0]!.click()
    await flushPromises()
    expect(api.patches()[1]).toEqual({ version: 7, correctionItems: [{ letterId: aLetter().id, index: 0, done: false }] })
  })

  it('reloads and says so when someone changed the submission first (409)', async () => {
    const api = fakeSubmissionApi(withSubmission())
    api.state.patch = () => {
      api.state.answer = withSubmission({ version: 7, letters: [aLetter({ items: [{ text: 'Show the rapid-shutdown initiator on the single-line', done: true }, { text: 'Give the conduit fill of run R3', done: true }] })] })
      return errorResponse(409, 'version_conflict', 'Submission was changed by someone else (now version 7)')
    }
    const wrapper = await mountPanel(true)
    checkboxes(wrapper)[1]!.click()
    await flushPromises()
    expect(api.calls.filter((c) => c.method === 'GET').length).toBe(2)
    expect(wrapper.get('[data-test="submission-notice"]').text()).toContain('Someone changed this submission meanwhile; it is shown as it is now.')
    expect(checkboxes(wrapper).map((c) => c.checked)).toEqual([true, true])
  })

  it('records the fee paid date and puts the server’s refusal on the field', async () => {
    const api = fakeSubmissionApi(withSubmission())
    const wrapper = await mountPanel(true)
    typeInto(wrapper.get<HTMLInputElement>('#submission-fee-paid-on').element, '2026-12-09')
    await flushPromises()
    expect(api.patches()).toEqual([{ version: 6, feePaidOn: '2026-12-09' }])
    expect(wrapper.get<HTMLInputElement>('#submission-fee-paid-on').element.value).toBe('2026-12-09')

    api.state.patch = () => errorResponse(422, 'unprocessable', 'Some submission details do not add up', [{ field: 'feePaidOn', message: 'is after today (2026-12-10)' }])
    typeInto(wrapper.get<HTMLInputElement>('#submission-fee-paid-on').element, '2026-12-30')
    await flushPromises()
    expect(wrapper.get('#submission-fee-paid-on').element.closest('dd')!.textContent).toContain('is after today (2026-12-10)')
    expect(wrapper.get('[data-test="submission-problem"]').text()).toBe('Some submission details do not add up')
  })

  it('changes the permit expiry and the inspection date, and clears one', async () => {
    const api = fakeSubmissionApi(withSubmission({ permitNumber: 'EP-26-01884', permitIssuedOn: '2026-12-09', permitExpiresOn: '2027-12-09', inspectionOn: '2027-01-14' }))
    const wrapper = await mountPanel(true)
    typeInto(wrapper.get<HTMLInputElement>('#submission-permit-expires-on').element, '2028-06-30')
    await flushPromises()
    typeInto(wrapper.get<HTMLInputElement>('#submission-inspection-on').element, '')
    await flushPromises()
    expect(api.patches()).toEqual([{ version: 6, permitExpiresOn: '2028-06-30' }, { version: 7, inspectionOn: null }])
  })

  it('uploads the fee receipt with progress, names it on the submission and downloads it', async () => {
    const api = fakeSubmissionApi(withSubmission())
    const uploads = fakeUploads(() => ({ status: 201, body: { file: RECEIPT_FILE } }))
    const blobs = stubBlobUrls()
    const downloads = catchDownloads()
    const wrapper = await mountPanel(true)
    pickFile(wrapper.get<HTMLInputElement>('#submission-receipt').element, new File(['%PDF-1.7'], 'fee-receipt.pdf', { type: 'application/pdf' }))
    await flushPromises()
    expect(uploads.sent.map((u) => u.url)).toEqual([`${base}/receipt`])
    expect(wrapper.get('[data-test="fee"] .el-progress').attributes('aria-valuenow')).toBe('40')
    uploads.finish()
    await flushPromises()
    expect(api.patches()).toEqual([{ version: 6, feeReceiptFileId: RECEIPT_FILE.id }])

    await wrapper.get('[data-test="receipt-download"]').trigger('click')
    await flushPromises()
    expect(api.calls.at(-1)).toMatchObject({ method: 'GET', url: `${base}/files/${RECEIPT_FILE.id}` })
    expect(downloads).toEqual([RECEIPT_FILE.name])
    expect(blobs.size).toBe(0) // handed to the browser, then let go
  })

  it('downloads a correction letter for anyone who may read the project', async () => {
    const api = fakeSubmissionApi(withSubmission())
    stubBlobUrls()
    const downloads = catchDownloads()
    const wrapper = await mountPanel(false)
    await wrapper.get('[data-test="letter-download"]').trigger('click')
    await flushPromises()
    expect(api.calls.at(-1)).toMatchObject({ method: 'GET', url: `${base}/files/${LETTER_FILE.id}` })
    expect(downloads).toEqual([LETTER_FILE.name])
  })
})
