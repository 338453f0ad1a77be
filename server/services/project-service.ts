import { Brackets, In, type DataSource, type EntityManager } from 'typeorm'
import type { Role } from '../../shared/auth/roles'
import type { Page } from '../../shared/schemas/paging'
import type { CreateProjectBody, ProjectDto, ProjectListQuery, UpdateProjectBody } from '../../shared/schemas/project'
import type { AuthUser } from '../auth/auth-user'
import { DesignEntity, JurisdictionProfileEntity, ProjectEntity, UserEntity, type Project } from '../entities'
import { conflict, unprocessable, type FieldError } from '../http/errors'
import type { AuditService } from './audit-service'
import type { JurisdictionService } from './jurisdiction-service'
import { containsPattern, findOwned, pageOf, peopleById, rethrowUnique, updateAtVersion } from './rows'

const SORT_COLUMNS = {
  code: 'p.code',
  name: 'p.name',
  customerName: 'p.customer_name',
  status: 'p.status',
  targetSubmissionDate: 'p.target_submission_date',
  createdAt: 'p.created_at',
  updatedAt: 'p.updated_at',
}
const UNIQUE_CODE = { projects_org_code_key: { field: 'code', message: 'Another project of the organisation has this code' } }
const WHAT = 'Project'

/** Who may be named in each assignment: the designer and coordinator may also be an administrator. */
const ASSIGNABLE: Record<'designerId' | 'reviewerId' | 'coordinatorId', readonly Role[]> = {
  designerId: ['designer', 'admin'],
  reviewerId: ['reviewer'],
  coordinatorId: ['coordinator', 'admin'],
}

