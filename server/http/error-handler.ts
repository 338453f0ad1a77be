import type { ErrorRequestHandler, RequestHandler } from 'express'
import type { Logger } from 'pino'
import { QueryRunnerAlreadyReleasedError } from 'typeorm'
import { HttpError, type ErrorBody } from './errors'

const DB_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', '57P01', '57P02', '57P03'])

/** True when the error says PostgreSQL cannot be reached (as opposed to a bad query). */
export function isDatabaseUnavailable(err: unknown): boolean {
  // TypeORM releases a transaction's query runner when its connection drops, so the next query of that transaction throws this
  if (err instanceof QueryRunnerAlreadyReleasedError) return true
  let current: unknown = err
  for (let depth = 0; current && typeof current === 'object' && depth < 4; depth++) {
    const e = current as { code?: unknown; message?: unknown; driverError?: unknown; cause?: unknown }
    if (typeof e.code === 'string' && (DB_DOWN_CODES.has(e.code) || e.code.startsWith('08'))) return true
    if (typeof e.message === 'string' && /Connection terminated|timeout exceeded when trying to connect|connect ECONNREFUSED|Connection is not established/i.test(e.message)) {
      return true
    }
    current = e.driverError ?? e.cause
  }
  return false
}

function send(res: Parameters<ErrorRequestHandler>[2], status: number, body: ErrorBody) {
  if (!res.headersSent) res.status(status).json(body)
}

/** The one error handler: every failure becomes `{ error: { code, message, fields? } }`. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    if (err instanceof HttpError) {
      const body: ErrorBody = { ...err.extra, error: { code: err.code, message: err.message } }
      if (err.fields?.length) body.error.fields = err.fields
      return send(res, err.status, body)
    }
    // body-parser errors carry a `type` and a `status`
    const type = (err as { type?: string }).type
    if (type === 'entity.parse.failed') {
      return send(res, 400, { error: { code: 'invalid_json', message: 'The request body is not valid JSON', fields: [{ field: 'body', message: 'must be a well-formed JSON object or array' }] } })
    }
    if (type === 'entity.too.large') {
      return send(res, 413, { error: { code: 'payload_too_large', message: 'The request body is too large' } })
    }
    if (type === 'encoding.unsupported' || type === 'charset.unsupported') {
      return send(res, 415, { error: { code: 'unsupported_media_type', message: 'Unsupported body encoding' } })
    }
    if (isDatabaseUnavailable(err)) {
      logger.warn({ err, url: req.originalUrl }, 'database unavailable')
      res.setHeader('Retry-After', '5')
      return send(res, 503, { error: { code: 'database_unavailable', message: 'The database is not answering; try again shortly' } })
    }
    logger.error({ err, url: req.originalUrl }, 'unhandled error')
    return send(res, 500, { error: { code: 'internal_error', message: 'Something went wrong on our side' } })
  }
}

const hasBody = (req: Parameters<RequestHandler>[0]) =>
  ['POST', 'PUT', 'PATCH'].includes(req.method) &&
  (Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined)

/** Bodies must be JSON: anything else with content answers 415 before parsing. */
export const requireJsonBody: RequestHandler = (req, _res, next) => {
  if (hasBody(req) && !req.is('application/json')) {
    return next(new HttpError(415, 'unsupported_media_type', 'Send the request body as application/json'))
  }
  next()
}

/** Upload routes take multipart/form-data only; anything else answers 415 before reading it. */
export const requireMultipartBody: RequestHandler = (req, _res, next) => {
  if (!hasBody(req) || !req.is('multipart/form-data')) {
    return next(new HttpError(415, 'unsupported_media_type', 'Send the file as multipart/form-data'))
  }
  next()
}

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}`))
}
