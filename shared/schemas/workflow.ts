import { z } from 'zod'
import { TIMELINE_EVENTS, WORKFLOW_ACTIONS } from '../workflow'
import { PROJECT_STATUSES, projectDto } from './project'
import { stampStepBody } from './stamp'
import { submissionStepBody } from './submission'

/** Request and response shapes of the permit-set workflow, shared by client and server. */

/** `POST /api/projects/:id/transitions`. */
export const transitionBody = z
  .object({
    action: z.enum(WORKFLOW_ACTIONS),
    note: z.string().trim().max(2000, 'must be at most 2000 characters').optional().describe('Why: what to change, what the AHJ asked, the reference or permit number'),
    revisionNumber: z.number().int().min(0).optional().describe('request_review only: the plan-set revision to review; the newest one when left out'),
    version: z.number().int().min(1).describe('The project version read; a stale one answers 409'),
    stamp: stampStepBody.optional().describe('approve_and_stamp only: what signing the plan set needs'),
    submission: submissionStepBody.optional().describe('the paperwork steps only: dates, references and documents of the submission'),
  })
  .strict()
export type TransitionBody = z.infer<typeof transitionBody>

/** One row of a project's timeline. */
export const timelineEntryDto = z.object({
  id: z.uuid(),
  event: z.enum(TIMELINE_EVENTS),
  from: z.enum(PROJECT_STATUSES),
  to: z.enum(PROJECT_STATUSES),
  note: z.string().nullable(),
  actor: z.object({ id: z.string(), name: z.string(), role: z.string() }).nullable(),
  /** The plan-set revision the step concerns (under review, stamped, submitted). */
  revision: z.object({ id: z.uuid(), number: z.number().int() }).nullable(),
  createdAt: z.iso.datetime(),
})
export type TimelineEntryDto = z.infer<typeof timelineEntryDto>

export const transitionResultDto = z.object({ project: projectDto, transition: timelineEntryDto })
export type TransitionResultDto = z.infer<typeof transitionResultDto>

/** `GET /api/projects/:id/timeline`: newest first. */
export const timelineDto = z.object({ items: z.array(timelineEntryDto) })
export type TimelineDto = z.infer<typeof timelineDto>
