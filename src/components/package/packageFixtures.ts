import { vi } from 'vitest'
import type { Role } from '@shared/auth/roles'
import type { PackageJobDto, RevisionDiff, RevisionDto } from '@shared/schemas/revision'
import type { ProjectDto } from '@/api/types'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'

/** Specs only: an invented project of the invented installer in `@/testing/fixtures`. */
export const PROJECT_ID = '3c9b2f6e-8d41-4a7e-b5c2-9f0e1d2a3b44'

export const aProject = (overrides: Partial<ProjectDto> = {}): ProjectDto => ({
  id: PROJECT_ID, code: 'KF-0107', name: 'Heronsgate barn roof', customerName: 'Alder Penhallow', customerEmail: null,
  customerPhone: null, siteAddress: '14 Tallow Lane', siteCity: 'Fenwick Cross', jurisdiction: null, utility: null,
  systemKind: 'grid_tied', status: 'draft', designer: null, reviewer: null, coordinator: null, targetSubmissionDate: null,
  design: { version: 4, evaluationStatus: 'pass' }, archivedAt: null, createdAt: '2026-11-20T10:00:00.000Z',
  updatedAt: '2026-11-30T10:00:00.000Z', version: 3, ...overrides,
})

const hash = (digit: string) => digit.repeat(64)

export const aRevision = (number: number, overrides: Partial<RevisionDto> = {}): RevisionDto => ({
  id: `rev-${number}`, projectId: PROJECT_ID, number, description: number === 0 ? 'Issued for permit' : `Resubmittal ${number}`,
  createdAt: `2026-12-0${number + 1}T09:30:00.000Z`, createdBy: { id: 'd', name: 'Ines Okafor' }, designVersion: 4 + number,
  engineVersion: '0.1.0', necEdition: 2023, evaluationStatus: 'pass', sheetSize: 'ANSI B', packageName: `KF-0107_rev0${number}.zip`,
  packageBytes: 481_234, packageSha256: hash(String(number)), sheetCount: 7, stamp: null,
  files: [
    { name: 'plan-set.pdf', bytes: 402_112, sha256: `ab12cd34ef56${hash('7').slice(12)}`, mediaType: 'application/pdf' },
    { name: 'single-line.svg', bytes: 38_410, sha256: hash('8'), mediaType: 'image/svg+xml' },
  ],
  ...overrides,
})

export const aJob = (overrides: Partial<PackageJobDto> = {}): PackageJobDto => ({
  id: 'job-1', projectId: PROJECT_ID, state: 'queued', step: 'queued', progress: 0, error: null, attempts: 1,
  description: 'Issued for permit', designVersion: 4, revisionId: null, revisionNumber: null,
  requestedBy: { id: 'd', name: 'Ines Okafor' }, createdAt: '2026-12-02T09:00:00.000Z', updatedAt: '2026-12-02T09:00:00.000Z',
  ...overrides,
})

export const aDiff = (from: number, to: number): RevisionDiff => ({
  from, to,
  summary: `Revision ${to} changes the inverter output conductor of revision ${from}.`,
  groups: [
    {
      area: 'conductors', title: 'Conductors',
      changes: [{ kind: 'changed', subject: 'Run R3 (INV1 → MSP)', field: 'conductor size', before: '10 AWG Cu', after: '8 AWG Cu' }],
    },
    { area: 'ocpd', title: 'Overcurrent protection', changes: [{ kind: 'added', subject: 'Fuse F2', field: null, before: null, after: '15 A' }] },
  ],
})

export const DIAGRAM_SVG = '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10"><text>&lt;script&gt;</text></svg>'

interface Call {
  method: string
  url: string
  body: unknown
}

/** The project's package API as the server answers it; the fields are the server's state, changed by the spec. */
export function fakePackageApi(role: Role) {
  const state = {
    project: aProject(),
    revisions: [] as RevisionDto[],
    activeJob: null as PackageJobDto | null,
    /** What successive polls of the job answer; the last one repeats. */
    polls: [] as PackageJobDto[],
    generate: (): Response => jsonResponse(202, { job: aJob() }),
    retry: (): Response => jsonResponse(202, { job: aJob({ state: 'queued', attempts: 2 }) }),
  }
  const calls: Call[] = []
  const base = `/api/projects/${PROJECT_ID}`
  const fetch = vi.fn(async (url: string, init?: RequestInit) => {
    const method = init?.method ?? 'GET'
    calls.push({ method, url, body: init?.body ? JSON.parse(String(init.body)) : undefined })
    if (url === '/api/auth/refresh') return jsonResponse(200, sessionOf(aMember(role)))
    if (url === base) return jsonResponse(200, { project: state.project })
    if (url === `${base}/revisions` && method === 'POST') return state.generate()
    if (url === `${base}/revisions`) return jsonResponse(200, { items: state.revisions, activeJob: state.activeJob })
    if (url.startsWith(`${base}/package-jobs/`) && url.endsWith('/retry')) return state.retry()
    if (url.startsWith(`${base}/package-jobs/`)) {
      const job = state.polls.length > 1 ? state.polls.shift()! : state.polls[0]
      return job ? jsonResponse(200, { job }) : errorResponse(404, 'not_found', 'No such job')
    }
    const compare = /\/revisions\/compare\?from=(\d+)&to=(\d+)$/.exec(url)
    if (compare) return jsonResponse(200, { diff: aDiff(Number(compare[1]), Number(compare[2])) })
    if (url.endsWith('/files/single-line.svg')) return new Response(DIAGRAM_SVG, { status: 200, headers: { 'Content-Type': 'image/svg+xml' } })
    if (url.includes('/revisions/compare/narrative.pdf?')) return new Response('%PDF-1.7', { status: 200, headers: { 'Content-Type': 'application/pdf' } })
    if (url.endsWith('/files/plan-set.pdf')) return new Response('%PDF-1.7', { status: 200, headers: { 'Content-Type': 'application/pdf' } })
    return errorResponse(404, 'not_found', 'Not found')
  })
  vi.stubGlobal('fetch', fetch)
  return {
    state,
    calls,
    writes: () => calls.filter((call) => call.method !== 'GET' && !call.url.startsWith('/api/auth/')),
    polls: () => calls.filter((call) => call.method === 'GET' && call.url.includes('/package-jobs/')).length,
  }
}

/** jsdom has no blob URLs: hand out numbered ones and remember which bytes each holds. */
export function stubBlobUrls() {
  const blobs = new Map<string, Blob>()
  let next = 0
  URL.createObjectURL = (blob: Blob) => {
    const url = `blob:stringline/${(next += 1)}`
    blobs.set(url, blob)
    return url
  }
  URL.revokeObjectURL = (url: string) => void blobs.delete(url)
  return blobs
}
