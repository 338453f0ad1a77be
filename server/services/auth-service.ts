import { randomUUID, type KeyObject } from 'node:crypto'
import { IsNull, type DataSource } from 'typeorm'
import type { LoginBody, UserDto } from '../../shared/schemas/auth'
import type { AuthUser } from '../auth/auth-user'
import type { SignedInUsers } from '../auth/signed-in-users'
import { decoyHash, verifyPassword } from '../auth/passwords'
import { hashRefreshToken, jwtKey, newRefreshToken, signAccessToken } from '../auth/tokens'
import type { AppConfig } from '../config'
import { RefreshTokenEntity, UserEntity, type User } from '../entities'
import { HttpError } from '../http/errors'
import type { AuditService } from './audit-service'
import type { UserService } from './user-service'

/** One message for an unknown e-mail and a wrong password, so accounts cannot be discovered. */
export const INVALID_CREDENTIALS = 'Email or password is incorrect'

export interface Session {
  token: string
  refreshToken: string
  user: UserDto
}

const invalidCredentials = () => new HttpError(401, 'invalid_credentials', INVALID_CREDENTIALS)
const invalidRefresh = () => new HttpError(401, 'invalid_refresh', 'Your session has ended; sign in again')

/** Sign-in, refresh-token rotation and sign-out. */
export class AuthService {
  private readonly decoy: string
  private readonly tokenKey: KeyObject

  constructor(
    private readonly db: DataSource,
    private readonly config: AppConfig,
    private readonly users: UserService,
    private readonly audit: AuditService,
    /** Users kept between requests, forgotten when their row changes; without it every request reads the row. */
    private readonly signedIn?: SignedInUsers,
  ) {
    this.decoy = decoyHash(config.bcryptCost)
    this.tokenKey = jwtKey(config.jwtSecret)
  }

  async login(body: LoginBody): Promise<Session> {
    const user = await this.db.getRepository(UserEntity).findOneBy({ email: body.email })
    const matches = await verifyPassword(body.password, user?.passwordHash ?? this.decoy)
    if (!user || !matches || !user.active) {
      if (user) {
        await this.audit.record({ organizationId: user.organizationId, actorId: null, action: 'auth.login_failed', entityType: 'user', entityId: user.id })
      }
      throw invalidCredentials()
    }
    await this.audit.record({ organizationId: user.organizationId, actorId: user.id, action: 'auth.login', entityType: 'user', entityId: user.id })
    return this.openSession(user, randomUUID())
  }

  /** Exchanges a refresh token for a new pair. A token used twice revokes its whole family. */
  async refresh(rawToken: string | undefined): Promise<Session> {
    if (!rawToken) throw invalidRefresh()
    const repo = this.db.getRepository(RefreshTokenEntity)
    const stored = await repo.findOneBy({ tokenHash: hashRefreshToken(rawToken) })
    if (!stored) throw invalidRefresh()
    if (stored.revokedAt) {
      await repo.update({ familyId: stored.familyId, revokedAt: IsNull() }, { revokedAt: new Date() })
      throw invalidRefresh()
    }
    if (stored.expiresAt <= new Date()) throw invalidRefresh()
    // revoke first and only proceed if this request did it, so two racing refreshes cannot both win
    const revoked = await repo.update({ id: stored.id, revokedAt: IsNull() }, { revokedAt: new Date() })
    if (!revoked.affected) throw invalidRefresh()
    const user = await this.db.getRepository(UserEntity).findOneBy({ id: stored.userId })
    if (!user || !user.active) throw invalidRefresh()
    return this.openSession(user, stored.familyId)
  }

  async logout(rawToken: string | undefined): Promise<void> {
    if (!rawToken) return
    const repo = this.db.getRepository(RefreshTokenEntity)
    const stored = await repo.findOneBy({ tokenHash: hashRefreshToken(rawToken) })
    if (stored) await repo.update({ familyId: stored.familyId, revokedAt: IsNull() }, { revokedAt: new Date() })
  }

  /** Loads the caller for a verified access token: inactive or vanished users are refused at once. */
  /** Every authenticated request asks this: the kept user, or one plain statement without the ORM's query building. */
  async userForToken(userId: string, organizationId: string): Promise<AuthUser | null> {
    const load = async () => {
      const rows: AuthUser[] = await this.db.query(
        'SELECT id, organization_id AS "organizationId", email, name, role FROM users WHERE id = $1 AND organization_id = $2 AND active',
        [userId, organizationId],
      )
      return rows[0] ?? null
    }
    return this.signedIn ? this.signedIn.get(userId, organizationId, load) : load()
  }

  async me(user: AuthUser): Promise<UserDto> {
    return this.users.toDto(await this.users.getInOrganization(user.organizationId, user.id))
  }

  private async openSession(user: User, familyId: string): Promise<Session> {
    const refreshToken = newRefreshToken()
    await this.db.getRepository(RefreshTokenEntity).insert({
      userId: user.id,
      familyId,
      tokenHash: hashRefreshToken(refreshToken),
      expiresAt: new Date(Date.now() + this.config.refreshTokenTtlSeconds * 1000),
    })
    const token = signAccessToken({ sub: user.id, org: user.organizationId, role: user.role }, this.tokenKey, this.config.accessTokenTtlSeconds)
    return { token, refreshToken, user: await this.users.toDto(user) }
  }
}
