import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ROLES, type Role } from '../../shared/auth/roles'
import { PROJECT_STATUSES } from '../../shared/schemas/project'
import type { TimelineEntryDto } from '../../shared/schemas/workflow'
import { decideTransition, WORKFLOW_ACTIONS, type WorkflowAction } from '../../shared/workflow'
import { AuditEventEntity, DesignEntity, ProjectEntity, ProjectTransitionEntity, RevisionStampEntity, UserEntity } from '../../server/entities'
import { AuditService } from '../../server/services/audit-service'
import { JurisdictionService } from '../../server/services/jurisdiction-service'
import { ProjectService } from '../../server/services/project-service'
import { WorkflowService } from '../../server/services/workflow-service'
import { fieldsOf, startWorkspace, type Workspace } from './support/workspace'
import { workflowSteps } from './support/workflow-steps'
import { hashPassword } from '../../server/auth/passwords'
import { DEMO_PASSWORD } from '../../server/demo/seed'
import { login } from './support/harness'

let w: Workspace
let codes: string[]
/** Steps that record nothing beyond the note: from any status the state machine allows, they move. */
const DATA_FREE_STEPS: readonly WorkflowAction[] = ['request_review', 'request_changes', 'close', 'withdraw']
beforeAll(async () => {
  w = await startWorkspace()
  codes = Object.keys(w.projects).sort()
}, 60_000)
afterAll(() => w.h.close())

const { idOf, projectRow, publishRevision, step, stepOk } = workflowSteps(() => w)
const transitionsOf = (code: string) => `/api/projects/${idOf(code)}/transitions`

const timeline = async (code: string, role: Role = 'coordinator') => {
  const res = await request(w.h.app).get(`/api/projects/${idOf(code)}/timeline`).set(w.as(role))
  expect(res.status).toBe(200)
  return res.body.items as TimelineEntryDto[]
}

describe('every status × action × role through the API', () => {
  it('answers what the state machine decides: a refusal is 409 with its reason; an allowed step moves, or names the data it lacks', async () => {
    const code = codes[0]!
    await publishRevision(code, 0)
    // the review request puts revision 0 under review, so approval later finds it
    await stepOk(code, 'designer', 'request_review')
    const project = w.h.db.getRepository(ProjectEntity)
    for (const status of PROJECT_STATUSES) {
      for (const action of WORKFLOW_ACTIONS) {
        for (const role of ROLES) {
          await project.update({ id: idOf(code) }, { status })
          const res = await step(code, role, action, { note: 'matrix check' })
          const decision = decideTransition(status, action, role)
          const label = `${status} × ${action} × ${role}`
          if (decision.allowed && DATA_FREE_STEPS.includes(action)) {
            expect(res.status, `${label}: ${JSON.stringify(res.body)}`).toBe(200)
            expect(res.body.project.status, label).toBe(decision.to)
            expect(res.body.transition, label).toMatchObject({ event: action, from: status, to: decision.to, note: 'matrix check' })
          } else if (decision.allowed) {
            // a status forced here lacks the stamp credentials, submission or letter the step records: 422 or 409 naming it, never the state machine's refusal
            expect([409, 422], `${label}: ${JSON.stringify(res.body)}`).toContain(res.status)
            expect(res.body.error.fields?.[0]?.field, label).not.toBe('action')
            expect((await projectRow(code)).status, label).toBe(status)
          } else {
            expect(res.status, label).toBe(409)
            expect(res.body.error, label).toMatchObject({ code: 'conflict', message: decision.reason })
            expect((await projectRow(code)).status, label).toBe(status)
          }
        }
      }
    }
  }, 120_000)
})

