import { z } from 'zod'
import { MAX_PAGE_SIZE } from '../../shared/schemas/paging'
import { route } from '../http/route'

export const auditRoutes = [
  route({
    method: 'get',
    path: '/api/audit-events',
    access: ['admin'],
    summary: 'The organisation audit log, newest first',
    query: z.object({
      page: z.coerce.number().int().min(1).default(1),
      pageSize: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(50),
    }),
    handler: ({ user, query, services }) => services.audit.list(user!.organizationId, query.page, query.pageSize),
  }),
]
