import { Reply, route } from '../http/route'

export const healthRoutes = [
  route({
    method: 'get',
    path: '/api/health',
    access: 'public',
    summary: 'Liveness, database reachability and, when the API runs as several processes, how many of them listen',
    handler: async ({ services }) => {
      const up = await services.health.databaseUp()
      const apiProcesses = services.health.apiProcesses() ?? undefined
      return up ? { status: 'ok', db: 'up', apiProcesses } : new Reply(503, { status: 'degraded', db: 'down', apiProcesses })
    },
  }),
]
