import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SAFETY_CAUTION } from '../../shared/electrical/caution'
import { ProjectEntity, UserEntity } from '../../server/entities'
import { today, workflowSteps } from './support/workflow-steps'
import { fieldsOf, startWorkspace, type Workspace } from './support/workspace'

/**
 * The submission to the AHJ between and beside the workflow steps: what is due (one database view
 * feeds the board, its filters, the home page and the digest), the board and its CSV, paperwork
 * edits at a version, and tenancy.
 */
let w: Workspace
const { idOf, publishRevision, step, stepOk } = workflowSteps(() => w)
const daysFromToday = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10)

beforeAll(async () => {
  w = await startWorkspace()
  // CH-0101: submitted with a fee overdue; CH-0102: permit issued with an inspection next week; CH-0103 stays a draft
  for (const code of ['CH-0101', 'CH-0102']) {
    await publishRevision(code, 0)
    await stepOk(code, 'designer', 'request_review')
    await stepOk(code, 'reviewer', 'approve_and_stamp')
  }
  await stepOk('CH-0101', 'coordinator', 'record_submission', {
    submission: { method: 'email', submittedOn: daysFromToday(-20), ahjReference: '=HYPERLINK("http://evil.example")', feeAmount: '1234.5', feeDueOn: daysFromToday(-3) },
  })
  await stepOk('CH-0102', 'coordinator', 'record_submission', { submission: { method: 'counter', submittedOn: daysFromToday(-10) } })
  await stepOk('CH-0102', 'admin', 'record_permit', { submission: { permitNumber: 'EP-2001', issuedOn: today(), inspectionOn: daysFromToday(6), expiresOn: daysFromToday(180) } })
}, 120_000)
afterAll(() => w.h.close())

const board = (query = '', role: 'coordinator' | 'admin' = 'coordinator') => request(w.h.app).get(`/api/submissions${query}`).set(w.as(role))

describe('what is due', () => {
  it('lists the overdue fee and the coming inspection, soonest first, and not the permit expiry beyond the horizon', async () => {
    const res = await request(w.h.app).get('/api/submissions/due').set(w.as('coordinator'))
    expect(res.status).toBe(200)
    expect(res.body.horizonDays).toBe(7)
    expect(res.body.items.map((d: { projectCode: string; kind: string; overdue: boolean }) => [d.projectCode, d.kind, d.overdue])).toEqual([
      ['CH-0101', 'fee_payment', true],
      ['CH-0102', 'inspection', false],
    ])
    expect(res.body.items[0].summary).toBe('Pay the permit fee of 1,234.50')
  })

  it('shows a coordinator only their own and unassigned projects', async () => {
    await w.h.db.getRepository(ProjectEntity).update({ id: idOf('CH-0101') }, { coordinatorId: w.userIds.admin })
    try {
      const res = await request(w.h.app).get('/api/submissions/due').set(w.as('coordinator'))
      expect(res.body.items.map((d: { projectCode: string }) => d.projectCode)).toEqual(['CH-0102'])
      const admin = await request(w.h.app).get('/api/submissions/due').set(w.as('admin'))
      expect(admin.body.items).toHaveLength(2)
    } finally {
      await w.h.db.getRepository(ProjectEntity).update({ id: idOf('CH-0101') }, { coordinatorId: w.userIds.coordinator })
    }
  })

  it('drops an item once it is done: a paid fee is no longer due', async () => {
    const current = (await request(w.h.app).get(`/api/projects/${idOf('CH-0101')}/submission`).set(w.as('coordinator'))).body
    expect(current.submission).toMatchObject({ method: 'email', feeCents: 123450, feeAmount: '1,234.50', feePaidOn: null })
    let res = await request(w.h.app).patch(`/api/projects/${idOf('CH-0101')}/submission`).set(w.as('coordinator')).send({ version: current.submission.version, feePaidOn: daysFromToday(2) })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['feePaidOn'])
    res = await request(w.h.app).patch(`/api/projects/${idOf('CH-0101')}/submission`).set(w.as('coordinator')).send({ version: current.submission.version, permitExpiresOn: today() })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['permitExpiresOn'])
    res = await request(w.h.app).patch(`/api/projects/${idOf('CH-0101')}/submission`).set(w.as('coordinator')).send({ version: current.submission.version, feeAmount: '12,00' })
    expect(res.status).toBe(400)
    expect(fieldsOf(res)).toEqual(['feeAmount'])
    res = await request(w.h.app).patch(`/api/projects/${idOf('CH-0101')}/submission`).set(w.as('coordinator')).send({ version: current.submission.version, feePaidOn: today() })
    expect(res.status).toBe(200)
    expect(res.body.submission).toMatchObject({ feePaidOn: today(), version: current.submission.version + 1 })
    expect(res.body.due).toEqual([])
    expect((await request(w.h.app).patch(`/api/projects/${idOf('CH-0101')}/submission`).set(w.as('designer')).send({ version: 2 })).status).toBe(403)
    expect((await request(w.h.app).patch(`/api/projects/${idOf('CH-0101')}/submission`).set(w.asForeign('coordinator')).send({ version: 2 })).status).toBe(404)
    expect((await request(w.h.app).get(`/api/projects/${idOf('CH-0101')}/submission`).set(w.asForeign('admin'))).status).toBe(404)
  })
})

