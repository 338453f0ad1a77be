import { In, type DataSource, type EntityManager } from 'typeorm'
import type { ProjectStatus } from '../../shared/schemas/project'
import { isPaperworkAction } from '../../shared/schemas/submission'
import type { TimelineEntryDto, TransitionBody, TransitionResultDto } from '../../shared/schemas/workflow'
import { ACTION_RULES, decideTransition, licenceProblems, STAMP_LOCKED_STATUSES, STATUS_LABELS, type TimelineEvent, type WorkflowAction } from '../../shared/workflow'
import type { AuthUser } from '../auth/auth-user'
import { DesignEntity, PlanSetRevisionEntity, ProjectEntity, ProjectTransitionEntity, UserEntity, type PlanSetRevision, type Project, type ProjectTransition } from '../entities'
import { conflict, unprocessable, versionConflict } from '../http/errors'
import type { AuditService } from './audit-service'
import type { ProjectService } from './project-service'
import { updateAtVersion } from './rows'
import { utcDay } from '../calendar'

const WHAT = 'Project'

/** A step as the services that act on it see it. */
export interface StepContext {
  actor: AuthUser
  project: Project
  /** The revision the workflow carries (under review, stamped, submitted …), if any. */
  revision: PlanSetRevision | null
  body: TransitionBody
}

/**
 * What a service does when a step is taken, beyond moving the status: stamping signs the plan set,
 * the submission steps record dates and references. `prepare` runs before the transaction (slow work,
 * files put in content-addressed storage, so an abandoned step leaves nothing half written); `apply`
 * runs inside it after the checks, with what `prepare` returned.
 */
export interface StepEffect<Prepared = unknown> {
  prepare?(step: StepContext): Promise<Prepared>
  apply(manager: EntityManager, step: StepContext & { prepared: Prepared; to: ProjectStatus; transitionId: string }): Promise<void>
}

/** A timeline row just written, inside its transaction: notifications enqueue their mail here, so mail goes only for committed steps. */
export interface RecordedStep {
  organizationId: string
  projectId: string
  actorId: string
  event: TimelineEvent
  from: ProjectStatus
  to: ProjectStatus
  note: string | null
  revision: { id: string; number: number } | null
  transitionId: string
}
export type StepListener = (manager: EntityManager, step: RecordedStep) => Promise<void>

/** A precondition another service owns (open review comments, say): throws the 409 or 422 that refuses the step. */
export type StepGuard = (manager: EntityManager, step: StepContext) => Promise<void>

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
    private readonly today: () => string = utcDay,
  ) {}

  private readonly effects = new Map<WorkflowAction, StepEffect>()
  private readonly listeners: StepListener[] = []
  private readonly guards = new Map<WorkflowAction, StepGuard[]>()

  /** Registers what a service does on `action` (one service per action). */
  onStep<P>(action: WorkflowAction, effect: StepEffect<P>): void {
    if (this.effects.has(action)) throw new Error(`a step effect for ${action} is already registered`)
    this.effects.set(action, effect as StepEffect)
  }

  /** Registers a precondition of `action`, checked after the workflow's own checks, before any slow work and again in the transaction. */
  onGuard(action: WorkflowAction, guard: StepGuard): void {
    this.guards.set(action, [...(this.guards.get(action) ?? []), guard])
  }

  /** Registers a listener told of every timeline row written, inside the writing transaction. */
  onRecorded(listener: StepListener): void {
    this.listeners.push(listener)
  }

  /** The checks that need no lock, in the order the transaction makes them again: 409 and 422 come before any slow work. */
  private async check(manager: EntityManager, actor: AuthUser, projectId: string, body: TransitionBody) {
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
    if (body.stamp !== undefined && body.action !== 'approve_and_stamp') {
      throw unprocessable('Only approving and stamping takes stamp details', [{ field: 'stamp', message: `is not taken by ${body.action}` }])
    }
    if (body.submission !== undefined && !isPaperworkAction(body.action)) {
      throw unprocessable('Only the submission steps take submission details', [{ field: 'submission', message: `is not taken by ${body.action}` }])
    }
    const revision = body.action === 'request_review'
      ? await this.revisionForReview(manager, project, body.revisionNumber)
      : await this.revisionInWorkflow(manager, project.id)
    if (body.action === 'approve_and_stamp') await this.approveAndStamp(manager, actor, project, revision)
    for (const guard of this.guards.get(body.action) ?? []) await guard(manager, { actor, project, revision, body })
    return { project, to: decision.to, note, revision }
  }

  async transition(actor: AuthUser, projectId: string, body: TransitionBody): Promise<TransitionResultDto> {
    const effect = this.effects.get(body.action)
    let prepared: unknown
    if (effect?.prepare) {
      const seen = await this.check(this.db.manager, actor, projectId, body)
      prepared = await effect.prepare({ actor, project: seen.project, revision: seen.revision, body })
    }
    return this.db.transaction(async (manager) => {
      const { project, to, note, revision } = await this.check(manager, actor, projectId, body)
      const moved = await updateAtVersion(manager, ProjectEntity, { organizationId: actor.organizationId, id: project.id, version: body.version }, { status: to }, WHAT, async (current) => ({
        current: await this.projects.toDto(current, manager),
      }))
      const row = await this.record(manager, actor, project, body.action, to, note, revision)
      await effect?.apply(manager, { actor, project, revision, body, prepared, to, transitionId: row.id })
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
  async revisionInWorkflow(manager: EntityManager, projectId: string): Promise<PlanSetRevision | null> {
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
    const recorded: RecordedStep = {
      organizationId: actor.organizationId, projectId: project.id, actorId: actor.id, event, from: project.status, to, note,
      revision: revision ? { id: revision.id, number: revision.number } : null, transitionId: row.id,
    }
    for (const listener of this.listeners) await listener(manager, recorded)
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
