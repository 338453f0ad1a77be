import express, { Router, type RequestHandler } from 'express'
import { create as contentDisposition } from 'content-disposition'
import multer from 'multer'
import type { Role } from '../../shared/auth/roles'
import type { Services } from '../services'
import { requireJsonBody, requireMultipartBody } from './error-handler'
import { badRequest, payloadTooLarge } from './errors'
import { parseOrThrow } from './validation'
import { Download, Reply, type AnyRoute, type UploadSpec } from './route'

export interface MountOptions {
  /** Largest JSON body, in body-parser notation (e.g. `1mb`). */
  jsonBodyLimit: string
  /** Largest uploaded file [bytes]. */
  uploadMaxBytes: number
  /** `test` checks every success body against its route's `response` schema, so the documentation cannot drift. */
  nodeEnv: string
}

/** Fails loudly when an answer does not have the shape the route documents. */
function checkResponse(def: AnyRoute, body: unknown): void {
  if (!def.response) return
  const result = def.response.safeParse(body)
  if (!result.success) {
    throw new Error(`${def.method.toUpperCase()} ${def.path} answered a body its response schema refuses: ${result.error.message}`)
  }
}

/** Reads one file into memory; multer's limit errors become 413 / 400 naming the field. */
function readUpload(spec: UploadSpec, maxBytes: number): RequestHandler {
  // browsers send file names as UTF-8 without saying so; busboy's default would read them as Latin-1
  const single = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: maxBytes, files: 1, fields: 20 } }).single(spec.field)
  return (req, res, next) => {
    single(req, res, (err: unknown) => {
      if (!err) return next()
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          const mb = (maxBytes / 1024 / 1024).toFixed(1)
          return next(payloadTooLarge(`The file is larger than the ${mb} MB limit`, [{ field: spec.field, message: `must be at most ${maxBytes} bytes` }]))
        }
        const field = err.code === 'LIMIT_UNEXPECTED_FILE' ? (err.field ?? spec.field) : spec.field
        return next(badRequest(`The form could not be read: ${err.message}`, [{ field, message: `send one file in the form field "${spec.field}"` }]))
      }
      next(badRequest('The multipart form is malformed', [{ field: spec.field, message: (err as Error).message }]))
    })
  }
}

/** Builds the Express router from the route table: access guard, body parsing, limits, validation, handler. */
export function mountRoutes(
  routes: AnyRoute[],
  services: Services,
  requireRoles: (roles: readonly Role[]) => RequestHandler,
  options: MountOptions,
): Router {
  const router = Router()
  const json = [requireJsonBody, express.json({ limit: options.jsonBodyLimit })]
  for (const def of routes) {
    const guard: RequestHandler[] = def.access === 'public' ? [] : [requireRoles(def.access)]
    // the caller is checked before a body is read, so strangers cannot make us parse large uploads
    const bodyParsers = def.upload ? [requireMultipartBody, readUpload(def.upload, options.uploadMaxBytes)] : json
    const handler: RequestHandler = async (req, res) => {
      const result = await def.handler({
        user: req.user ?? null,
        body: def.body ? parseOrThrow(def.body, req.body ?? {}, 'body') : undefined,
        query: def.query ? parseOrThrow(def.query, req.query, 'query') : undefined,
        params: def.params ? parseOrThrow(def.params, req.params, 'params') : undefined,
        services,
        file: req.file,
        req,
        res,
      })
      if (options.nodeEnv === 'test' && !(result instanceof Download) && result !== undefined) {
        checkResponse(def, result instanceof Reply ? result.body : result)
      }
      if (result instanceof Reply) {
        if (result.body === undefined) res.status(result.status).end()
        else res.status(result.status).json(result.body)
      } else if (result instanceof Download) {
        res.setHeader('Content-Disposition', contentDisposition(result.fileName, { type: result.disposition }))
        res.type(result.mediaType).send(result.body)
      } else if (result === undefined) {
        res.status(204).end()
      } else {
        res.json(result)
      }
    }
    router[def.method](def.path, ...guard, ...(def.beforeBody ?? []), ...bodyParsers, ...(def.before ?? []), handler)
  }
  return router
}
