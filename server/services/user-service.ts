import { randomUUID } from 'node:crypto'
import { Brackets, type DataSource, type EntityManager } from 'typeorm'
import type { CreateUserBody, MemberDto, UpdateUserBody, UserDto } from '../../shared/schemas/auth'
import type { Page } from '../../shared/schemas/paging'
import type { AuthUser } from '../auth/auth-user'
import type { SignedInUsers } from '../auth/signed-in-users'
import { hashPassword } from '../auth/passwords'
import { OrganizationEntity, RefreshTokenEntity, UserEntity, type User } from '../entities'
import { conflict } from '../http/errors'
import type { AuditService } from './audit-service'
import { containsPattern, findOwned, pageOf } from './rows'

const SORT_COLUMNS = { name: 'u.name', email: 'u.email', role: 'u.role', createdAt: 'u.created_at' } as const
type SortName = keyof typeof SORT_COLUMNS

export interface UserListQuery {
  page: number
  pageSize: number
  q?: string
  sort?: SortName | `-${SortName}`
}

/** Users of one organisation: listing, creation, role and licence changes, deactivation. */
export class UserService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly bcryptCost: number,
    private readonly signedIn?: SignedInUsers,
  ) {}

  async toDto(user: User, manager: EntityManager = this.db.manager): Promise<UserDto> {
    const org = await manager.getRepository(OrganizationEntity).findOneByOrFail({ id: user.organizationId })
    return {
      id: user.id,
      email: user.email,
      name: user.name,
      role: user.role,
      organizationId: user.organizationId,
      organizationName: org.name,
      active: user.active,
      licenceNumber: user.licenceNumber,
      licenceRegion: user.licenceRegion,
      licenceExpiry: user.licenceExpiry,
      createdAt: user.createdAt.toISOString(),
    }
  }

  /** A user of the caller's organisation; any other id (foreign, unknown, malformed) is 404. */
  async getInOrganization(organizationId: string, id: string): Promise<User> {
    return findOwned(this.db.manager, UserEntity, organizationId, id, 'User')
  }

  async list(organizationId: string, query: UserListQuery): Promise<Page<UserDto>> {
    const qb = this.db
      .getRepository(UserEntity)
      .createQueryBuilder('u')
      .where('u.organization_id = :organizationId', { organizationId })
    if (query.q) {
      const pattern = containsPattern(query.q)
      qb.andWhere(new Brackets((w) => w.where('u.name ILIKE :pattern', { pattern }).orWhere('u.email ILIKE :pattern', { pattern })))
    }
    const { rows: users, total } = await pageOf(qb, query, SORT_COLUMNS, 'name')
    const items = await Promise.all(users.map((u) => this.toDto(u)))
    return { items, total, page: query.page, pageSize: query.pageSize }
  }

  /** Active members of the organisation by name: id, name and role only. */
  async members(organizationId: string): Promise<MemberDto[]> {
    const users = await this.db.getRepository(UserEntity).find({
      where: { organizationId, active: true },
      order: { name: 'ASC', id: 'ASC' },
      select: { id: true, name: true, role: true },
    })
    return users.map(({ id, name, role }) => ({ id, name, role }))
  }

  async create(actor: AuthUser, body: CreateUserBody): Promise<UserDto> {
    const passwordHash = await hashPassword(body.password, this.bcryptCost)
    return this.db.transaction(async (manager) => {
      const repo = manager.getRepository(UserEntity)
      if (await repo.existsBy({ email: body.email })) {
        throw conflict('A user with this e-mail already exists', [{ field: 'email', message: 'Already in use' }])
      }
      const user = await repo.save({
        id: randomUUID(),
        organizationId: actor.organizationId,
        email: body.email,
        name: body.name,
        role: body.role,
        passwordHash,
        active: true,
        licenceNumber: body.licenceNumber ?? null,
        licenceRegion: body.licenceRegion ?? null,
        licenceExpiry: body.licenceExpiry ?? null,
      })
      await this.audit.record(
        { organizationId: actor.organizationId, actorId: actor.id, action: 'user.created', entityType: 'user', entityId: user.id, data: { email: user.email, role: user.role } },
        manager,
      )
      return this.toDto(user, manager)
    })
  }

  async update(actor: AuthUser, id: string, body: UpdateUserBody): Promise<UserDto> {
    const user = await this.getInOrganization(actor.organizationId, id)
    if (user.id === actor.id && body.active === false) {
      throw conflict('You cannot deactivate your own account', [{ field: 'active', message: 'Ask another administrator' }])
    }
    if (user.id === actor.id && body.role !== undefined && body.role !== 'admin') {
      throw conflict('You cannot remove your own administrator role', [{ field: 'role', message: 'Ask another administrator' }])
    }
    const updated = await this.db.transaction(async (manager) => {
      const changes: Record<string, { from: unknown; to: unknown }> = {}
      for (const [key, value] of Object.entries(body) as [keyof UpdateUserBody, unknown][]) {
        if (value !== undefined && user[key] !== value) changes[key] = { from: user[key], to: value }
      }
      const saved = await manager.getRepository(UserEntity).save({ ...user, ...body })
      if (body.active === false && user.active) {
        // a deactivated user's refresh tokens die with the account; access tokens are refused per request
        await manager.getRepository(RefreshTokenEntity).update({ userId: user.id }, { revokedAt: new Date() })
      }
      if (Object.keys(changes).length) {
        await this.audit.record(
          {
            organizationId: actor.organizationId,
            actorId: actor.id,
            action: body.active === false ? 'user.deactivated' : 'user.updated',
            entityType: 'user',
            entityId: user.id,
            fromState: changes.role ? String(changes.role.from) : null,
            toState: changes.role ? String(changes.role.to) : null,
            data: { changes },
          },
          manager,
        )
      }
      return this.toDto(saved, manager)
    })
    // committed: this process stops using the old row now; others hear of it by notification
    this.signedIn?.forget(user.id)
    return updated
  }
}
