import { In, IsNull, type DataSource, type EntityManager } from 'typeorm'
import type { CommentAnchor, CreateCommentBody, ReplyBody, ReviewCommentDto, ReviewCommentListDto } from '../../shared/schemas/review'
import type { ProjectStatus } from '../../shared/schemas/project'
import { STATUS_LABELS } from '../../shared/workflow'
import type { AuthUser } from '../auth/auth-user'
import { PlanSetRevisionEntity, ReviewCommentEntity, ReviewReplyEntity, UserEntity, type Project, type ReviewComment } from '../entities'
import { conflict, notFound, unprocessable } from '../http/errors'
import type { AuditService } from './audit-service'
import type { ProjectService } from './project-service'
import type { WorkflowService } from './workflow-service'

/** A review is open while the set is with the reviewer or back with the designer; after approval the thread is history. */
const DISCUSSION_STATUSES: readonly ProjectStatus[] = ['in_review', 'changes_requested']

const anchorOf = (c: ReviewComment): CommentAnchor =>
  c.anchorKind === 'sheet' ? { kind: 'sheet', sheetId: c.anchorRef! } : c.anchorKind === 'circuit' ? { kind: 'circuit', circuitId: c.anchorRef! } : { kind: 'general' }

/**
 * The conversation of a review: the reviewer pins comments to a circuit, a sheet or the whole set of
 * the revision under review; the designer answers in the thread and marks them resolved; the
 * reviewer may reopen one. Approval waits until none is open.
 */
