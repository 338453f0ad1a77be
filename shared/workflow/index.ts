import { ROLE_LABELS, type Role } from '../auth/roles'
import type { ProjectStatus } from '../schemas/project'

/**
 * The permit-set workflow (architecture guide, "Workflow of a permit set"): which step a role may
 * take from which status. Pure; the server decides with it and the client shows only what it allows.
 */

export const WORKFLOW_ACTIONS = [
  'request_review',
  'request_changes',
  'approve_and_stamp',
  'record_submission',
  'record_corrections',
  'record_resubmittal',
  'record_permit',
  'close',
  'withdraw',
] as const
export type WorkflowAction = (typeof WORKFLOW_ACTIONS)[number]

/** What a timeline row can record: a step someone took, or the reopening a design edit causes. */
export const TIMELINE_EVENTS = [...WORKFLOW_ACTIONS, 'design_reopened'] as const
export type TimelineEvent = (typeof TIMELINE_EVENTS)[number]

export const STATUS_LABELS: Record<ProjectStatus, string> = {
  draft: 'Draft',
  in_review: 'In review',
  changes_requested: 'Changes requested',
  stamped: 'Stamped',
  submitted: 'Submitted to AHJ',
  ahj_corrections: 'AHJ corrections',
  resubmitted: 'Resubmitted',
  permit_issued: 'Permit issued',
  closed: 'Closed',
  withdrawn: 'Withdrawn',
}

/** Statuses nothing leads out of. */
export const FINAL_STATUSES: readonly ProjectStatus[] = ['closed', 'withdrawn']

/**
 * Statuses whose design is locked by a stamp: saving the design then starts over in `draft`,
 * because the stamp belongs to the revision that was reviewed, never to a changed design.
 */
export const STAMP_LOCKED_STATUSES: readonly ProjectStatus[] = ['stamped', 'submitted', 'ahj_corrections', 'resubmitted', 'permit_issued']

const OPEN_STATUSES = (Object.keys(STATUS_LABELS) as ProjectStatus[]).filter((s) => !FINAL_STATUSES.includes(s))

export interface ActionRule {
  label: string
  /** Statuses the action starts from, each with where it leads. */
  from: Partial<Record<ProjectStatus, ProjectStatus>>
  roles: readonly Role[]
  /** The step means nothing without a reason written down (what to change, what the AHJ asked, why it stops). */
  noteRequired: boolean
}

const fromEach = (statuses: readonly ProjectStatus[], to: ProjectStatus) => Object.fromEntries(statuses.map((s) => [s, to])) as Partial<Record<ProjectStatus, ProjectStatus>>

/** People who run the paperwork: the permit coordinator, and the administrator standing in. */
const PAPERWORK: readonly Role[] = ['coordinator', 'admin']

/**
 * The transition table. Who takes each step is common practice, no source: the designer hands the
 * set to review; only the licensed electrician judges and stamps it (an administrator may not, having
 * no licence to put on it); the coordinator carries it to the AHJ and back; stopping or closing a job
 * is an office decision for the coordinator or the administrator.
 */
export const ACTION_RULES: Record<WorkflowAction, ActionRule> = {
  request_review: { label: 'Ask for review', from: { draft: 'in_review', changes_requested: 'in_review' }, roles: ['designer', 'admin'], noteRequired: false },
  request_changes: { label: 'Request changes', from: { in_review: 'changes_requested' }, roles: ['reviewer'], noteRequired: true },
  approve_and_stamp: { label: 'Approve and stamp', from: { in_review: 'stamped' }, roles: ['reviewer'], noteRequired: false },
  record_submission: { label: 'Record submission to the AHJ', from: { stamped: 'submitted' }, roles: PAPERWORK, noteRequired: false },
  record_corrections: { label: 'Record AHJ corrections', from: { submitted: 'ahj_corrections', resubmitted: 'ahj_corrections' }, roles: PAPERWORK, noteRequired: true },
  record_resubmittal: { label: 'Record resubmittal', from: { ahj_corrections: 'resubmitted' }, roles: PAPERWORK, noteRequired: false },
  record_permit: { label: 'Record permit issued', from: { submitted: 'permit_issued', resubmitted: 'permit_issued' }, roles: PAPERWORK, noteRequired: false },
  close: { label: 'Close the project', from: { permit_issued: 'closed' }, roles: PAPERWORK, noteRequired: false },
  withdraw: { label: 'Withdraw', from: fromEach(OPEN_STATUSES, 'withdrawn'), roles: PAPERWORK, noteRequired: true },
}

export const TIMELINE_EVENT_LABELS: Record<TimelineEvent, string> = {
  ...(Object.fromEntries(WORKFLOW_ACTIONS.map((a) => [a, ACTION_RULES[a].label])) as Record<WorkflowAction, string>),
  design_reopened: 'Design changed after stamping',
}

export type TransitionDecision = { allowed: true; to: ProjectStatus } | { allowed: false; reason: string }

const article = (word: string) => (/^[aeiou]/i.test(word) ? 'an' : 'a')
const listOf = (words: string[]) => (words.length > 1 ? `${words.slice(0, -1).join(', ')} or ${words.at(-1)}` : (words[0] ?? ''))

/** Whether `role` may take `action` from `status`: the status it leads to, or the reason it may not. */
export function decideTransition(status: ProjectStatus, action: WorkflowAction, role: Role): TransitionDecision {
  const rule = ACTION_RULES[action]
  if (!rule.roles.includes(role)) {
    const who = rule.roles.map((r) => ROLE_LABELS[r])
    return { allowed: false, reason: `“${rule.label}” is for ${article(who[0]!)} ${listOf(who)}; ${article(ROLE_LABELS[role])} ${ROLE_LABELS[role]} may not take it` }
  }
  const to = rule.from[status]
  if (!to) {
    const from = (Object.keys(rule.from) as ProjectStatus[]).map((s) => STATUS_LABELS[s])
    return { allowed: false, reason: `“${rule.label}” is not possible while the project is ${STATUS_LABELS[status]}; it starts from ${listOf(from)}` }
  }
  return { allowed: true, to }
}

/** The actions `role` may take from `status`, in workflow order. */
export function availableActions(status: ProjectStatus, role: Role): WorkflowAction[] {
  return WORKFLOW_ACTIONS.filter((action) => decideTransition(status, action, role).allowed)
}

/**
 * Whether a reviewer licence is good for stamping on `today` (YYYY-MM-DD): each field missing or
 * expired, named as on the user's profile. A licence is good through its expiry date.
 */
export function licenceProblems(
  licence: { licenceNumber: string | null; licenceRegion: string | null; licenceExpiry: string | null },
  today: string,
): { field: 'licenceNumber' | 'licenceRegion' | 'licenceExpiry'; message: string }[] {
  const problems: { field: 'licenceNumber' | 'licenceRegion' | 'licenceExpiry'; message: string }[] = []
  if (!licence.licenceNumber?.trim()) problems.push({ field: 'licenceNumber', message: 'is missing from your profile; a stamp carries the licence number' })
  if (!licence.licenceRegion?.trim()) problems.push({ field: 'licenceRegion', message: 'is missing from your profile; a stamp names the state or region that issued the licence' })
  if (!licence.licenceExpiry) problems.push({ field: 'licenceExpiry', message: 'is missing from your profile; a stamp needs a licence that is in force' })
  else if (licence.licenceExpiry < today) problems.push({ field: 'licenceExpiry', message: `the licence expired on ${licence.licenceExpiry}; renew it and update your profile before stamping` })
  return problems
}
