import type { ApiErrorBody, FieldError } from './types'

/** Status 0: the request never got an answer (offline, server down, CORS). */
export const NETWORK_ERROR_STATUS = 0

/** Every failed API call rejects with this, whatever the server (or the network) sent. */
export class ApiError extends Error {
  override readonly name = 'ApiError'

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: readonly FieldError[] = [],
  ) {
    super(message)
  }

  /** The message the API gave for one field, if any. */
  fieldMessage(field: string): string | undefined {
    return this.fields.find((f) => f.field === field)?.message
  }
}

export function networkError(cause: unknown): ApiError {
  const error = new ApiError(
    NETWORK_ERROR_STATUS,
    'network_error',
    'Cannot reach the Stringline server. Check your connection and try again.',
  )
  error.cause = cause
  return error
}

/** A success status whose body is not JSON: typically a proxy answering /api with the app's own page. */
export function unreadableAnswer(status: number, cause: unknown): ApiError {
  const error = new ApiError(
    status,
    'unreadable_answer',
    'The server sent an answer Stringline cannot read. Try again; if it keeps happening, tell your administrator.',
  )
  error.cause = cause
  return error
}

function isFieldError(value: unknown): value is FieldError {
  return (
    typeof value === 'object' &&
    value !== null &&
    typeof (value as FieldError).field === 'string' &&
    typeof (value as FieldError).message === 'string'
  )
}

function isErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null) return false
  const error = (value as ApiErrorBody).error
  return typeof error === 'object' && error !== null && typeof error.code === 'string' && typeof error.message === 'string'
}

/** Turns a failed response into an ApiError; bodies that are not our error shape get a plain message. */
export async function errorFromResponse(response: Response): Promise<ApiError> {
  const text = await response.text().catch(() => '')
  let body: unknown = undefined
  try {
    body = text ? JSON.parse(text) : undefined
  } catch {
    // not JSON (a proxy error page, for example): fall through to the plain message
  }
  if (isErrorBody(body)) {
    const fields = Array.isArray(body.error.fields) ? body.error.fields.filter(isFieldError) : []
    return new ApiError(response.status, body.error.code, body.error.message, fields)
  }
  const reason = response.statusText ? ` (${response.statusText})` : ''
  return new ApiError(
    response.status,
    `http_${response.status}`,
    `The server answered ${response.status}${reason}. Try again; if it keeps happening, tell your administrator.`,
  )
}