export class ReviewService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly projects: ProjectService,
    private readonly workflow: WorkflowService,
  ) {
    workflow.onGuard('approve_and_stamp', async (manager, step) => {
      const open = await manager.getRepository(ReviewCommentEntity).countBy({ projectId: step.project.id, resolvedAt: IsNull() })
      if (open) {
        throw conflict(`${open} review comment${open === 1 ? ' is' : 's are'} still open; resolve ${open === 1 ? 'it' : 'them'} or request changes`, [
          { field: 'comments', message: `${open} open` },
        ])
      }
    })
  }

  async list(organizationId: string, projectId: string): Promise<ReviewCommentListDto> {
    await this.projects.getOwned(organizationId, projectId)
    const comments = await this.db.getRepository(ReviewCommentEntity).find({ where: { projectId, organizationId }, order: { createdAt: 'DESC', id: 'ASC' } })
    const items = await this.toDtos(comments)
    const open = items.filter((c) => !c.resolved)
    return { items: [...open, ...items.filter((c) => c.resolved)], open: open.length }
  }

  private async toDtos(comments: ReviewComment[], manager: EntityManager = this.db.manager): Promise<ReviewCommentDto[]> {
    if (!comments.length) return []
    const replies = await manager.getRepository(ReviewReplyEntity).find({ where: { commentId: In(comments.map((c) => c.id)) }, order: { createdAt: 'ASC', id: 'ASC' } })
    const userIds = [...new Set([...comments.flatMap((c) => [c.authorId, c.resolvedBy]), ...replies.map((r) => r.authorId)].filter((v) => v !== null))]
    const users = userIds.length ? await manager.getRepository(UserEntity).find({ select: { id: true, name: true, role: true }, where: { id: In(userIds) } }) : []
    const revisions = await manager.getRepository(PlanSetRevisionEntity).find({ select: { id: true, number: true }, where: { id: In([...new Set(comments.map((c) => c.revisionId))]) } })
    const person = (id: string | null) => {
      const u = users.find((x) => x.id === id)
      return u ? { id: u.id, name: u.name, role: u.role } : null
    }
    return comments.map((c) => ({
      id: c.id,
      projectId: c.projectId,
      revision: { id: c.revisionId, number: revisions.find((r) => r.id === c.revisionId)!.number },
      anchor: anchorOf(c),
      body: c.body,
      author: person(c.authorId),
      createdAt: c.createdAt.toISOString(),
      resolved: c.resolvedAt ? { at: c.resolvedAt.toISOString(), by: person(c.resolvedBy) } : null,
      replies: replies.filter((r) => r.commentId === c.id).map((r) => ({ id: r.id, body: r.body, author: person(r.authorId), createdAt: r.createdAt.toISOString() })),
    }))
  }

  /** 409 unless the review is open; the assigned reviewer alone speaks for the review side. */
  private checkOpen(actor: AuthUser, project: Project): void {
    if (!DISCUSSION_STATUSES.includes(project.status)) {
      throw conflict(`Review comments are open while the project is In review or Changes requested; it is ${STATUS_LABELS[project.status]}`)
    }
    if (actor.role === 'reviewer' && project.reviewerId && project.reviewerId !== actor.id) {
      throw conflict('Another reviewing electrician is assigned to this project', [{ field: 'reviewerId', message: 'is another reviewer' }])
    }
  }

  /** The reviewer pins a comment to the revision under review (409 outside review; 422 for a circuit the revision does not have). */
  async create(actor: AuthUser, projectId: string, body: CreateCommentBody): Promise<ReviewCommentDto> {
    return this.db.transaction(async (manager) => {
      const project = await this.projects.getOwned(actor.organizationId, projectId, manager)
      this.checkOpen(actor, project)
      if (project.status !== 'in_review') throw conflict('New comments are written while the set is In review; the designer has it now')
      const revision = await this.workflow.revisionInWorkflow(manager, project.id)
      if (!revision) throw conflict('No revision is under review')
      if (body.anchor.kind === 'circuit') {
        const known = [...revision.evaluation.runs.map((r) => r.id), ...revision.designSnapshot.topology.strings.map((s) => s.id)]
        if (!known.includes(body.anchor.circuitId)) {
          throw unprocessable(`Revision ${revision.number} has no run or string ${body.anchor.circuitId}`, [{ field: 'anchor.circuitId', message: `must be one of ${known.slice(0, 20).join(', ')}` }])
        }
      }
      const anchorRef = body.anchor.kind === 'sheet' ? body.anchor.sheetId : body.anchor.kind === 'circuit' ? body.anchor.circuitId : null
      const comment = await manager.getRepository(ReviewCommentEntity).save({
        organizationId: actor.organizationId, projectId, revisionId: revision.id, anchorKind: body.anchor.kind, anchorRef, body: body.body, authorId: actor.id, resolvedAt: null, resolvedBy: null,
      })
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: 'review.commented', entityType: 'project', entityId: projectId, data: { commentId: comment.id, revisionNumber: revision.number, anchor: body.anchor } }, manager)
      return (await this.toDtos([comment], manager))[0]!
    })
  }

  private async comment(manager: EntityManager, actor: AuthUser, projectId: string, commentId: string): Promise<{ project: Project; comment: ReviewComment }> {
    const project = await this.projects.getOwned(actor.organizationId, projectId, manager)
    const comment = /^[0-9a-f-]{36}$/i.test(commentId) ? await manager.getRepository(ReviewCommentEntity).findOneBy({ id: commentId, projectId, organizationId: actor.organizationId }) : null
    if (!comment) throw notFound('Review comment')
    return { project, comment }
  }

  async reply(actor: AuthUser, projectId: string, commentId: string, body: ReplyBody): Promise<ReviewCommentDto> {
    return this.db.transaction(async (manager) => {
      const { project, comment } = await this.comment(manager, actor, projectId, commentId)
      this.checkOpen(actor, project)
      await manager.getRepository(ReviewReplyEntity).save({ organizationId: actor.organizationId, commentId, body: body.body, authorId: actor.id })
      return (await this.toDtos([comment], manager))[0]!
    })
  }

  /** Resolving (designer, administrator or the reviewer) or reopening (the reviewer, not satisfied). */
  async setResolved(actor: AuthUser, projectId: string, commentId: string, resolved: boolean): Promise<ReviewCommentDto> {
    return this.db.transaction(async (manager) => {
      const { project, comment } = await this.comment(manager, actor, projectId, commentId)
      this.checkOpen(actor, project)
      if (resolved === (comment.resolvedAt !== null)) throw conflict(resolved ? 'This comment is already resolved' : 'This comment is already open')
      const changes = resolved ? { resolvedAt: new Date(), resolvedBy: actor.id } : { resolvedAt: null, resolvedBy: null }
      const updated = await manager.getRepository(ReviewCommentEntity).update({ id: comment.id, resolvedAt: resolved ? IsNull() : comment.resolvedAt! }, changes)
      if (updated.affected !== 1) throw conflict('Someone changed this comment meanwhile; reload it')
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: resolved ? 'review.resolved' : 'review.reopened', entityType: 'project', entityId: projectId, data: { commentId } }, manager)
      return (await this.toDtos([{ ...comment, ...changes }], manager))[0]!
    })
  }
}