describe('a permit set from draft to closed', () => {
  it('asks for review only with a published revision of the current design', async () => {
    const code = codes[1]!
    let res = await step(code, 'designer', 'request_review')
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['revisionNumber'])
    await publishRevision(code, 0, -1)
    res = await step(code, 'designer', 'request_review', { revisionNumber: 0 })
    expect(res.status).toBe(422)
    expect(res.body.error.fields[0].message).toContain('not of the current design version')
    res = await step(code, 'designer', 'request_review', { revisionNumber: 7 })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['revisionNumber'])
    expect((await projectRow(code)).status).toBe('draft')
    expect(await timeline(code)).toEqual([])
  })

  it('goes round the changes-requested loop and the AHJ-corrections loop, writing the timeline and the audit log', async () => {
    const code = codes[1]!
    await publishRevision(code, 1)
    expect((await stepOk(code, 'designer', 'request_review', { revisionNumber: 1 })).project.status).toBe('in_review')

    const noNote = await step(code, 'reviewer', 'request_changes')
    expect(noNote.status).toBe(422)
    expect(fieldsOf(noNote)).toEqual(['note'])
    expect((await stepOk(code, 'reviewer', 'request_changes', { note: 'Label the rapid-shutdown initiator' })).project.status).toBe('changes_requested')
    await stepOk(code, 'admin', 'request_review')
    const stamped = await stepOk(code, 'reviewer', 'approve_and_stamp', { note: 'Checked against the adopted edition' })
    expect(stamped.project.status).toBe('stamped')
    expect(stamped.transition.revision).toMatchObject({ number: 1 })
    await stepOk(code, 'coordinator', 'record_submission', { note: 'Portal, reference ACH-2026-0412' })
    await stepOk(code, 'coordinator', 'record_corrections', { note: 'Item 1: show the grounding electrode conductor size' })
    await stepOk(code, 'coordinator', 'record_resubmittal')
    await stepOk(code, 'admin', 'record_corrections', { note: 'Item 2: conduit fill for the home run' })
    await stepOk(code, 'coordinator', 'record_resubmittal')
    await stepOk(code, 'coordinator', 'record_permit', { note: 'Permit EP-88213' })
    const closed = await stepOk(code, 'admin', 'close')
    expect(closed.project.status).toBe('closed')

    const rows = await timeline(code, 'designer')
    const path = ['draft', 'in_review', 'changes_requested', 'in_review', 'stamped', 'submitted', 'ahj_corrections', 'resubmitted', 'ahj_corrections', 'resubmitted', 'permit_issued', 'closed']
    const oldestFirst = [...rows].reverse()
    expect(oldestFirst.map((r) => r.from)).toEqual(path.slice(0, -1))
    expect(oldestFirst.map((r) => r.to)).toEqual(path.slice(1))
    expect(oldestFirst.map((r) => r.actor?.role)).toEqual(['designer', 'reviewer', 'admin', 'reviewer', 'coordinator', 'coordinator', 'coordinator', 'admin', 'coordinator', 'coordinator', 'admin'])
    expect(rows.every((r) => r.revision?.number === 1)).toBe(true)
    expect(rows[0]).toMatchObject({ event: 'close', from: 'permit_issued', to: 'closed', note: null })
    expect(rows[1]).toMatchObject({ event: 'record_permit', note: 'Permit EP-88213' })

    const audit = await w.h.db.getRepository(AuditEventEntity).find({ where: { entityId: idOf(code) }, order: { createdAt: 'ASC' } })
    const workflowAudit = audit.filter((a) => a.action.startsWith('workflow.'))
    expect(workflowAudit.map((a) => [a.action, a.fromState, a.toState, a.actorId])).toEqual(
      oldestFirst.map((r) => [`workflow.${r.event}`, r.from, r.to, r.actor!.id]),
    )
    expect(workflowAudit[1]!.note).toBe('Label the rapid-shutdown initiator')

    const after = await step(code, 'coordinator', 'withdraw', { note: 'too late' })
    expect(after.status).toBe(409)
  })
})

