import type { DataSource, EntityManager } from 'typeorm'
import {
  jurisdictionProfileSchema,
  renderGeneralNotes,
  type CreateJurisdictionBody,
  type GeneralNotesContext,
  type JurisdictionDto,
  type JurisdictionListQuery,
  type UpdateJurisdictionBody,
} from '../../shared/schemas/jurisdiction'
import type { Page } from '../../shared/schemas/paging'
import type { AuthUser } from '../auth/auth-user'
import { JurisdictionProfileEntity, ProjectEntity, type JurisdictionProfile } from '../entities'
import { conflict, unprocessable, versionConflict } from '../http/errors'
import { fieldErrors } from '../http/validation'
import type { AuditService } from './audit-service'
import { containsPattern, findOwned, pageOf, rethrowUnique, updateAtVersion } from './rows'

const SORT_COLUMNS = { name: 'j.name', necEdition: 'j.nec_edition', updatedAt: 'j.updated_at' }
const UNIQUE_NAME = { jurisdiction_profiles_org_name_key: { field: 'name', message: 'A jurisdiction profile with this name already exists' } }
const WHAT = 'Jurisdiction profile'

/** Jurisdiction profiles of one organisation: how each AHJ wants its plan sets. */
export class JurisdictionService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
  ) {}

  private async projectCounts(manager: EntityManager, ids: string[]): Promise<Map<string, number>> {
    if (!ids.length) return new Map()
    const rows: { id: string; count: string }[] = await manager
      .getRepository(ProjectEntity)
      .createQueryBuilder('p')
      .select('p.jurisdiction_id', 'id')
      .addSelect('count(*)', 'count')
      .where('p.jurisdiction_id IN (:...ids)', { ids })
      .groupBy('p.jurisdiction_id')
      .getRawMany()
    return new Map(rows.map((r) => [r.id, Number(r.count)]))
  }

  private dto(row: JurisdictionProfile, projectCount: number): JurisdictionDto {
    const { organizationId: _org, createdAt, updatedAt, ...fields } = row
    return { ...fields, projectCount, createdAt: createdAt.toISOString(), updatedAt: updatedAt.toISOString() }
  }

  async toDto(row: JurisdictionProfile, manager: EntityManager = this.db.manager): Promise<JurisdictionDto> {
    return this.dto(row, (await this.projectCounts(manager, [row.id])).get(row.id) ?? 0)
  }

  getOwned(organizationId: string, id: string, manager: EntityManager = this.db.manager): Promise<JurisdictionProfile> {
    return findOwned(manager, JurisdictionProfileEntity, organizationId, id, WHAT)
  }

  async get(organizationId: string, id: string): Promise<JurisdictionDto> {
    return this.toDto(await this.getOwned(organizationId, id))
  }

  async list(organizationId: string, query: JurisdictionListQuery): Promise<Page<JurisdictionDto>> {
    const qb = this.db.getRepository(JurisdictionProfileEntity).createQueryBuilder('j').where('j.organization_id = :organizationId', { organizationId })
    if (query.q) qb.andWhere('j.name ILIKE :pattern', { pattern: containsPattern(query.q) })
    if (query.necEdition) qb.andWhere('j.nec_edition = :edition', { edition: query.necEdition })
    const { rows, total } = await pageOf(qb, query, SORT_COLUMNS, 'name')
    const counts = await this.projectCounts(this.db.manager, rows.map((r) => r.id))
    return { items: rows.map((r) => this.dto(r, counts.get(r.id) ?? 0)), total, page: query.page, pageSize: query.pageSize }
  }

  async create(actor: AuthUser, body: CreateJurisdictionBody): Promise<JurisdictionDto> {
    return this.db.transaction(async (manager) => {
      const row = await manager
        .getRepository(JurisdictionProfileEntity)
        .save({ ...body, organizationId: actor.organizationId })
        .catch((err: unknown) => rethrowUnique(err, UNIQUE_NAME))
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: 'jurisdiction.created', entityType: 'jurisdiction_profile', entityId: row.id, data: { name: row.name } }, manager)
      return this.dto(row, 0)
    })
  }

  async update(actor: AuthUser, id: string, body: UpdateJurisdictionBody): Promise<JurisdictionDto> {
    const { version, ...changes } = body
    return this.db.transaction(async (manager) => {
      const before = await this.getOwned(actor.organizationId, id, manager)
      // a partial change can break a rule between fields (e.g. a new low above the old high)
      const merged = jurisdictionProfileSchema.safeParse({ ...before, ...changes })
      if (!merged.success) throw unprocessable('The changed profile is not consistent', fieldErrors(merged.error))
      const row = await updateAtVersion(manager, JurisdictionProfileEntity, { organizationId: actor.organizationId, id, version }, changes, WHAT, async (current) => ({
        current: await this.toDto(current, manager),
      })).catch((err: unknown) => rethrowUnique(err, UNIQUE_NAME))
      await this.audit.record(
        { organizationId: actor.organizationId, actorId: actor.id, action: 'jurisdiction.updated', entityType: 'jurisdiction_profile', entityId: id, data: { fields: Object.keys(changes) } },
        manager,
      )
      return this.toDto(row, manager)
    })
  }

  /** Deletes a profile no project names; a profile in use answers 409 with the count. */
  async remove(actor: AuthUser, id: string, version: number): Promise<void> {
    await this.db.transaction(async (manager) => {
      const row = await this.getOwned(actor.organizationId, id, manager)
      const inUse = await manager.getRepository(ProjectEntity).countBy({ jurisdictionId: id })
      if (inUse) throw conflict(`${inUse} project(s) use this profile; move them to another profile first`)
      const result = await manager.getRepository(JurisdictionProfileEntity).delete({ id, organizationId: actor.organizationId, version })
      if (result.affected !== 1) throw versionConflict(WHAT, row, { current: await this.toDto(row, manager) })
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: 'jurisdiction.deleted', entityType: 'jurisdiction_profile', entityId: id, data: { name: row.name } }, manager)
    })
  }

  /** The profile's general notes filled in for one project. */
  generalNotes(profile: JurisdictionProfile, project: GeneralNotesContext['project']): string {
    return profileNotes(profile, project)
  }
}

/** A profile's general-notes template filled in for one project (only the fields templates may use are passed). */
export function profileNotes(profile: JurisdictionProfile, project: GeneralNotesContext['project']): string {
  const { code, name, customerName, siteAddress, siteCity, utility, systemKind } = project
  return renderGeneralNotes(profile.generalNotesTemplate, {
    project: { code, name, customerName, siteAddress, siteCity, utility, systemKind },
    jurisdiction: { name: profile.name, necEdition: profile.necEdition },
  })
}
