import { describe, expect, it } from 'vitest'
import { ROLES, type Role } from '../../shared/auth/roles'
import { PROJECT_STATUSES, type ProjectStatus } from '../../shared/schemas/project'
import { availableActions, decideTransition, licenceProblems, WORKFLOW_ACTIONS, type WorkflowAction } from '../../shared/workflow'

/**
 * The workflow written out edge by edge from the architecture guide ("Workflow of a permit set"),
 * independently of the table in shared/workflow; who takes each step is common practice, no source.
 */
const OPEN: ProjectStatus[] = ['draft', 'in_review', 'changes_requested', 'stamped', 'submitted', 'ahj_corrections', 'resubmitted', 'permit_issued']
const EDGES: [ProjectStatus, WorkflowAction, ProjectStatus, Role[]][] = [
  ['draft', 'request_review', 'in_review', ['designer', 'admin']],
  ['changes_requested', 'request_review', 'in_review', ['designer', 'admin']],
  ['in_review', 'request_changes', 'changes_requested', ['reviewer']],
  ['in_review', 'approve_and_stamp', 'stamped', ['reviewer']],
  ['stamped', 'record_submission', 'submitted', ['coordinator', 'admin']],
  ['submitted', 'record_corrections', 'ahj_corrections', ['coordinator', 'admin']],
  ['resubmitted', 'record_corrections', 'ahj_corrections', ['coordinator', 'admin']],
  ['ahj_corrections', 'record_resubmittal', 'resubmitted', ['coordinator', 'admin']],
  ['submitted', 'record_permit', 'permit_issued', ['coordinator', 'admin']],
  ['resubmitted', 'record_permit', 'permit_issued', ['coordinator', 'admin']],
  ['permit_issued', 'close', 'closed', ['coordinator', 'admin']],
  ...OPEN.map((s): [ProjectStatus, WorkflowAction, ProjectStatus, Role[]] => [s, 'withdraw', 'withdrawn', ['coordinator', 'admin']]),
]

describe('permit-set state machine', () => {
  it('allows exactly the written-out edges, to the written-out status, for the written-out roles', () => {
    let allowed = 0
    for (const status of PROJECT_STATUSES) {
      for (const action of WORKFLOW_ACTIONS) {
        for (const role of ROLES) {
          const edge = EDGES.find(([from, a, , roles]) => from === status && a === action && roles.includes(role))
          const decision = decideTransition(status, action, role)
          expect(decision, `${status} × ${action} × ${role}`).toEqual(edge ? { allowed: true, to: edge[2] } : { allowed: false, reason: expect.any(String) })
          if (decision.allowed) allowed++
        }
      }
    }
    expect(allowed).toBe(EDGES.reduce((n, [, , , roles]) => n + roles.length, 0))
  })

  it('names the roles a step is for when the role is wrong, and the starting statuses when the status is wrong', () => {
    const wrongRole = decideTransition('in_review', 'approve_and_stamp', 'admin')
    expect(wrongRole).toEqual({ allowed: false, reason: expect.stringContaining('Reviewing electrician') })
    expect(wrongRole.allowed || wrongRole.reason).toContain('Administrator may not')
    const wrongStatus = decideTransition('stamped', 'request_review', 'designer')
    expect(wrongStatus.allowed || wrongStatus.reason).toBe('“Ask for review” is not possible while the project is Stamped; it starts from Draft or Changes requested')
  })

  it('walks the happy path with a changes-requested loop and an AHJ-corrections loop', () => {
    const steps: [WorkflowAction, Role][] = [
      ['request_review', 'designer'], ['request_changes', 'reviewer'], ['request_review', 'designer'], ['approve_and_stamp', 'reviewer'],
      ['record_submission', 'coordinator'], ['record_corrections', 'coordinator'], ['record_resubmittal', 'coordinator'],
      ['record_corrections', 'coordinator'], ['record_resubmittal', 'coordinator'], ['record_permit', 'coordinator'], ['close', 'admin'],
    ]
    let status: ProjectStatus = 'draft'
    const seen: ProjectStatus[] = [status]
    for (const [action, role] of steps) {
      const d = decideTransition(status, action, role)
      if (!d.allowed) throw new Error(d.reason)
      status = d.to
      seen.push(status)
    }
    expect(seen).toEqual(['draft', 'in_review', 'changes_requested', 'in_review', 'stamped', 'submitted', 'ahj_corrections', 'resubmitted', 'ahj_corrections', 'resubmitted', 'permit_issued', 'closed'])
  })

  it('leads nowhere out of closed and withdrawn, for any role', () => {
    for (const status of ['closed', 'withdrawn'] as const) for (const role of ROLES) expect(availableActions(status, role)).toEqual([])
  })

  it('lists for a role exactly the actions the decision allows', () => {
    expect(availableActions('in_review', 'reviewer')).toEqual(['request_changes', 'approve_and_stamp'])
    expect(availableActions('submitted', 'coordinator')).toEqual(['record_corrections', 'record_permit', 'withdraw'])
    expect(availableActions('draft', 'designer')).toEqual(['request_review'])
    expect(availableActions('stamped', 'designer')).toEqual([])
  })
})

describe('licence for stamping', () => {
  const good = { licenceNumber: 'EC-1001', licenceRegion: 'Invented County', licenceExpiry: '2027-03-31' }
  it('accepts a complete licence through its expiry date', () => {
    expect(licenceProblems(good, '2027-03-31')).toEqual([])
  })
  it('names an expired licence the day after its expiry', () => {
    expect(licenceProblems(good, '2027-04-01').map((p) => p.field)).toEqual(['licenceExpiry'])
  })
  it('names every missing field', () => {
    expect(licenceProblems({ licenceNumber: ' ', licenceRegion: null, licenceExpiry: null }, '2026-12-02').map((p) => p.field)).toEqual(['licenceNumber', 'licenceRegion', 'licenceExpiry'])
  })
})
