import { In, type DataSource, type EntityManager } from 'typeorm'
import { NOTIFICATION_CATEGORIES, NOTIFICATION_CATEGORY_INFO, type CaughtMailDto, type CaughtMailSummaryDto, type NotificationCategory, type NotificationSettingsBody, type NotificationSettingsDto } from '../../shared/schemas/notifications'
import { DUE_SOON_DAYS, type DueItemDto } from '../../shared/schemas/submission'
import { STATUS_LABELS, type TimelineEvent } from '../../shared/workflow'
import type { AuthUser } from '../auth/auth-user'
import type { AppConfig } from '../config'
import { JurisdictionProfileEntity, PlanSetRevisionEntity, ProjectEntity, ProjectTransitionEntity, UserEntity, type Project, type User } from '../entities'
import { notFound } from '../http/errors'
import type { MailJobData, MailQueue } from '../jobs/mail-queue'
import { CATEGORY_HEADER, readCaughtMail, readMailbox } from '../mail/fake-smtp'
import type { Mailer } from '../mail/mailer'
import { MailTemplates } from '../mail/templates'
import type { RecordedStep, WorkflowService } from './workflow-service'

type StepCategory = Exclude<NotificationCategory, 'daily_digest'>

/** The timeline events people are told of by mail; the others (close, withdraw, reopen) show on the timeline only. */
const CATEGORY_OF_EVENT: Partial<Record<TimelineEvent, StepCategory>> = {
  request_review: 'review_requested',
  request_changes: 'changes_requested',
  approve_and_stamp: 'stamped',
  record_submission: 'submitted',
  record_resubmittal: 'submitted',
  record_corrections: 'ahj_corrections',
  record_permit: 'permit_issued',
}


/** Where the digest finds what is due: the submission service. */
export interface DueItemSource {
  dueItems(organizationId: string, today: string, horizonDays: number): Promise<DueItemDto[]>
}

/** What delivering a queued mail came to. */
export type DeliveryOutcome = 'sent' | 'dropped' | 'skipped'

type Reader = Pick<User, 'id' | 'organizationId' | 'name' | 'email' | 'role' | 'active' | 'notificationOptOuts'>
const READER_COLUMNS = { id: true, organizationId: true, name: true, email: true, role: true, active: true, notificationOptOuts: true } as const

/**
 * E-mail about the workflow: decides who hears of each recorded step and queues one mail each in
 * the step's own transaction, builds the daily digest of due items, delivers queued mails (worker),
 * and keeps each user's opt-outs. Recipients are common practice, no source.
 */
export class NotificationService {
  private templates?: MailTemplates

  constructor(
    private readonly db: DataSource,
    private readonly config: AppConfig,
    private readonly queue: MailQueue,
    workflow: WorkflowService,
    private readonly dueItemSource: DueItemSource,
  ) {
    workflow.onRecorded((manager, step) => this.queueStepMails(manager, step))
  }

  async settings(actor: AuthUser): Promise<NotificationSettingsDto> {
    const user = await this.db.getRepository(UserEntity).findOneOrFail({ select: READER_COLUMNS, where: { id: actor.id, organizationId: actor.organizationId } })
    return this.settingsOf(user.notificationOptOuts)
  }

  async updateSettings(actor: AuthUser, body: NotificationSettingsBody): Promise<NotificationSettingsDto> {
    const optOuts = NOTIFICATION_CATEGORIES.filter((c) => body.optOuts.includes(c))
    await this.db.getRepository(UserEntity).update({ id: actor.id, organizationId: actor.organizationId }, { notificationOptOuts: optOuts })
    return this.settingsOf(optOuts)
  }

  private settingsOf(optOuts: readonly NotificationCategory[]): NotificationSettingsDto {
    return { items: NOTIFICATION_CATEGORIES.map((category) => ({ category, ...NOTIFICATION_CATEGORY_INFO[category], enabled: !optOuts.includes(category) })) }
  }

  /** Inside the step's transaction: the mails go only if the step commits, and a mail failure never undoes the step. */
  async queueStepMails(manager: EntityManager, step: RecordedStep): Promise<void> {
    const category = CATEGORY_OF_EVENT[step.event]
    if (!category) return
    const recipients = await this.stepRecipients(manager, step, category)
    await this.queue.send(recipients.map((r) => ({ kind: 'step', category, recipientId: r.id, transitionId: step.transitionId })), manager)
  }

  /** Who hears of a step: by category, then never the actor, only active members of the organisation, opt-outs respected. */
  async stepRecipients(manager: EntityManager, step: RecordedStep, category: StepCategory): Promise<Reader[]> {
    const project = await manager.getRepository(ProjectEntity).findOneByOrFail({ id: step.projectId, organizationId: step.organizationId })
    const members = await manager.getRepository(UserEntity).find({ select: READER_COLUMNS, where: { organizationId: step.organizationId, active: true } })
    const member = (id: string | null | undefined, role?: User['role']) => members.find((m) => m.id === id && (!role || m.role === role))
    const withRole = (role: User['role']) => members.filter((m) => m.role === role)
    const lastActorOf = async (event: TimelineEvent) =>
      (await manager.getRepository(ProjectTransitionEntity).findOne({ select: { actorId: true }, where: { projectId: project.id, event }, order: { seq: 'DESC' } }))?.actorId
    const designer = async () => member(project.designerId) ?? member(await lastActorOf('request_review'))
    const coordinators = () => {
      const assigned = member(project.coordinatorId, 'coordinator')
      return assigned ? [assigned] : withRole('coordinator')
    }

    let chosen: (Reader | undefined)[]
    switch (category) {
      case 'review_requested': {
        const assigned = member(project.reviewerId, 'reviewer')
        chosen = assigned ? [assigned] : withRole('reviewer')
        break
      }
      case 'changes_requested':
        chosen = [await designer()]
        break
      case 'stamped':
        chosen = [await designer(), ...coordinators()]
        break
      default:
        chosen = [await designer(), member(await lastActorOf('approve_and_stamp')), ...coordinators()]
    }
    const unique = new Map(chosen.filter((r) => r !== undefined).map((r) => [r.id, r]))
    return [...unique.values()].filter((r) => r.id !== step.actorId && !r.notificationOptOuts.includes(category))
  }

