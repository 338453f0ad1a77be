import { z } from 'zod'

/** Review comments on a plan-set revision: pinned to a circuit, a sheet or the set as a whole. */

/** A sheet of the plan set (`E-601`, `E-602.3`) or an attached datasheet (`ATT-B`). */
export const SHEET_ID_PATTERN = /^(?:[A-Z]-\d{3}(?:\.\d{1,3})?|ATT-[A-Z]{1,3})$/

export const commentAnchor = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('general') }).strict(),
  z.object({ kind: z.literal('sheet'), sheetId: z.string().trim().regex(SHEET_ID_PATTERN, 'must be a sheet id such as E-601, E-602.2 or ATT-A') }).strict(),
  /** A conductor run or a PV string of the revision's design, by its id (`R3`, `S1`). */
  z.object({ kind: z.literal('circuit'), circuitId: z.string().trim().min(1, 'must name a run or string').max(80, 'must be at most 80 characters') }).strict(),
], { message: 'must be {kind: "general"}, {kind: "sheet", sheetId} or {kind: "circuit", circuitId}' })
export type CommentAnchor = z.infer<typeof commentAnchor>

const commentText = z.string().trim().min(1, 'must not be empty').max(4000, 'must be at most 4000 characters')

export const createCommentBody = z.object({ anchor: commentAnchor, body: commentText }).strict()
export type CreateCommentBody = z.infer<typeof createCommentBody>

export const replyBody = z.object({ body: commentText }).strict()
export type ReplyBody = z.infer<typeof replyBody>

const author = z.object({ id: z.string(), name: z.string(), role: z.string() }).nullable()

export const commentReplyDto = z.object({ id: z.uuid(), body: z.string(), author, createdAt: z.iso.datetime() })

export const reviewCommentDto = z.object({
  id: z.uuid(),
  projectId: z.uuid(),
  /** The revision under review when the comment was written. */
  revision: z.object({ id: z.uuid(), number: z.number().int() }),
  anchor: commentAnchor,
  body: z.string(),
  author,
  createdAt: z.iso.datetime(),
  resolved: z.object({ at: z.iso.datetime(), by: author }).nullable(),
  /** Oldest first. */
  replies: z.array(commentReplyDto),
})
export type ReviewCommentDto = z.infer<typeof reviewCommentDto>

/** `GET /api/projects/:id/review-comments`: every comment of the project, open ones first, then newest first. */
export const reviewCommentListDto = z.object({ items: z.array(reviewCommentDto), open: z.number().int() })
export type ReviewCommentListDto = z.infer<typeof reviewCommentListDto>
