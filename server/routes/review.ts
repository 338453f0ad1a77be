import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import { createCommentBody, replyBody, reviewCommentDto, reviewCommentListDto } from '../../shared/schemas/review'
import { Reply, route } from '../http/route'

const projectParams = z.object({ id: z.string() })
const commentParams = z.object({ id: z.string(), commentId: z.string() })
const oneComment = z.object({ comment: reviewCommentDto })

export const reviewRoutes = [
  route({
    method: 'get',
    path: '/api/projects/:id/review-comments',
    access: ANY_ROLE,
    summary: 'Review comments of the project with their replies, open ones first',
    params: projectParams,
    response: reviewCommentListDto,
    handler: ({ user, params, services }) => services.reviews.list(user!.organizationId, params.id),
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/review-comments',
    access: ['reviewer'],
    summary: 'Pin a comment to the revision under review: the whole set, a sheet or a circuit (409 outside review)',
    params: projectParams,
    body: createCommentBody,
    response: oneComment,
    handler: async ({ user, params, body, services }) => new Reply(201, { comment: await services.reviews.create(user!, params.id, body) }),
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/review-comments/:commentId/replies',
    access: ['designer', 'reviewer', 'admin'],
    summary: 'Answer in a comment’s thread while the review is open',
    params: commentParams,
    body: replyBody,
    response: oneComment,
    handler: async ({ user, params, body, services }) => new Reply(201, { comment: await services.reviews.reply(user!, params.id, params.commentId, body) }),
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/review-comments/:commentId/resolve',
    access: ['designer', 'reviewer', 'admin'],
    summary: 'Mark a comment resolved (409 when it already is)',
    params: commentParams,
    response: oneComment,
    handler: async ({ user, params, services }) => ({ comment: await services.reviews.setResolved(user!, params.id, params.commentId, true) }),
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/review-comments/:commentId/reopen',
    access: ['reviewer'],
    summary: 'Reopen a resolved comment the reviewer is not satisfied with',
    params: commentParams,
    response: oneComment,
    handler: async ({ user, params, services }) => ({ comment: await services.reviews.setResolved(user!, params.id, params.commentId, false) }),
  }),
]
