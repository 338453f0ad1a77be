import type { AppConfig } from '../config'
import type { AnyRoute } from '../http/route'
import { auditRoutes } from './audit'
import { authRoutes } from './auth'
import { calculationRoutes } from './calculations'
import { designRoutes } from './designs'
import { docsRoutes } from './docs'
import { equipmentRoutes } from './equipment'
import { healthRoutes } from './health'
import { jurisdictionRoutes } from './jurisdictions'
import { notificationRoutes } from './notifications'
import { projectRoutes } from './projects'
import { reviewRoutes } from './review'
import { revisionRoutes } from './revisions'
import { stampRoutes } from './stamps'
import { submissionRoutes } from './submissions'
import { userRoutes } from './users'
import { workflowRoutes } from './workflow'

/** The route table: every API route, each with its access declaration. */
export function buildRoutes(config: AppConfig): AnyRoute[] {
  const table: AnyRoute[] = [
    ...healthRoutes,
    ...authRoutes(config),
    ...userRoutes,
    ...auditRoutes,
    ...calculationRoutes,
    ...projectRoutes,
    ...jurisdictionRoutes,
    ...equipmentRoutes,
    ...designRoutes,
    ...revisionRoutes,
    ...workflowRoutes,
    ...notificationRoutes,
    ...stampRoutes,
    ...reviewRoutes,
    ...submissionRoutes,
  ]
  table.push(...docsRoutes(table))
  return table
}
