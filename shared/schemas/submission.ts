import { z } from 'zod'
import type { WorkflowAction } from '../workflow'
import { pageQuery } from './paging'
import { PROJECT_STATUSES } from './project'

/** Shapes of the submission to the AHJ: what each paperwork step of the workflow records. */

/** How the set went to the AHJ. */
export const SUBMISSION_METHODS = ['portal', 'email', 'counter'] as const
export type SubmissionMethod = (typeof SUBMISSION_METHODS)[number]
export const SUBMISSION_METHOD_LABELS: Record<SubmissionMethod, string> = { portal: 'Online portal', email: 'E-mail', counter: 'At the counter' }

/** Statuses a project has from stamping on: the ones the submission board shows. */
export const BOARD_STATUSES = ['stamped', 'submitted', 'ahj_corrections', 'resubmitted', 'permit_issued', 'closed', 'withdrawn'] as const satisfies readonly (typeof PROJECT_STATUSES)[number][]

const date = z.iso.date({ message: 'must be a date as YYYY-MM-DD' })
const text = (max: number) => z.string().trim().min(1, 'must not be empty').max(max, `must be at most ${max} characters`)
/** An amount of money as typed, without currency: `350`, `1234.5`, `1234.50` (up to 9 999 999.99). */
export const feeAmount = z.string().trim().regex(/^\d{1,7}(\.\d{1,2})?$/, 'must be an amount such as 350 or 1234.50 (no currency sign, at most two decimals)')

/** `record_submission`: how and when the set went in, the AHJ's reference and the fee it asked for. */
export const recordSubmissionDetails = z
  .object({
    method: z.enum(SUBMISSION_METHODS, { message: `must be one of ${SUBMISSION_METHODS.join(', ')}` }),
    submittedOn: date,
    ahjReference: text(80).optional(),
    feeAmount: feeAmount.optional(),
    feeDueOn: date.optional(),
  })
  .strict()

/** One item of a correction letter: what the AHJ asked for. */
export const correctionItemText = text(1000)

/** `record_corrections`: the AHJ's letter (uploaded first), when it came, when the answer is due, and its items. */
export const recordCorrectionsDetails = z
  .object({
    letterFileId: z.uuid({ message: 'must be the id of an uploaded correction letter' }),
    receivedOn: date,
    responseDueOn: date,
    items: z.array(correctionItemText).min(1, 'must list at least one item of the letter').max(200, 'must have at most 200 items'),
  })
  .strict()

/** `record_resubmittal`: when the answered set went back. */
export const recordResubmittalDetails = z.object({ resubmittedOn: date }).strict()

/** `record_permit`: the permit as issued. */
export const recordPermitDetails = z
  .object({
    permitNumber: text(80),
    issuedOn: date,
    expiresOn: date.optional(),
    inspectionOn: date.optional(),
  })
  .strict()

/** The details each paperwork step takes, by action. */
export const SUBMISSION_STEP_DETAILS = {
  record_submission: recordSubmissionDetails,
  record_corrections: recordCorrectionsDetails,
  record_resubmittal: recordResubmittalDetails,
  record_permit: recordPermitDetails,
} as const satisfies Partial<Record<WorkflowAction, z.ZodType>>
export type PaperworkAction = keyof typeof SUBMISSION_STEP_DETAILS
export const PAPERWORK_ACTIONS = Object.keys(SUBMISSION_STEP_DETAILS) as PaperworkAction[]
export const isPaperworkAction = (action: WorkflowAction): action is PaperworkAction => action in SUBMISSION_STEP_DETAILS
export type RecordSubmissionDetails = z.infer<typeof recordSubmissionDetails>
export type RecordCorrectionsDetails = z.infer<typeof recordCorrectionsDetails>
export type RecordResubmittalDetails = z.infer<typeof recordResubmittalDetails>
export type RecordPermitDetails = z.infer<typeof recordPermitDetails>

/**
 * What the paperwork steps (record_submission, record_corrections, record_resubmittal, record_permit)
 * take beyond the step itself: any object here; the step's own schema (SUBMISSION_STEP_DETAILS) checks
 * it for the action taken, so a missing or foreign field is named as `submission.<field>`.
 */
export const submissionStepBody = z.record(z.string(), z.unknown()).describe('Per action: record_submission {method, submittedOn, ahjReference?, feeAmount?, feeDueOn?}; record_corrections {letterFileId, receivedOn, responseDueOn, items[]}; record_resubmittal {resubmittedOn}; record_permit {permitNumber, issuedOn, expiresOn?, inspectionOn?}')
export type SubmissionStepBody = z.infer<typeof submissionStepBody>

/** A stored file as a submission shows it. */
export const submissionFileDto = z.object({ id: z.uuid(), name: z.string(), mediaType: z.string(), byteSize: z.number().int() })
export type SubmissionFileDto = z.infer<typeof submissionFileDto>

export const correctionItemDto = z.object({ text: z.string(), done: z.boolean() })
export const correctionLetterDto = z.object({
  id: z.uuid(),
  /** 1 for the AHJ's first letter, 2 for the letter after the first resubmittal, … */
  round: z.number().int(),
  receivedOn: z.iso.date(),
  responseDueOn: z.iso.date(),
  letter: submissionFileDto,
  items: z.array(correctionItemDto),
  resubmittedOn: z.iso.date().nullable(),
})
export type CorrectionLetterDto = z.infer<typeof correctionLetterDto>

