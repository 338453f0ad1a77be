import { Router, type RequestHandler } from 'express'
import type { Role } from '../../shared/auth/roles'
import type { Services } from '../services'
import { parseOrThrow } from './validation'
import { Reply, type AnyRoute } from './route'

/** Builds the Express router from the route table: access guard, limits, validation, handler. */
export function mountRoutes(
  routes: AnyRoute[],
  services: Services,
  requireRoles: (roles: readonly Role[]) => RequestHandler,
): Router {
  const router = Router()
  for (const def of routes) {
    const guard: RequestHandler[] = def.access === 'public' ? [] : [requireRoles(def.access)]
    const handler: RequestHandler = async (req, res) => {
      const result = await def.handler({
        user: req.user ?? null,
        body: def.body ? parseOrThrow(def.body, req.body ?? {}, 'body') : undefined,
        query: def.query ? parseOrThrow(def.query, req.query, 'query') : undefined,
        params: def.params ? parseOrThrow(def.params, req.params, 'params') : undefined,
        services,
        req,
        res,
      })
      if (result instanceof Reply) {
        if (result.body === undefined) res.status(result.status).end()
        else res.status(result.status).json(result.body)
      } else if (result === undefined) {
        res.status(204).end()
      } else {
        res.json(result)
      }
    }
    router[def.method](def.path, ...guard, ...(def.before ?? []), handler)
  }
  return router
}