describe('what the table cannot see', () => {
  const code = () => codes[2]!
  beforeAll(async () => {
    await publishRevision(code(), 0)
    await stepOk(code(), 'designer', 'request_review')
  })

  it('refuses a stale project version with 409 and changes nothing', async () => {
    const before = await projectRow(code())
    const res = await step(code(), 'reviewer', 'request_changes', { note: 'x', version: before.version - 1 })
    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('version_conflict')
    expect(fieldsOf(res)).toEqual(['version'])
    expect(res.body.current.status).toBe('in_review')
    expect(await projectRow(code())).toMatchObject({ status: 'in_review', version: before.version })
    expect(await timeline(code())).toHaveLength(1)
  })

  it('lets only the reviewer assigned to the project judge it', async () => {
    const project = await projectRow(code())
    const other = await w.h.db.getRepository(UserEntity).save({
      organizationId: project.organizationId, email: 'second-reviewer@larkspur-solar.example', name: 'Second Reviewer', role: 'reviewer',
      passwordHash: await hashPassword(DEMO_PASSWORD, w.h.config.bcryptCost), licenceNumber: 'EC-2 (demo)', licenceRegion: 'Invented', licenceExpiry: '2030-01-01',
    })
    const { token } = await login(w.h.app, other.email)
    const res = await request(w.h.app).post(transitionsOf(code())).set({ Authorization: `Bearer ${token}` }).send({ action: 'request_changes', note: 'x', version: project.version })
    expect(res.status).toBe(409)
    expect(fieldsOf(res)).toEqual(['reviewerId'])
    expect((await projectRow(code())).status).toBe(project.status)
  })

  it('approves only with the reviewer licence complete and in force (422 naming the field)', async () => {
    const users = w.h.db.getRepository(UserEntity)
    const reviewer = await users.findOneByOrFail({ id: w.userIds.reviewer })
    try {
      await users.update({ id: reviewer.id }, { licenceNumber: null, licenceRegion: null })
      let res = await step(code(), 'reviewer', 'approve_and_stamp')
      expect(res.status).toBe(422)
      expect(fieldsOf(res)).toEqual(['licenceNumber', 'licenceRegion'])
      await users.update({ id: reviewer.id }, { licenceNumber: reviewer.licenceNumber, licenceRegion: reviewer.licenceRegion, licenceExpiry: '2020-01-31' })
      res = await step(code(), 'reviewer', 'approve_and_stamp')
      expect(res.status).toBe(422)
      expect(fieldsOf(res)).toEqual(['licenceExpiry'])
      expect(res.body.error.fields[0].message).toContain('expired on 2020-01-31')
      expect((await projectRow(code())).status).toBe('in_review')
    } finally {
      await users.update({ id: reviewer.id }, { licenceNumber: reviewer.licenceNumber, licenceRegion: reviewer.licenceRegion, licenceExpiry: reviewer.licenceExpiry })
    }
  })

  it('refuses to stamp a revision whose design changed while under review', async () => {
    const designs = w.h.db.getRepository(DesignEntity)
    await designs.increment({ projectId: idOf(code()) }, 'version', 1)
    try {
      const res = await step(code(), 'reviewer', 'approve_and_stamp')
      expect(res.status).toBe(422)
      expect(fieldsOf(res)).toEqual(['design.version'])
    } finally {
      await designs.decrement({ projectId: idOf(code()) }, 'version', 1)
    }
    expect((await stepOk(code(), 'reviewer', 'approve_and_stamp')).project.status).toBe('stamped')
    expect(await w.h.db.getRepository(RevisionStampEntity).countBy({ projectId: idOf(code()) })).toBe(1)
  })

  it('takes a revision number only on a review request, and a note of at most 2000 characters', async () => {
    let res = await step(code(), 'coordinator', 'record_submission', { revisionNumber: 0 })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['revisionNumber'])
    res = await step(code(), 'coordinator', 'record_submission', { note: 'x'.repeat(2001) })
    expect(res.status).toBe(400)
    expect(fieldsOf(res)).toEqual(['note'])
    res = await step(code(), 'coordinator', 'file_it' as WorkflowAction)
    expect(res.status).toBe(400)
    expect(fieldsOf(res)).toEqual(['action'])
  })

  it('answers 404 to another organisation, and 409 on an archived project', async () => {
    const version = (await projectRow(code())).version
    let res = await request(w.h.app).post(transitionsOf(code())).set(w.asForeign('coordinator')).send({ action: 'record_submission', version })
    expect(res.status).toBe(404)
    res = await request(w.h.app).get(`/api/projects/${idOf(code())}/timeline`).set(w.asForeign('admin'))
    expect(res.status).toBe(404)
    expect(await w.h.db.getRepository(ProjectTransitionEntity).countBy({ projectId: idOf(code()), event: 'record_submission' })).toBe(0)

    const archived = await request(w.h.app).post(`/api/projects/${idOf(code())}/archive`).set(w.as('admin')).send({ version })
    expect(archived.status).toBe(200)
    res = await step(code(), 'coordinator', 'record_submission')
    expect(res.status).toBe(409)
    expect(res.body.error.message).toContain('archived')
  })
})

describe('a design edit after stamping', () => {
  // the design service calls this inside its save transaction; here it is called the same way
  const reopen = async (code: string) => {
    const audit = new AuditService(w.h.db)
    const workflow = new WorkflowService(w.h.db, audit, new ProjectService(w.h.db, audit, new JurisdictionService(w.h.db, audit)))
    const actor = { id: w.userIds.designer, organizationId: (await projectRow(code)).organizationId, email: 'd', name: 'd', role: 'designer' as const }
    return w.h.db.transaction(async (manager) => workflow.reopenForDesignEdit(manager, actor, await projectRow(code)))
  }

  it('sends a stamped project back to draft with a timeline row, leaves a draft alone, and refuses on a closed one', async () => {
    const code = codes[3]!
    await publishRevision(code, 0)
    await stepOk(code, 'designer', 'request_review')
    await stepOk(code, 'reviewer', 'approve_and_stamp')
    await stepOk(code, 'coordinator', 'record_submission')
    const before = await projectRow(code)
    await reopen(code)
    const after = await projectRow(code)
    expect(after.status).toBe('draft')
    expect(after.version).toBe(before.version + 1)
    expect((await timeline(code))[0]).toMatchObject({ event: 'design_reopened', from: 'submitted', to: 'draft', actor: { role: 'designer' }, revision: { number: 0 } })

    await reopen(code)
    expect(await timeline(code)).toHaveLength(4)
    // the stamp does not carry over: the new draft must be reviewed again before it can be submitted
    expect((await step(code, 'coordinator', 'record_submission')).status).toBe(409)

    await stepOk(code, 'coordinator', 'withdraw', { note: 'Customer cancelled' })
    await expect(reopen(code)).rejects.toMatchObject({ status: 409 })
  })
})
