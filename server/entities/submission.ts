import { EntitySchema } from 'typeorm'
import type { SubmissionMethod } from '../../shared/schemas/submission'

/**
 * One stamped revision of a project as submitted to the AHJ: how and when, the AHJ's reference,
 * the fee, the permit. Corrections and resubmittals of that revision belong to it; a newly stamped
 * revision (after a design change) starts a new submission, the newest being the current one.
 */
export interface Submission {
  id: string
  organizationId: string
  projectId: string
  revisionId: string
  method: SubmissionMethod
  /** Dates are YYYY-MM-DD. */
  submittedOn: string
  ahjReference: string | null
  feeCents: number | null
  feeDueOn: string | null
  feePaidOn: string | null
  feeReceiptFileId: string | null
  permitNumber: string | null
  permitIssuedOn: string | null
  permitExpiresOn: string | null
  inspectionOn: string | null
  submittedTransitionId: string
  createdAt: Date
  updatedAt: Date
  version: number
}

export const SubmissionEntity = new EntitySchema<Submission>({
  name: 'Submission',
  tableName: 'submissions',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    projectId: { name: 'project_id', type: 'uuid' },
    revisionId: { name: 'revision_id', type: 'uuid' },
    method: { type: 'text' },
    submittedOn: { name: 'submitted_on', type: 'date' },
    ahjReference: { name: 'ahj_reference', type: 'text', nullable: true },
    feeCents: { name: 'fee_cents', type: 'integer', nullable: true },
    feeDueOn: { name: 'fee_due_on', type: 'date', nullable: true },
    feePaidOn: { name: 'fee_paid_on', type: 'date', nullable: true },
    feeReceiptFileId: { name: 'fee_receipt_file_id', type: 'uuid', nullable: true },
    permitNumber: { name: 'permit_number', type: 'text', nullable: true },
    permitIssuedOn: { name: 'permit_issued_on', type: 'date', nullable: true },
    permitExpiresOn: { name: 'permit_expires_on', type: 'date', nullable: true },
    inspectionOn: { name: 'inspection_on', type: 'date', nullable: true },
    submittedTransitionId: { name: 'submitted_transition_id', type: 'uuid' },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    updatedAt: { name: 'updated_at', type: 'timestamptz', updateDate: true },
    version: { type: 'integer', version: true },
  },
})

/** One item of a correction letter: what the AHJ asked for, and whether it has been answered. */
export interface CorrectionItem {
  text: string
  done: boolean
}

/** A correction letter from the AHJ on a submission: one per round, closed by the resubmittal. */
export interface CorrectionLetter {
  id: string
  organizationId: string
  submissionId: string
  round: number
  receivedOn: string
  responseDueOn: string
  letterFileId: string
  items: CorrectionItem[]
  resubmittedOn: string | null
  transitionId: string
  createdAt: Date
}

export const CorrectionLetterEntity = new EntitySchema<CorrectionLetter>({
  name: 'CorrectionLetter',
  tableName: 'correction_letters',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    submissionId: { name: 'submission_id', type: 'uuid' },
    round: { type: 'integer' },
    receivedOn: { name: 'received_on', type: 'date' },
    responseDueOn: { name: 'response_due_on', type: 'date' },
    letterFileId: { name: 'letter_file_id', type: 'uuid' },
    items: { type: 'jsonb' },
    resubmittedOn: { name: 'resubmitted_on', type: 'date', nullable: true },
    transitionId: { name: 'transition_id', type: 'uuid' },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
