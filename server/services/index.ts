import type { DataSource } from 'typeorm'
import type { AppConfig } from '../config'
import { AuditService } from './audit-service'
import { AuthService } from './auth-service'
import { HealthService } from './health-service'
import { UserService } from './user-service'

/** The domain services of one app instance, built once over its data source. */
export interface Services {
  audit: AuditService
  auth: AuthService
  health: HealthService
  users: UserService
}

export function createServices(db: DataSource, config: AppConfig): Services {
  const audit = new AuditService(db)
  const users = new UserService(db, audit, config.bcryptCost)
  return { audit, users, auth: new AuthService(db, config, users, audit), health: new HealthService(db) }
}
