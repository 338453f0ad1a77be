import type { AppConfig } from '../config'
import type { AnyRoute } from '../http/route'
import { auditRoutes } from './audit'
import { authRoutes } from './auth'
import { healthRoutes } from './health'
import { userRoutes } from './users'

/** The route table: every API route, each with its access declaration. */
export function buildRoutes(config: AppConfig): AnyRoute[] {
  return [...healthRoutes, ...authRoutes(config), ...userRoutes, ...auditRoutes]
}
