import type { ProjectStatus } from '@/api/types'

/** Plain words for the workflow states of a permit set. */
export const PROJECT_STATUS_LABELS: Record<ProjectStatus, string> = {
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
