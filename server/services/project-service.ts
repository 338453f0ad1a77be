import type { DataSource, EntityManager } from 'typeorm'
import type { Role } from '../../shared/auth/roles'
import type { Page } from '../../shared/schemas/paging'
import type { CreateProjectBody, ProjectDto, ProjectListQuery, UpdateProjectBody } from '../../shared/schemas/project'
import type { AuthUser } from '../auth/auth-user'
import { DesignEntity, JurisdictionProfileEntity, ProjectEntity, UserEntity, type Project } from '../entities'
import { conflict, notFound, unprocessable, type FieldError } from '../http/errors'
import type { AuditService } from './audit-service'
import type { JurisdictionService } from './jurisdiction-service'
import { projectPage, projectView } from './project-views'
import { findOwned, isUuid, rethrowUnique, updateAtVersion } from './rows'

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

  /** A project as the API shows it, in one query; a foreign, unknown or malformed id is 404. */
  async get(organizationId: string, id: string, manager: EntityManager = this.db.manager): Promise<ProjectDto> {
    const view = isUuid(id) ? await projectView(manager, organizationId, id) : null
    if (!view) throw notFound(WHAT)
    return view
  }

  /** A project row as the API shows it, read again through `manager` so a transaction sees its own changes. */
  toDto(row: Project, manager: EntityManager = this.db.manager): Promise<ProjectDto> {
    return this.get(row.organizationId, row.id, manager)
  }

  list(organizationId: string, query: ProjectListQuery): Promise<Page<ProjectDto>> {
    return projectPage(this.db.manager, organizationId, query)
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