  /**
   * Queues one digest mail per permit coordinator and administrator with something due or overdue
   * (coordinators: their projects and unassigned ones; administrators: all). Nothing is sent to
   * someone with nothing due. Answers how many mails were queued.
   */
  async sendDigest(today: string): Promise<number> {
    const source = this.dueItemSource
    const readers = await this.db.getRepository(UserEntity).find({ select: READER_COLUMNS, where: { active: true, role: In(['coordinator', 'admin']) } })
    const wanting = readers.filter((r) => !r.notificationOptOuts.includes('daily_digest'))
    const mails: MailJobData[] = []
    for (const organizationId of new Set(wanting.map((r) => r.organizationId))) {
      const items = await source.dueItems(organizationId, today, DUE_SOON_DAYS)
      if (!items.length) continue
      const projects = await this.db.getRepository(ProjectEntity).find({ select: { id: true, coordinatorId: true }, where: { organizationId, id: In([...new Set(items.map((i) => i.projectId))]) } })
      const coordinatorOf = new Map(projects.map((p) => [p.id, p.coordinatorId]))
      for (const reader of wanting.filter((r) => r.organizationId === organizationId)) {
        const mine = reader.role === 'admin' ? items : items.filter((i) => [reader.id, null, undefined].includes(coordinatorOf.get(i.projectId)))
        if (mine.length) mails.push({ kind: 'digest', recipientId: reader.id, today, horizonDays: DUE_SOON_DAYS, items: mine })
      }
    }
    await this.queue.send(mails)
    return mails.length
  }

  /** Worker side: renders and sends one queued mail. Someone deactivated or opted out since it was queued is skipped. */
  async deliver(job: MailJobData, mailer: Mailer): Promise<DeliveryOutcome> {
    const reader = await this.db.getRepository(UserEntity).findOne({ select: READER_COLUMNS, where: { id: job.recipientId } })
    const category = job.kind === 'digest' ? 'daily_digest' : job.category
    if (!reader?.active || reader.notificationOptOuts.includes(category)) return 'skipped'
    const base = { recipientName: reader.name, recipientEmail: reader.email, settingsUrl: this.link('/profile') }
    const data = job.kind === 'digest' ? this.digestContext(job) : await this.stepContext(job.transitionId, reader.organizationId)
    if (!data) return 'skipped'
    this.templates ??= new MailTemplates()
    const mail = this.templates.render(category, { ...base, ...data })
    const sent = await mailer.send({ to: reader.email, ...mail, headers: { [CATEGORY_HEADER]: category } })
    return sent ? 'sent' : 'dropped'
  }

  private digestContext(job: Extract<MailJobData, { kind: 'digest' }>) {
    return {
      today: job.today,
      horizonDays: job.horizonDays,
      single: job.items.length === 1,
      overdueCount: job.items.filter((i) => i.overdue).length,
      items: job.items.map((i) => ({ ...i, url: this.link(`/projects/${i.projectId}`) })),
      submissionsUrl: this.link('/submissions'),
    }
  }

  /** What a step mail says, read when it is sent; null when the step's project has gone. */
  private async stepContext(transitionId: string, organizationId: string): Promise<Record<string, unknown> | null> {
    const manager = this.db.manager
    const row = await manager.getRepository(ProjectTransitionEntity).findOneBy({ id: transitionId, organizationId })
    const project: Project | null = row && (await manager.getRepository(ProjectEntity).findOneBy({ id: row.projectId, organizationId }))
    if (!row || !project) return null
    const actor = row.actorId ? await manager.getRepository(UserEntity).findOne({ select: { name: true }, where: { id: row.actorId } }) : null
    const revision = row.revisionId ? await manager.getRepository(PlanSetRevisionEntity).findOne({ select: { number: true }, where: { id: row.revisionId } }) : null
    const jurisdiction = project.jurisdictionId ? await manager.getRepository(JurisdictionProfileEntity).findOne({ select: { name: true }, where: { id: project.jurisdictionId } }) : null
    return {
      actorName: actor?.name ?? 'A former member',
      project: { code: project.code, name: project.name, siteCity: project.siteCity },
      statusLabel: STATUS_LABELS[row.toStatus],
      revisionNumber: revision?.number ?? null,
      note: row.note,
      jurisdictionName: jurisdiction?.name ?? 'the AHJ',
      resubmittal: row.event === 'record_resubmittal',
      projectUrl: this.link(`/projects/${project.id}`),
      reviewUrl: this.link(`/projects/${project.id}/review`),
    }
  }

  private link(pathname: string): string {
    return `${this.config.appUrl}${pathname}`
  }

  /** The development mail catcher's folder; 404 in production or when none is configured. */
  private mailboxDir(): string {
    if (this.config.nodeEnv === 'production' || !this.config.mail.mailboxDir) throw notFound('Mail catcher')
    return this.config.mail.mailboxDir
  }

  caughtMails(): { items: CaughtMailSummaryDto[] } {
    return { items: readMailbox(this.mailboxDir()) }
  }

  caughtMail(id: string): CaughtMailDto {
    const mail = readCaughtMail(this.mailboxDir(), id)
    if (!mail) throw notFound('Caught message')
    const { envelope: _envelope, headers: _headers, raw: _raw, ...shown } = mail
    return shown
  }
}
