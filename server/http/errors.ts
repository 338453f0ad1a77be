/** A field-level reason, named by its JSON path (e.g. `strings.2.modulesInSeries`). */
export interface FieldError {
  field: string
  message: string
}

/** The one error body every route answers with: `{ error: { code, message, fields? } }`. */
export interface ErrorBody {
  error: { code: string; message: string; fields?: FieldError[] }
  /** Extra members beside `error`, e.g. the current row of a version conflict. */
  [extra: string]: unknown
}

/** An error meant for the client: its status, code and message are sent as they are. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: FieldError[],
    /** Sent beside `error` in the body (never inside it), e.g. `{ current }` on a version conflict. */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message)
  }
}

export const badRequest = (message: string, fields?: FieldError[]) => new HttpError(400, 'invalid_request', message, fields)
export const unauthorized = (message = 'Sign in to continue') => new HttpError(401, 'unauthorized', message)
export const forbidden = (message = 'Your role may not do this') => new HttpError(403, 'forbidden', message)
export const notFound = (what = 'Resource') => new HttpError(404, 'not_found', `${what} not found`)
export const conflict = (message: string, fields?: FieldError[]) => new HttpError(409, 'conflict', message, fields)
export const unprocessable = (message: string, fields?: FieldError[]) =>
  new HttpError(422, 'unprocessable', message, fields)
export const payloadTooLarge = (message: string, fields?: FieldError[]) => new HttpError(413, 'payload_too_large', message, fields)
export const unsupportedMediaType = (message: string, fields?: FieldError[]) =>
  new HttpError(415, 'unsupported_media_type', message, fields)

/**
 * Someone else saved first: 409 with the version and the row as they are now, so the client can
 * show what changed and nothing typed is lost.
 */
export const versionConflict = (what: string, current: { version: number }, currentBody: Record<string, unknown>) =>
  new HttpError(
    409,
    'version_conflict',
    `${what} was changed by someone else (now version ${current.version}); reload it or reapply your changes`,
    [{ field: 'version', message: `is no longer current; the current version is ${current.version}` }],
    { currentVersion: current.version, ...currentBody },
  )
