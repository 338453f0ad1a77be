import { z } from 'zod'
import { NEC_EDITIONS } from '../electrical/types'
import { revisionStampDto } from './stamp'

/**
 * Plan-set revisions and the background jobs that generate them: request and response shapes
 * shared by the client and the server. A revision is immutable once published; generating again
 * makes the next number.
 */

export const PACKAGE_JOB_STATES = ['queued', 'running', 'failed', 'completed'] as const
export type PackageJobState = (typeof PACKAGE_JOB_STATES)[number]

/** The steps of one generation, in order; the job reports the one it is on. */
export const PACKAGE_STEPS = ['queued', 'evaluating', 'drawing', 'attachments', 'labels', 'packing', 'publishing', 'done'] as const
export type PackageStep = (typeof PACKAGE_STEPS)[number]

/** What the progress bar says for each step. */
export const PACKAGE_STEP_LABELS: Record<PackageStep, string> = {
  queued: 'Waiting for a worker',
  evaluating: 'Running the calculations',
  drawing: 'Drawing the sheets',
  attachments: 'Merging equipment datasheets',
  labels: 'Writing the label sheet',
  packing: 'Packing the submission zip',
  publishing: 'Publishing the revision',
  done: 'Done',
}

/** Files of the submission zip, in the order they are packed. */
export const PACKAGE_FILE_NAMES = ['plan-set.pdf', 'single-line.svg', 'calculations.csv', 'calculations.json', 'labels.pdf', 'design.json', 'manifest.json'] as const

export const createRevisionBody = z.object({
  /** One line for the revision table on every sheet, e.g. "Issued for permit". */
  description: z.string().trim().min(1, 'must say what this revision is for').max(80, 'must fit the revision table: at most 80 characters'),
})
export type CreateRevisionBody = z.infer<typeof createRevisionBody>

const personRef = z.object({ id: z.string(), name: z.string() }).nullable()

export const packageJobDto = z.object({
  id: z.string(),
  projectId: z.string(),
  state: z.enum(PACKAGE_JOB_STATES),
  step: z.enum(PACKAGE_STEPS),
  /** 0–100. */
  progress: z.number().min(0).max(100),
  /** Why the last attempt failed, in words for the designer; null unless failed. */
  error: z.string().nullable(),
  attempts: z.number().int(),
  description: z.string(),
  designVersion: z.number().int(),
  revisionId: z.string().nullable(),
  revisionNumber: z.number().int().nullable(),
  requestedBy: personRef,
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type PackageJobDto = z.infer<typeof packageJobDto>

export const packageFileDto = z.object({ name: z.string(), bytes: z.number().int(), sha256: z.string(), mediaType: z.string() })
export type PackageFileDto = z.infer<typeof packageFileDto>

export const revisionDto = z.object({
  id: z.string(),
  projectId: z.string(),
  number: z.number().int().min(0),
  description: z.string(),
  createdAt: z.string(),
  createdBy: personRef,
  designVersion: z.number().int(),
  engineVersion: z.string(),
  necEdition: z.literal(NEC_EDITIONS),
  evaluationStatus: z.enum(['pass', 'warn', 'fail', 'info']),
  sheetSize: z.string(),
  /** `<project-code>_rev<NN>.zip`. */
  packageName: z.string(),
  packageBytes: z.number().int(),
  packageSha256: z.string(),
  /** The files inside the zip, as the manifest lists them. */
  files: z.array(packageFileDto),
  sheetCount: z.number().int(),
  /** The licensed reviewer's stamp; null until stamped. A stamped revision serves the signed files. */
  stamp: revisionStampDto.nullable(),
})
export type RevisionDto = z.infer<typeof revisionDto>

export const revisionListDto = z.object({ items: z.array(revisionDto), activeJob: packageJobDto.nullable() })

// ---------------------------------------------------------------------------------------------
// Difference report between two revisions

export const DIFF_AREAS = ['project', 'code_basis', 'equipment', 'strings', 'conductors', 'ocpd', 'interconnection', 'results'] as const
export type DiffArea = (typeof DIFF_AREAS)[number]

export const diffChangeDto = z.object({
  kind: z.enum(['added', 'removed', 'changed']),
  /** What changed, e.g. "Run R3 (INV1 → MSP)" or "Inverter INV1". */
  subject: z.string(),
  /** The field in words, e.g. "conductor size"; null for a whole item added or removed. */
  field: z.string().nullable(),
  before: z.string().nullable(),
  after: z.string().nullable(),
})
export type DiffChange = z.infer<typeof diffChangeDto>

export const revisionDiffDto = z.object({
  from: z.number().int(),
  to: z.number().int(),
  /** One paragraph for an AHJ resubmittal letter. */
  summary: z.string(),
  groups: z.array(z.object({ area: z.enum(DIFF_AREAS), title: z.string(), changes: z.array(diffChangeDto) })),
})
export type RevisionDiff = z.infer<typeof revisionDiffDto>

export const compareQuery = z.object({
  from: z.coerce.number().int().min(0, 'must be a revision number'),
  to: z.coerce.number().int().min(0, 'must be a revision number'),
})
