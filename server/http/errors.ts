/** A field-level reason, named by its JSON path (e.g. `strings.2.modulesInSeries`). */
export interface FieldError {
  field: string
  message: string
}

/** The one error body every route answers with: `{ error: { code, message, fields? } }`. */
export interface ErrorBody {
  error: { code: string; message: string; fields?: FieldError[] }
}

/** An error meant for the client: its status, code and message are sent as they are. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: FieldError[],
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