/** One submission of one stamped revision to the AHJ, with its corrections rounds and the permit. */
export const submissionDto = z.object({
  id: z.uuid(),
  projectId: z.uuid(),
  revision: z.object({ id: z.uuid(), number: z.number().int() }),
  method: z.enum(SUBMISSION_METHODS),
  submittedOn: z.iso.date(),
  ahjReference: z.string().nullable(),
  /** The fee in cents, and the same amount as people read it (`1,234.50`, no currency). */
  feeCents: z.number().int().nullable(),
  feeAmount: z.string().nullable(),
  feeDueOn: z.iso.date().nullable(),
  feePaidOn: z.iso.date().nullable(),
  feeReceipt: submissionFileDto.nullable(),
  letters: z.array(correctionLetterDto),
  permitNumber: z.string().nullable(),
  permitIssuedOn: z.iso.date().nullable(),
  permitExpiresOn: z.iso.date().nullable(),
  inspectionOn: z.iso.date().nullable(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
  version: z.number().int(),
})
export type SubmissionDto = z.infer<typeof submissionDto>

/** How far ahead the home page and the daily digest look for due items [days]. Ours (common practice, no source). */
export const DUE_SOON_DAYS = 7

/** What a coordinator has to act on by a date: shown on the home page and in the daily digest. */
export const DUE_ITEM_KINDS = ['corrections_response', 'fee_payment', 'inspection', 'permit_expiry'] as const
export type DueItemKind = (typeof DUE_ITEM_KINDS)[number]
export const dueItemDto = z.object({
  projectId: z.uuid(),
  projectCode: z.string(),
  projectName: z.string(),
  jurisdiction: z.string().nullable(),
  kind: z.enum(DUE_ITEM_KINDS),
  /** One line for people, e.g. "Answer the AHJ's corrections (3 items)". */
  summary: z.string(),
  dueOn: z.iso.date(),
  overdue: z.boolean(),
})
export type DueItemDto = z.infer<typeof dueItemDto>

/** `GET /api/projects/:id/submission`: the current submission (of the newest stamped revision submitted), earlier ones, and what is due. */
export const projectSubmissionDto = z.object({
  submission: submissionDto.nullable(),
  earlier: z.array(submissionDto),
  due: z.array(dueItemDto),
})
export type ProjectSubmissionDto = z.infer<typeof projectSubmissionDto>

/** `PATCH /api/projects/:id/submission`: paperwork that is no workflow step, at the version read. null clears a field. */
export const updateSubmissionBody = z
  .object({
    version: z.number().int().min(1),
    ahjReference: text(80).nullable(),
    feeAmount: feeAmount.nullable(),
    feeDueOn: date.nullable(),
    feePaidOn: date.nullable(),
    feeReceiptFileId: z.uuid({ message: 'must be the id of an uploaded fee receipt' }).nullable(),
    permitExpiresOn: date.nullable(),
    inspectionOn: date.nullable(),
    /** Ticks or unticks items of correction letters. */
    correctionItems: z.array(z.object({ letterId: z.uuid(), index: z.number().int().min(0), done: z.boolean() }).strict()).max(500),
  })
  .partial()
  .required({ version: true })
  .strict()
export type UpdateSubmissionBody = z.infer<typeof updateSubmissionBody>

/** `POST …/submission/letters` and `…/receipt`: the stored file, to name in the step or the edit. */
export const uploadedFileDto = z.object({ file: submissionFileDto })

const statusList = z
  .union([z.enum(BOARD_STATUSES), z.array(z.enum(BOARD_STATUSES))])
  .transform((v) => (Array.isArray(v) ? v : [v]))

export const BOARD_SORTS = ['code', '-code', 'name', '-name', 'status', '-status', 'nextDueOn', '-nextDueOn', 'submittedOn', '-submittedOn'] as const

/** `GET /api/submissions` (and `.csv`): projects from stamped on. */
export const submissionBoardQuery = pageQuery(BOARD_SORTS).extend({
  /** One or more statuses (`status=submitted&status=resubmitted`); all board statuses when left out. */
  status: statusList.optional(),
  jurisdictionId: z.uuid().optional(),
  /** Only projects with something due on or before this date (overdue ones included). */
  dueBefore: date.optional(),
})
export type SubmissionBoardQuery = z.infer<typeof submissionBoardQuery>

/** One project on the board. */
export const boardRowDto = z.object({
  project: z.object({
    id: z.uuid(),
    code: z.string(),
    name: z.string(),
    status: z.enum(PROJECT_STATUSES),
    jurisdiction: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  }),
  submission: z
    .object({
      method: z.enum(SUBMISSION_METHODS),
      submittedOn: z.iso.date(),
      ahjReference: z.string().nullable(),
      permitNumber: z.string().nullable(),
      openCorrectionItems: z.number().int(),
    })
    .nullable(),
  /** The earliest date something is due (see dueItemDto), null for nothing due. */
  nextDueOn: z.iso.date().nullable(),
  overdue: z.boolean(),
})
export type BoardRowDto = z.infer<typeof boardRowDto>