describe('the submission board', () => {
  it('lists projects from stamped on, filtered by status, jurisdiction, due date and text, sorted as asked', async () => {
    let res = await board('?sort=code')
    expect(res.status).toBe(200)
    expect(res.body.items.map((r: { project: { code: string; status: string } }) => [r.project.code, r.project.status])).toEqual([['CH-0101', 'submitted'], ['CH-0102', 'permit_issued']])
    expect(res.body.items[1]).toMatchObject({ submission: { method: 'counter', permitNumber: 'EP-2001' }, nextDueOn: daysFromToday(6), overdue: false })
    res = await board('?status=submitted&status=resubmitted')
    expect(res.body.items.map((r: { project: { code: string } }) => r.project.code)).toEqual(['CH-0101'])
    res = await board(`?dueBefore=${daysFromToday(7)}`)
    expect(res.body.items.map((r: { project: { code: string } }) => r.project.code)).toEqual(['CH-0102'])
    res = await board('?q=EP-2001')
    expect(res.body.total).toBe(1)
    const jurisdiction = res.body.items[0].project.jurisdiction.id
    expect((await board(`?jurisdictionId=${jurisdiction}`)).body.total).toBe(2)
    expect((await board('?jurisdictionId=00000000-0000-4000-8000-000000000000')).body.total).toBe(0)
    res = await board('?sort=-code&pageSize=1&page=2')
    expect(res.body).toMatchObject({ total: 2, page: 2, pageSize: 1 })
    expect(res.body.items[0].project.code).toBe('CH-0101')

    const bad = await board('?status=draft&sort=secret')
    expect(bad.status).toBe(400)
    expect(fieldsOf(bad)).toEqual(['sort', 'status'])
    // a foreign organisation sees none of it
    expect((await request(w.h.app).get('/api/submissions').set(w.asForeign('coordinator'))).body.total).toBe(0)
  })

  it('exports the filtered board as CSV with formula-looking cells made harmless', async () => {
    const res = await request(w.h.app).get('/api/submissions.csv?sort=code').set(w.as('admin'))
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toContain('text/csv')
    const lines = res.text.split('\r\n')
    expect(lines).toHaveLength(4)
    expect(lines[1]).toContain(`Caution,"${SAFETY_CAUTION}"`)
    expect(lines[2]).toContain(`"'=HYPERLINK(""http://evil.example"")"`)
    expect(lines[3]).toMatch(/^CH-0102,.*,Permit issued,Cedar Hollow Building Department,At the counter,/)
  })
})

describe('paperwork steps that do not fit the record', () => {
  it('refuses a resubmittal with no letter waiting, a permit dated before the submission, and a second submission of one revision', async () => {
    const users = w.h.db.getRepository(UserEntity)
    expect(await users.countBy({ role: 'coordinator' })).toBeGreaterThan(0)
    let res = await step('CH-0101', 'coordinator', 'record_permit', { submission: { permitNumber: 'EP-1', issuedOn: daysFromToday(-30) } })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['submission.issuedOn'])
    res = await step('CH-0101', 'coordinator', 'record_corrections', { note: 'x', submission: { letterFileId: '00000000-0000-4000-8000-000000000000', receivedOn: today(), responseDueOn: today(), items: ['a'] } })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['submission.letterFileId'])
    res = await step('CH-0101', 'coordinator', 'record_corrections', { note: 'x', submission: { letterFileId: '00000000-0000-4000-8000-000000000000', receivedOn: today(), responseDueOn: daysFromToday(-1), items: [] } })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['submission.items'])
    res = await step('CH-0101', 'designer', 'record_submission', { submission: { method: 'portal', submittedOn: today() } })
    expect(res.status).toBe(409)
    res = await step('CH-0103', 'coordinator', 'record_submission', { note: 'x', submission: { method: 'portal', submittedOn: today() } })
    expect(res.status).toBe(409)
    expect(fieldsOf(res)).toEqual(['action'])
  })
})
