import { vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import type { RevisionStampDto } from '@shared/schemas/stamp'
import type { BoardRowDto, CorrectionLetterDto, DueItemDto, SubmissionDto, SubmissionFileDto } from '@shared/schemas/submission'
import { PROJECT_ID } from '@/components/package/packageFixtures'
import { routes } from '@/router/routes'

/** Specs only: the invented project's submission to its invented AHJ. */

export const LETTER_FILE: SubmissionFileDto = { id: '1d2e3f40-5a6b-4c7d-8e9f-0a1b2c3d4e5f', name: 'fenwick-corrections-1.pdf', mediaType: 'application/pdf', byteSize: 88_064 }
export const RECEIPT_FILE: SubmissionFileDto = { id: '2e3f4051-6b7c-4d8e-9fa0-1b2c3d4e5f60', name: 'fee-receipt.pdf', mediaType: 'application/pdf', byteSize: 20_480 }

export const aLetter = (overrides: Partial<CorrectionLetterDto> = {}): CorrectionLetterDto => ({
  id: '3f405162-7c8d-4e9f-a0b1-2c3d4e5f6071', round: 1, receivedOn: '2026-12-04', responseDueOn: '2026-12-18', letter: LETTER_FILE,
  items: [
    { text: 'Show the rapid-shutdown initiator on the single-line', done: true },
    { text: 'Give the conduit fill of run R3', done: false },
  ],
  resubmittedOn: null,
  ...overrides,
})

export const aSubmission = (overrides: Partial<SubmissionDto> = {}): SubmissionDto => ({
  id: '40516273-8d9e-4fa0-b1c2-3d4e5f607182', projectId: PROJECT_ID, revision: { id: '51627384-9eaf-4b01-82d3-4e5f60718293', number: 2 },
  method: 'portal', submittedOn: '2026-12-01', ahjReference: 'FX-BLD-26-0417', feeCents: 35_000, feeAmount: '350.00', feeDueOn: '2026-12-15',
  feePaidOn: null, feeReceipt: null, letters: [aLetter()], permitNumber: null, permitIssuedOn: null, permitExpiresOn: null, inspectionOn: null,
  createdAt: '2026-12-01T10:00:00.000Z', updatedAt: '2026-12-04T10:00:00.000Z', version: 6,
  ...overrides,
})

export const aDueItem = (overrides: Partial<DueItemDto> = {}): DueItemDto => ({
  projectId: PROJECT_ID, projectCode: 'KF-0107', projectName: 'Heronsgate barn roof', jurisdiction: 'Fenwick Cross Building Office',
  kind: 'corrections_response', summary: 'Answer the AHJ’s corrections (1 open item) and resubmit', dueOn: '2026-12-18', overdue: false,
  ...overrides,
})

export const aBoardRow = (overrides: { project?: Partial<BoardRowDto['project']> } & Partial<Omit<BoardRowDto, 'project'>> = {}): BoardRowDto => {
  const { project, ...rest } = overrides
  return {
    project: { id: PROJECT_ID, code: 'KF-0107', name: 'Heronsgate barn roof', status: 'ahj_corrections', jurisdiction: { id: '62738495-af01-4c12-93e4-5f6071829304', name: 'Fenwick Cross Building Office' }, ...project },
    submission: { method: 'portal', submittedOn: '2026-12-01', ahjReference: 'FX-BLD-26-0417', permitNumber: null, openCorrectionItems: 1 },
    nextDueOn: '2026-12-18',
    overdue: false,
    ...rest,
  }
}

export const aStamp = (overrides: Partial<RevisionStampDto> = {}): RevisionStampDto => ({
  verificationId: '7K2M-9QXR-4T1H', stampedAt: '2026-11-28T15:30:00.000Z', holderName: 'Tobias Wren', licenceNumber: 'EC-204417',
  licenceRegion: 'Northmarch', signedPdfSha256: 'c'.repeat(64), demo: false, ...overrides,
})

/**
 * Uploads go through XMLHttpRequest (for progress), which jsdom would send nowhere: each upload
 * reports 40 % and then waits for `finish()`, answering what `answer` gives for its URL.
 */
export function fakeUploads(answer: (url: string) => { status: number; body: unknown }) {
  const sent: { url: string; file: File }[] = []
  const waiting: (() => void)[] = []
  class FakeXhr {
    upload: { onprogress: ((event: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null }
    onload: (() => void) | null = null
    onerror: (() => void) | null = null
    withCredentials = false
    status = 0
    statusText = ''
    responseText = ''
    private url = ''
    open(_method: string, url: string) {
      this.url = url
    }
    setRequestHeader() {}
    send(form: FormData) {
      sent.push({ url: this.url, file: form.get('file') as File })
      this.upload.onprogress?.({ lengthComputable: true, loaded: 40, total: 100 })
      waiting.push(() => {
        const { status, body } = answer(this.url)
        this.status = status
        this.responseText = JSON.stringify(body)
        this.onload?.()
      })
    }
  }
  vi.stubGlobal('XMLHttpRequest', FakeXhr)
  return {
    sent,
    finish: () => waiting.splice(0).forEach((done) => done()),
  }
}

/** Puts a file in a file input as the browser's picker would, and tells the page. */
export function pickFile(input: HTMLInputElement, file: File): void {
  Object.defineProperty(input, 'files', { value: [file], configurable: true })
  input.dispatchEvent(new Event('change'))
}

/** Types into an input or text box as the user would. */
export function typeInto(element: HTMLInputElement | HTMLTextAreaElement, value: string): void {
  element.value = value
  element.dispatchEvent(new Event('input'))
  element.dispatchEvent(new Event('change'))
}

/** Downloads end in a click on a link jsdom cannot follow: the file names handed to the browser, instead. */
export function catchDownloads(): string[] {
  const names: string[] = []
  vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
    names.push(this.download)
  })
  return names
}

/**
 * The app's routes for parts that only link to pages. Parked on the sign-in page first: left at its
 * start, the router would load the whole shell while the spec ends.
 */
export async function linkRouter() {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push('/sign-in')
  return router
}