/** Projects of one organisation: the permit jobs a designer works on. */
export class ProjectService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly jurisdictions: JurisdictionService,
  ) {}

  getOwned(organizationId: string, id: string, manager: EntityManager = this.db.manager): Promise<Project> {
    return findOwned(manager, ProjectEntity, organizationId, id, WHAT)
  }

  /** Project rows as the API shows them, with names of the jurisdiction and the people, in a few queries. */
  async toDtos(rows: Project[], manager: EntityManager = this.db.manager): Promise<ProjectDto[]> {
    if (!rows.length) return []
    const jurisdictionIds = [...new Set(rows.map((r) => r.jurisdictionId).filter((v) => v !== null))]
    const findPeople = () => peopleById(manager, rows.flatMap((r) => [r.designerId, r.reviewerId, r.coordinatorId]))
    const findJurisdictions = async () =>
      jurisdictionIds.length ? manager.getRepository(JurisdictionProfileEntity).find({ select: { id: true, name: true }, where: { id: In(jurisdictionIds) } }) : []
    const findDesigns = () =>
      manager.getRepository(DesignEntity).find({ select: { projectId: true, version: true, evaluationStatus: true, evaluatedVersion: true }, where: { projectId: In(rows.map((r) => r.id)) } })
    // a transaction holds one connection, which takes one query at a time; the pool takes them together
    const [person, jurisdictions, designs] = manager.queryRunner?.isTransactionActive
      ? [await findPeople(), await findJurisdictions(), await findDesigns()]
      : await Promise.all([findPeople(), findJurisdictions(), findDesigns()])
    return rows.map((r) => {
      const jurisdiction = jurisdictions.find((j) => j.id === r.jurisdictionId)
      const design = designs.find((d) => d.projectId === r.id)
      return {
        id: r.id,
        code: r.code,
        name: r.name,
        customerName: r.customerName,
        customerEmail: r.customerEmail,
        customerPhone: r.customerPhone,
        siteAddress: r.siteAddress,
        siteCity: r.siteCity,
        jurisdiction: jurisdiction ? { id: jurisdiction.id, name: jurisdiction.name } : null,
        utility: r.utility,
        systemKind: r.systemKind,
        status: r.status,
        designer: person(r.designerId),
        reviewer: person(r.reviewerId),
        coordinator: person(r.coordinatorId),
        targetSubmissionDate: r.targetSubmissionDate,
        // a stored evaluation of an older version says nothing about the design as it is now
        design: design ? { version: design.version, evaluationStatus: design.evaluatedVersion === design.version ? design.evaluationStatus : null } : null,
        archivedAt: r.archivedAt?.toISOString() ?? null,
        createdAt: r.createdAt.toISOString(),
        updatedAt: r.updatedAt.toISOString(),
        version: r.version,
      }
    })
  }

  async toDto(row: Project, manager: EntityManager = this.db.manager): Promise<ProjectDto> {
    return (await this.toDtos([row], manager))[0]!
  }

  async get(organizationId: string, id: string): Promise<ProjectDto> {
    return this.toDto(await this.getOwned(organizationId, id))
  }

  async list(organizationId: string, query: ProjectListQuery): Promise<Page<ProjectDto>> {
    const qb = this.db
      .getRepository(ProjectEntity)
      .createQueryBuilder('p')
      .where('p.organization_id = :organizationId', { organizationId })
      .andWhere(query.archived ? 'p.archived_at IS NOT NULL' : 'p.archived_at IS NULL')
    if (query.q) {
      const pattern = containsPattern(query.q)
      qb.andWhere(
        new Brackets((w) =>
          ['p.code', 'p.name', 'p.site_address', 'p.site_city', 'p.customer_name'].forEach((column, i) =>
            i === 0 ? w.where(`${column} ILIKE :pattern`, { pattern }) : w.orWhere(`${column} ILIKE :pattern`, { pattern }),
          ),
        ),
      )
    }
    if (query.status) qb.andWhere('p.status = :status', { status: query.status })
    if (query.systemKind) qb.andWhere('p.system_kind = :systemKind', { systemKind: query.systemKind })
    if (query.jurisdictionId) qb.andWhere('p.jurisdiction_id = :jurisdictionId', { jurisdictionId: query.jurisdictionId })
    if (query.assigneeId) {
      qb.andWhere(':assignee IN (p.designer_id, p.reviewer_id, p.coordinator_id)', { assignee: query.assigneeId })
    }
    const { rows, total } = await pageOf(qb, query, SORT_COLUMNS, '-updatedAt')
    return { items: await this.toDtos(rows), total, page: query.page, pageSize: query.pageSize }
  }

  /** The jurisdiction and people named must belong to the organisation and, for people, have a fitting role. */
  private async checkReferences(manager: EntityManager, organizationId: string, fields: Partial<CreateProjectBody>): Promise<void> {
    const problems: FieldError[] = []
    if (fields.jurisdictionId) {
      const found = await manager.getRepository(JurisdictionProfileEntity).existsBy({ id: fields.jurisdictionId, organizationId })
      if (!found) problems.push({ field: 'jurisdictionId', message: 'no jurisdiction profile of this organisation has this id' })
    }
    for (const [field, roles] of Object.entries(ASSIGNABLE) as [keyof typeof ASSIGNABLE, readonly Role[]][]) {
      const userId = fields[field]
      if (!userId) continue
      const user = await manager.getRepository(UserEntity).findOneBy({ id: userId, organizationId })
      if (!user || !user.active) problems.push({ field, message: 'no active user of this organisation has this id' })
      else if (!roles.includes(user.role)) problems.push({ field, message: `${user.name} is a ${user.role}; this assignment needs a ${roles.join(' or ')}` })
    }
    if (problems.length) throw unprocessable('The project names something it cannot use', problems)
  }

  async create(actor: AuthUser, body: CreateProjectBody): Promise<ProjectDto> {
    return this.db.transaction(async (manager) => {
      await this.checkReferences(manager, actor.organizationId, body)
      const row = await manager
        .getRepository(ProjectEntity)
        .save({
          organizationId: actor.organizationId,
          code: body.code,
          name: body.name,
          customerName: body.customerName,
          customerEmail: body.customerEmail ?? null,
          customerPhone: body.customerPhone ?? null,
          siteAddress: body.siteAddress,
          siteCity: body.siteCity,
          jurisdictionId: body.jurisdictionId ?? null,
          utility: body.utility ?? null,
          systemKind: body.systemKind,
          status: 'draft',
          designerId: body.designerId ?? null,
          reviewerId: body.reviewerId ?? null,
          coordinatorId: body.coordinatorId ?? null,
          targetSubmissionDate: body.targetSubmissionDate ?? null,
          archivedAt: null,
          createdBy: actor.id,
        })
        .catch((err: unknown) => rethrowUnique(err, UNIQUE_CODE))
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: 'project.created', entityType: 'project', entityId: row.id, toState: 'draft', data: { code: row.code } }, manager)
      return this.toDto(row, manager)
    })
  }

  async update(actor: AuthUser, id: string, body: UpdateProjectBody): Promise<ProjectDto> {
    const { version, ...changes } = body
    return this.db.transaction(async (manager) => {
      const before = await this.getOwned(actor.organizationId, id, manager)
      if (before.archivedAt) throw conflict('This project is archived; restore it before changing it')
      if (changes.systemKind && changes.systemKind !== before.systemKind && (await manager.getRepository(DesignEntity).existsBy({ projectId: id }))) {
        throw conflict('The project has a design of another system kind; change the design first', [{ field: 'systemKind', message: `the design is ${before.systemKind}` }])
      }
      await this.checkReferences(manager, actor.organizationId, changes)
      const row = await this.saveAtVersion(manager, actor, id, version, changes).catch((err: unknown) => rethrowUnique(err, UNIQUE_CODE))
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: 'project.updated', entityType: 'project', entityId: id, data: { fields: Object.keys(changes) } }, manager)
      return this.toDto(row, manager)
    })
  }

  /** Archives (hides from the working lists, read-only) or restores a project. */
  async setArchived(actor: AuthUser, id: string, version: number, archived: boolean): Promise<ProjectDto> {
    return this.db.transaction(async (manager) => {
      const before = await this.getOwned(actor.organizationId, id, manager)
      if (Boolean(before.archivedAt) === archived) throw conflict(archived ? 'The project is already archived' : 'The project is not archived')
      const row = await this.saveAtVersion(manager, actor, id, version, { archivedAt: archived ? new Date() : null })
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: archived ? 'project.archived' : 'project.restored', entityType: 'project', entityId: id }, manager)
      return this.toDto(row, manager)
    })
  }

  private saveAtVersion(manager: EntityManager, actor: AuthUser, id: string, version: number, changes: Partial<Project>) {
    return updateAtVersion(manager, ProjectEntity, { organizationId: actor.organizationId, id, version }, changes, WHAT, async (current) => ({ current: await this.toDto(current, manager) }))
  }

  /** The general notes of the project's jurisdiction profile, filled in; empty without a profile. */
  async generalNotes(organizationId: string, id: string): Promise<{ jurisdictionId: string | null; notes: string }> {
    const project = await this.getOwned(organizationId, id)
    if (!project.jurisdictionId) return { jurisdictionId: null, notes: '' }
    const profile = await this.jurisdictions.getOwned(organizationId, project.jurisdictionId)
    return { jurisdictionId: profile.id, notes: this.jurisdictions.generalNotes(profile, project) }
  }
}
