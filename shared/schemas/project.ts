import { z } from 'zod'
import type { Evaluation } from '../electrical/evaluate'
import { NEC_EDITIONS, type Status } from '../electrical/types'
import { systemKindSchema, type DesignDocument } from './design'
import { pageQuery } from './paging'

/** Request and response shapes of projects, shared by client and server. */

/** States of a permit set, in workflow order (see the architecture guide). New projects start in `draft`. */
export const PROJECT_STATUSES = [
  'draft',
  'in_review',
  'changes_requested',
  'stamped',
  'submitted',
  'ahj_corrections',
  'resubmitted',
  'permit_issued',
  'closed',
  'withdrawn',
] as const
export type ProjectStatus = (typeof PROJECT_STATUSES)[number]

const text = (max: number) => z.string().trim().min(1, 'must not be empty').max(max)
const optionalText = (max: number) => z.string().trim().max(max).nullable()
const uuid = z.uuid({ message: 'must be an id from this organisation' })

const projectFields = {
  /** Short code, unique in the organisation; used in submission file names. */
  code: z.string().trim().regex(/^[A-Za-z0-9-]{1,24}$/, 'must be 1–24 letters, digits or "-"'),
  name: text(120),
  customerName: text(120),
  customerEmail: z.email({ message: 'must be an e-mail address' }).max(254).nullable(),
  customerPhone: z.string().trim().regex(/^[0-9+()./ -]{5,40}$/, 'must be a phone number (digits, spaces, + ( ) - . /)').nullable(),
  siteAddress: text(200),
  siteCity: text(120),
  jurisdictionId: uuid.nullable(),
  utility: optionalText(120),
  systemKind: systemKindSchema,
  designerId: uuid.nullable(),
  reviewerId: uuid.nullable(),
  coordinatorId: uuid.nullable(),
  /** Date the set should go to the AHJ (YYYY-MM-DD). */
  targetSubmissionDate: z.iso.date({ message: 'must be a date as YYYY-MM-DD' }).nullable(),
}

/** A new project; the optional fields are null when left out. */
export const createProjectBody = z
  .object(projectFields)
  .partial({
    customerEmail: true, customerPhone: true, jurisdictionId: true, utility: true,
    designerId: true, reviewerId: true, coordinatorId: true, targetSubmissionDate: true,
  })
  .strict()
export type CreateProjectBody = z.infer<typeof createProjectBody>

/** A change to a project: any of its fields plus the version it was read at. */
export const updateProjectBody = z
  .object(projectFields)
  .partial()
  .extend({ version: z.number().int().min(1) })
  .strict()
export type UpdateProjectBody = z.infer<typeof updateProjectBody>

/** Archive or restore: the version the caller last read. */
export const versionBody = z.object({ version: z.number().int().min(1) }).strict()

export const PROJECT_SORTS = [
  'code', '-code', 'name', '-name', 'customerName', '-customerName', 'status', '-status',
  'targetSubmissionDate', '-targetSubmissionDate', 'createdAt', '-createdAt', 'updatedAt', '-updatedAt',
] as const

const booleanQuery = z.enum(['true', 'false']).transform((v) => v === 'true')

export const projectListQuery = pageQuery(PROJECT_SORTS).extend({
  status: z.enum(PROJECT_STATUSES).optional(),
  systemKind: systemKindSchema.optional(),
  jurisdictionId: z.uuid().optional(),
  /** Projects where this user is the designer, reviewer or coordinator. */
  assigneeId: z.uuid().optional(),
  /** false (default): open projects only; true: archived only. */
  archived: booleanQuery.default(false),
})
export type ProjectListQuery = z.infer<typeof projectListQuery>

/** Outcomes the engine gives a check or a whole evaluation (`Status` of the engine). */
export const EVALUATION_STATUSES = ['pass', 'warn', 'fail', 'info'] as const satisfies readonly Status[]

const timestamp = z.iso.datetime()
const personRef = z.object({ id: z.string(), name: z.string() })
export type PersonRef = z.infer<typeof personRef>

/** A project as the API answers it. */
export const projectDto = z.object({
  id: z.uuid(),
  code: z.string(),
  name: z.string(),
  customerName: z.string(),
  customerEmail: z.string().nullable(),
  customerPhone: z.string().nullable(),
  siteAddress: z.string(),
  siteCity: z.string(),
  jurisdiction: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  utility: z.string().nullable(),
  systemKind: systemKindSchema,
  status: z.enum(PROJECT_STATUSES),
  designer: personRef.nullable(),
  reviewer: personRef.nullable(),
  coordinator: personRef.nullable(),
  targetSubmissionDate: z.iso.date().nullable(),
  /** The working design: its version and the status of its last evaluation if made for that version; null before one is saved. */
  design: z.object({ version: z.number().int(), evaluationStatus: z.enum(EVALUATION_STATUSES).nullable() }).nullable(),
  archivedAt: timestamp.nullable(),
  createdAt: timestamp,
  updatedAt: timestamp,
  version: z.number().int(),
})
export type ProjectDto = z.infer<typeof projectDto>

/** `GET /api/projects/:id/general-notes`. */
export const generalNotesDto = z.object({ jurisdictionId: z.uuid().nullable(), notes: z.string() })

// ---------------------------------------------------------------------------------------------
// The working design of a project

/** `PUT /api/projects/:id/design`: the version read (null for the first design) and the document. */
export const saveDesignBody = z
  .object({
    version: z.number().int().min(1).nullable().describe('The design version read; null to save the first design of the project'),
    document: z.record(z.string(), z.unknown()).describe('The design document (docs/design-document.md), validated by the engine'),
  })
  .strict()
export type SaveDesignBody = z.infer<typeof saveDesignBody>

/** A project's working design as the API answers it. */
export const designDto = z.object({
  projectId: z.uuid(),
  document: z.custom<DesignDocument>((v) => typeof v === 'object' && v !== null).describe('The design document (docs/design-document.md)'),
  systemKind: systemKindSchema,
  necEdition: z.literal(NEC_EDITIONS),
  moduleCount: z.number().int(),
  /** Module nameplate power at STC [W]. */
  dcWattsStc: z.number(),
  /** The last server evaluation; `current` is false once the design changed after it. */
  lastEvaluation: z
    .object({ status: z.enum(EVALUATION_STATUSES), evaluatedAt: timestamp, forVersion: z.number().int(), current: z.boolean() })
    .nullable(),
  createdAt: timestamp,
  updatedAt: timestamp,
  version: z.number().int(),
})
export type DesignDto = z.infer<typeof designDto>

/** Answer of `POST /api/projects/:id/design/evaluate`: the engine's result for the stored design version. */
export const designEvaluationDto = z.object({
  designVersion: z.number().int(),
  evaluation: z.custom<Evaluation>((v) => typeof v === 'object' && v !== null).describe('The engine\u2019s Evaluation (shared/electrical/evaluate.ts), with the caution'),
})
export type DesignEvaluationDto = z.infer<typeof designEvaluationDto>
