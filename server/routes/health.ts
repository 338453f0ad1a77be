import { Reply, route } from '../http/route'

export const healthRoutes = [
  route({
    method: 'get',
    path: '/api/health',
    access: 'public',
    summary: 'Liveness and database reachability',
    handler: async ({ services }) => {
      const up = await services.health.databaseUp()
      return up ? { status: 'ok', db: 'up' } : new Reply(503, { status: 'degraded', db: 'down' })
    },
  }),
]
