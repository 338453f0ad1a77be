import { vi } from 'vitest'
import type { Role } from '@shared/auth/roles'
import { SAFETY_CAUTION } from '@shared/electrical/caution'
import type { Evaluation, RunResult } from '@shared/electrical/evaluate'
import type { ReviewCommentDto } from '@shared/schemas/review'
import type { RevisionDto } from '@shared/schemas/revision'
import type { TimelineEntryDto } from '@shared/schemas/workflow'
import { aProject, aRevision, DIAGRAM_SVG, PROJECT_ID } from '@/components/package/packageFixtures'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'

/** Specs only: the review of the invented project in `@/components/package/packageFixtures`. */

const aRun = (overrides: Partial<RunResult>): RunResult => ({
  id: 'R1', kind: 'pv_source', from: 'S1', to: 'INV1', lengthFt: 60, material: 'Cu', insulation: 'PV', method: 'FREE_AIR',
  racewayId: null, circuitConductors: 2, maxCurrentA: 17.1, voltageV: 402, sizeForAmpacity: '10', size: '10', parallelSets: 1,
  ampacityA: 34.8, ocpdA: null, egcSize: '10', conduitTradeSize: null, conduitFillPercent: null, voltageDropV: 2.1,
  voltageDropPercent: 0.52, status: 'pass', ...overrides,
})

export const anEvaluation = (): Evaluation => ({
  engineVersion: '0.1.0', valid: true, edition: 2023, caution: SAFETY_CAUTION, summary: [], issues: [], status: 'warn',
  sections: [
    {
      id: 'string.S1', title: 'String S1', group: 'string', status: 'pass',
      items: [{
        key: 'string.S1.vocMax', label: 'Maximum string voltage', value: 471.9, unit: 'V', formula: '11 × 39.4 V × (1 + (−0.26 %/°C) × (−21 − 25) °C)',
        reference: 'NEC 2023 690.7(A)(1)', status: 'pass', message: 'below the 600 V rating of the inverter input',
      }],
    },
    {
      id: 'run.R3', title: 'Run R3 (INV1 → MSP)', group: 'circuit', status: 'warn',
      items: [{
        key: 'run.R3.voltageDrop', label: 'Voltage drop', value: 2.37, unit: '%', formula: '2 × 92 ft × 24 A × 1.24 Ω/kft ÷ 240 V',
        reference: 'NEC 2023 210.19(A) Informational Note', status: 'warn', message: 'above the 2 % the design aims for',
      }],
    },
  ],
  runs: [
    aRun({}),
    aRun({ id: 'R3', kind: 'inverter_output', from: 'INV1', to: 'MSP', size: '8', ampacityA: 50, ocpdA: 30, voltageDropPercent: 2.37, status: 'warn' }),
  ],
})

export const aComment = (overrides: Partial<ReviewCommentDto> = {}): ReviewCommentDto => ({
  id: '9d1e2f3a-4b5c-4d6e-8f70-000000000001', projectId: PROJECT_ID, revision: { id: '6a2e4d3c-1b0f-4e9d-a8b7-223344556677', number: 1 },
  anchor: { kind: 'sheet', sheetId: 'E-601' }, body: 'Label the rapid-shutdown initiator on the single-line.',
  author: { id: 'r', name: 'Tobias Wren', role: 'reviewer' }, createdAt: '2026-12-03T15:20:00.000Z', resolved: null, replies: [],
  ...overrides,
})

export const aHandover = (revisionNumber: number): TimelineEntryDto => ({
  id: '7b3f5e4d-2c1a-4f0e-b9c8-334455667788', event: 'request_review', from: 'draft', to: 'in_review', note: null,
  actor: { id: 'd', name: 'Ines Okafor', role: 'designer' }, revision: { id: '6a2e4d3c-1b0f-4e9d-a8b7-223344556677', number: revisionNumber },
  createdAt: '2026-12-03T09:00:00.000Z',
})

interface Call {
  method: string
  url: string
  body: unknown
}

/** The review's API as the server answers it; the fields are the server's state, changed by the spec. */
export function fakeReviewApi(role: Role) {
  const state = {
    project: aProject({ status: 'in_review' }),
    timeline: [aHandover(1)] as TimelineEntryDto[],
    revisions: [aRevision(2), aRevision(1), aRevision(0)] as RevisionDto[],
    comments: [] as ReviewCommentDto[],
    /** The answer to each write, by the last part of its path (`review-comments`, `replies`, `resolve`, `reopen`). */
    writes: {} as Record<string, (body: unknown) => Response>,
  }
  const calls: Call[] = []
  const base = `/api/projects/${PROJECT_ID}`
  const fetch = vi.fn(async (url: string, init?: RequestInit) => {
    const method = init?.method ?? 'GET'
    const body = init?.body ? JSON.parse(String(init.body)) : undefined
    calls.push({ method, url, body })
    if (url === '/api/auth/refresh') return jsonResponse(200, sessionOf(aMember(role)))
    if (url === base) return jsonResponse(200, { project: state.project })
    if (url === `${base}/timeline`) return jsonResponse(200, { items: state.timeline })
    if (url === `${base}/revisions`) return jsonResponse(200, { items: state.revisions, activeJob: null })
    if (url === `${base}/review-comments` && method === 'GET') {
      return jsonResponse(200, { items: state.comments, open: state.comments.filter((c) => !c.resolved).length })
    }
    if (method === 'POST') {
      const answer = state.writes[url.split('/').at(-1)!]
      return answer ? answer(body) : errorResponse(409, 'conflict', 'Not expected by the spec')
    }
    if (url.endsWith('/files/calculations.json')) return jsonResponse(200, anEvaluation())
    if (url.endsWith('/files/design.json')) return jsonResponse(200, { topology: { strings: [{ id: 'S1' }, { id: 'S2' }] } })
    if (url.endsWith('/files/single-line.svg')) return new Response(DIAGRAM_SVG, { status: 200, headers: { 'Content-Type': 'image/svg+xml' } })
    return errorResponse(404, 'not_found', 'Not found')
  })
  vi.stubGlobal('fetch', fetch)
  return {
    state,
    calls,
    writes: () => calls.filter((call) => call.method !== 'GET' && !call.url.startsWith('/api/auth/')),
    fileCalls: () => calls.filter((call) => call.url.includes('/files/')).map((call) => call.url.replace(`${base}/revisions/`, '')),
  }
}
