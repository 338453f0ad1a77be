import type { Request, RequestHandler, Response } from 'express'
import { z } from 'zod'
import type { Role } from '../../shared/auth/roles'
import type { AuthUser } from '../auth/auth-user'
import type { Services } from '../services'

/** Who may call a route: nobody signed in needed, or the listed roles. */
export type Access = 'public' | readonly Role[]

export interface RouteContext<B, Q, P> {
  /** The signed-in user; null only on public routes. */
  user: AuthUser | null
  body: B
  query: Q
  params: P
  services: Services
  /** The uploaded file on an upload route (absent when the form had none). */
  file?: Express.Multer.File
  req: Request
  res: Response
}

/** A response with a status other than 200; `body` undefined sends no content. */
export class Reply {
  constructor(
    readonly status: number,
    readonly body?: unknown,
  ) {}
}

/** A file sent as the response body, with the name the browser saves it under. */
export class Download {
  constructor(
    readonly body: Buffer | string,
    readonly mediaType: string,
    readonly fileName: string,
    /** `inline` lets the browser show it (PDF and SVG previews); downloads by default. */
    readonly disposition: 'attachment' | 'inline' = 'attachment',
  ) {}
}

/** A route that takes one file as multipart/form-data instead of a JSON body. */
export interface UploadSpec {
  /** Form field that carries the file. */
  field: string
  /** One line for the API documentation, e.g. "PDF datasheet". */
  description: string
}

export interface RouteDef<B = unknown, Q = unknown, P = unknown> {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete'
  /** Express path under the app root, e.g. `/api/users/:id`. */
  path: string
  /** Declared here, enforced by the router, walked by the route-table test. */
  access: Access
  /** One line for the API documentation. */
  summary: string
  /** JSON body; on an upload route, the text fields of the form. */
  body?: z.ZodType<B>
  query?: z.ZodType<Q>
  params?: z.ZodType<P>
  /** Schema of the JSON success body: documented in OpenAPI and checked on every answer under test. */
  response?: z.ZodType
  /** Set when the route takes a file (multipart/form-data); the file is `ctx.file`. */
  upload?: UploadSpec
  /** Extra middleware run before validation, after the body is read (e.g. limits that look at the body). */
  before?: RequestHandler[]
  /** Middleware run before the body is read, e.g. a rate limit on a public upload. */
  beforeBody?: RequestHandler[]
  /** Returns the JSON body (200), a `Reply`, a `Download`, or undefined (204). */
  handler: (ctx: RouteContext<B, Q, P>) => unknown
}

/** Declares a route; the generic parameters come from the zod schemas. */
export function route<B = undefined, Q = undefined, P = undefined>(def: RouteDef<B, Q, P>): RouteDef<B, Q, P> {
  return def
}

/** A route of any shape, for tables of routes. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyRoute = RouteDef<any, any, any>

/** The answer of a paged list: `{ items, total, page, pageSize }`. */
export const pageResponse = (item: z.ZodType) =>
  z.object({ items: z.array(item), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() })
