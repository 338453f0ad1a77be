import { In, type DataSource, type EntityManager } from 'typeorm'
import type { ProjectStatus } from '../../shared/schemas/project'
import type { TimelineEntryDto, TransitionBody, TransitionResultDto } from '../../shared/schemas/workflow'
import { ACTION_RULES, decideTransition, licenceProblems, STAMP_LOCKED_STATUSES, STATUS_LABELS, type TimelineEvent } from '../../shared/workflow'
import type { AuthUser } from '../auth/auth-user'
import { DesignEntity, PlanSetRevisionEntity, ProjectEntity, ProjectTransitionEntity, UserEntity, type PlanSetRevision, type Project, type ProjectTransition } from '../entities'
import { conflict, unprocessable, versionConflict } from '../http/errors'
import type { AuditService } from './audit-service'
import type { ProjectService } from './project-service'
import { updateAtVersion } from './rows'

const WHAT = 'Project'
const todayUtc = () => new Date().toISOString().slice(0, 10)

/**
 * Moves projects through the permit-set workflow: the state machine of shared/workflow decides,
 * this service checks what the table cannot see (revisions, licences), writes the step to the
 * timeline and the audit log, and answers 409 or 422 with the reason.
 */
export class WorkflowService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly projects: ProjectService,
    /** Today as YYYY-MM-DD, for licence expiry. */
    private readonly today: () => string = todayUtc,
  ) {}

  async transition(actor: AuthUser, projectId: string, body: TransitionBody): Promise<TransitionResultDto> {
    return this.db.transaction(async (manager) => {
      const project = await this.projects.getOwned(actor.organizationId, projectId, manager)
      if (project.version !== body.version) throw versionConflict(WHAT, project, { current: await this.projects.toDto(project, manager) })
      if (project.archivedAt) throw conflict('This project is archived; restore it before moving it on')
      const decision = decideTransition(project.status, body.action, actor.role)
      if (!decision.allowed) throw conflict(decision.reason, [{ field: 'action', message: decision.reason }])
      if (actor.role === 'reviewer' && project.reviewerId && project.reviewerId !== actor.id) {
        // the electrician named on the project judges it; reassign the project to hand it to another
        throw conflict('Another reviewing electrician is assigned to this project; reassign it before taking this step', [{ field: 'reviewerId', message: 'is another reviewer' }])
      }
      const note = body.note || null
      if (ACTION_RULES[body.action].noteRequired && !note) {
        throw unprocessable(`“${ACTION_RULES[body.action].label}” needs a note saying why`, [{ field: 'note', message: 'is required for this step' }])
      }
      if (body.revisionNumber !== undefined && body.action !== 'request_review') {
        throw unprocessable('Only a request for review names a revision', [{ field: 'revisionNumber', message: `is not taken by ${body.action}` }])
      }
      const revision = body.action === 'request_review'
        ? await this.revisionForReview(manager, project, body.revisionNumber)
        : await this.revisionInWorkflow(manager, project.id)
      if (body.action === 'approve_and_stamp') await this.approveAndStamp(manager, actor, project, revision)

      const moved = await updateAtVersion(manager, ProjectEntity, { organizationId: actor.organizationId, id: project.id, version: body.version }, { status: decision.to }, WHAT, async (current) => ({
        current: await this.projects.toDto(current, manager),
      }))
      const row = await this.record(manager, actor, project, body.action, decision.to, note, revision)
      return { project: await this.projects.toDto(moved, manager), transition: (await this.toDtos([row], manager))[0]! }
    })
  }

  /**
   * The revision a request for review hands over: the one named, or the newest; either way drawn
   * from the design as it is now, or the reviewer would judge a set that no longer matches it.
   */
  private async revisionForReview(manager: EntityManager, project: Project, number: number | undefined): Promise<PlanSetRevision> {
    const design = await manager.getRepository(DesignEntity).findOne({ select: { version: true }, where: { projectId: project.id } })
    if (!design) throw unprocessable('The project has no design yet; design it and publish a plan set before asking for review', [{ field: 'design', message: 'is required' }])
    const revisions = manager.getRepository(PlanSetRevisionEntity)
    const revision = number === undefined
      ? await revisions.findOne({ where: { projectId: project.id }, order: { number: 'DESC' } })
      : await revisions.findOneBy({ projectId: project.id, number })
    if (!revision) {
      throw unprocessable(
        number === undefined ? 'Publish a plan set of the current design before asking for review' : `The project has no revision ${number}`,
        [{ field: 'revisionNumber', message: number === undefined ? 'no plan-set revision has been published' : 'no such revision of this project' }],
      )
    }
    if (revision.designVersion !== design.version) {
      throw unprocessable(`Revision ${revision.number} was drawn from design version ${revision.designVersion}, but the design is now at version ${design.version}; publish a new plan set first`, [
        { field: 'revisionNumber', message: `revision ${revision.number} is not of the current design version ${design.version}` },
      ])
    }
    return revision
  }

  /** The revision the workflow is carrying: the one last handed to review (and then stamped, submitted …). */
  private async revisionInWorkflow(manager: EntityManager, projectId: string): Promise<PlanSetRevision | null> {
    const last = await manager.getRepository(ProjectTransitionEntity).findOne({ select: { revisionId: true }, where: { projectId, event: 'request_review' }, order: { seq: 'DESC' } })
    return last?.revisionId ? manager.getRepository(PlanSetRevisionEntity).findOneBy({ id: last.revisionId }) : null
  }

  /**
   * What approving needs beyond the table: the licence of the reviewer, in force today, and the
   * revision under review still being the design as it is. The stamp and the signed PDF build on this.
   */
  private async approveAndStamp(manager: EntityManager, actor: AuthUser, project: Project, revision: PlanSetRevision | null): Promise<void> {
    const reviewer = await manager.getRepository(UserEntity).findOneByOrFail({ id: actor.id })
    const problems = licenceProblems(reviewer, this.today())
    if (problems.length) throw unprocessable('Your licence on your profile does not allow stamping yet', problems)
    if (!revision) throw unprocessable('No revision was handed to review; ask for review again', [{ field: 'revisionNumber', message: 'no revision is under review' }])
    const design = await manager.getRepository(DesignEntity).findOne({ select: { version: true }, where: { projectId: project.id } })
    if (design?.version !== revision.designVersion) {
      throw unprocessable(`The design changed after revision ${revision.number} was handed to review; request changes so a new plan set is published`, [
        { field: 'design.version', message: `is ${design?.version ?? 'missing'}; revision ${revision.number} shows version ${revision.designVersion}` },
      ])
    }
  }

  /**
   * For the design service, inside its save transaction: a design saved while stamped or later goes
   * back to `draft` (the stamp stays with its revision); closed and withdrawn projects refuse edits.
   */
  async reopenForDesignEdit(manager: EntityManager, actor: AuthUser, project: Project): Promise<void> {
    if (project.status === 'closed' || project.status === 'withdrawn') {
      throw conflict(`This project is ${STATUS_LABELS[project.status]}; its design can no longer change`)
    }
    if (!STAMP_LOCKED_STATUSES.includes(project.status)) return
    await manager.getRepository(ProjectEntity).update({ id: project.id, organizationId: actor.organizationId }, { status: 'draft' })
    await this.record(manager, actor, project, 'design_reopened', 'draft', 'The design was changed after stamping; it needs a new plan set and a new review', await this.revisionInWorkflow(manager, project.id))
  }

  private async record(manager: EntityManager, actor: AuthUser, project: Project, event: TimelineEvent, to: ProjectStatus, note: string | null, revision: PlanSetRevision | null): Promise<ProjectTransition> {
    const row = await manager.getRepository(ProjectTransitionEntity).save({
      organizationId: actor.organizationId,
      projectId: project.id,
      actorId: actor.id,
      event,
      fromStatus: project.status,
      toStatus: to,
      note,
      revisionId: revision?.id ?? null,
    })
    await this.audit.record(
      {
        organizationId: actor.organizationId, actorId: actor.id, action: `workflow.${event}`, entityType: 'project', entityId: project.id,
        fromState: project.status, toState: to, note, data: { transitionId: row.id, revisionId: revision?.id ?? null, revisionNumber: revision?.number ?? null },
      },
      manager,
    )
    return row
  }

  /** The timeline of a project, newest first. */
  async timeline(organizationId: string, projectId: string): Promise<{ items: TimelineEntryDto[] }> {
    await this.projects.getOwned(organizationId, projectId)
    const rows = await this.db.getRepository(ProjectTransitionEntity).find({ where: { projectId, organizationId }, order: { seq: 'DESC' } })
    return { items: await this.toDtos(rows, this.db.manager) }
  }

  private async toDtos(rows: ProjectTransition[], manager: EntityManager): Promise<TimelineEntryDto[]> {
    const actorIds = [...new Set(rows.map((r) => r.actorId).filter((v) => v !== null))]
    const revisionIds = [...new Set(rows.map((r) => r.revisionId).filter((v) => v !== null))]
    // one after the other: inside a transaction both run on the same connection
    const users = actorIds.length ? await manager.getRepository(UserEntity).find({ select: { id: true, name: true, role: true }, where: { id: In(actorIds) } }) : []
    const revisions = revisionIds.length ? await manager.getRepository(PlanSetRevisionEntity).find({ select: { id: true, number: true }, where: { id: In(revisionIds) } }) : []
    return rows.map((r) => {
      const user = users.find((u) => u.id === r.actorId)
      const revision = revisions.find((v) => v.id === r.revisionId)
      return {
        id: r.id,
        event: r.event,
        from: r.fromStatus,
        to: r.toStatus,
        note: r.note,
        actor: user ? { id: user.id, name: user.name, role: user.role } : null,
        revision: revision ? { id: revision.id, number: revision.number } : null,
        createdAt: r.createdAt.toISOString(),
      }
    })
  }
}
