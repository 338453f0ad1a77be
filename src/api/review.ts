import type { Evaluation } from '@shared/electrical/evaluate'
import type { DesignDocument } from '@shared/schemas/design'
import type { CreateCommentBody, ReplyBody, ReviewCommentDto, ReviewCommentListDto } from '@shared/schemas/review'
import { api } from './client'

const at = (projectId: string) => `/projects/${encodeURIComponent(projectId)}`
const commentAt = (projectId: string, commentId: string) => `${at(projectId)}/review-comments/${encodeURIComponent(commentId)}`
const revisionFile = (projectId: string, number: number, name: string) => `${at(projectId)}/revisions/${number}/files/${name}`
const oneComment = (answer: { comment: ReviewCommentDto }) => answer.comment

export const reviewApi = {
  /** Every comment of the project, open ones first, with the count of open ones. */
  comments: (projectId: string) => api.get<ReviewCommentListDto>(`${at(projectId)}/review-comments`),
  /** Reviewer only, while in review; 422 names `anchor.circuitId` for a circuit the revision lacks. */
  comment: (projectId: string, body: CreateCommentBody) => api.post<{ comment: ReviewCommentDto }>(`${at(projectId)}/review-comments`, body).then(oneComment),
  reply: (projectId: string, commentId: string, body: ReplyBody) =>
    api.post<{ comment: ReviewCommentDto }>(`${commentAt(projectId, commentId)}/replies`, body).then(oneComment),
  resolve: (projectId: string, commentId: string) => api.post<{ comment: ReviewCommentDto }>(`${commentAt(projectId, commentId)}/resolve`).then(oneComment),
  reopen: (projectId: string, commentId: string) => api.post<{ comment: ReviewCommentDto }>(`${commentAt(projectId, commentId)}/reopen`).then(oneComment),
  /** The engine's evaluation as the revision was issued with it. */
  calculations: (projectId: string, number: number) => api.get<Evaluation>(revisionFile(projectId, number, 'calculations.json')),
  /** The design document the revision was drawn from (its strings are circuits a comment may name). */
  design: (projectId: string, number: number) => api.get<DesignDocument>(revisionFile(projectId, number, 'design.json')),
}
