import type { z } from 'zod'
import { HttpError, type FieldError } from './errors'

/** zod issues as field errors named by their path, e.g. `licenceExpiry` or `strings.2.mppt`. */
export function fieldErrors(error: z.ZodError): FieldError[] {
  return error.issues.map((issue) => ({
    field: issue.path.length ? issue.path.map(String).join('.') : '(root)',
    message: issue.message,
  }))
}

/** U+0000 and unpaired surrogates: text PostgreSQL can store in neither text nor jsonb. */
// eslint-disable-next-line no-control-regex
const UNSTORABLE = /\u0000|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/

/** Every string (and object key) in `value` that the database cannot store, by its path. */
function unstorableText(value: unknown, path: (string | number)[] = [], found: FieldError[] = []): FieldError[] {
  const field = () => (path.length ? path.map(String).join('.') : '(root)')
  if (typeof value === 'string') {
    if (UNSTORABLE.test(value)) found.push({ field: field(), message: 'must be valid Unicode text without the NUL character (U+0000) or unpaired surrogates' })
  } else if (Array.isArray(value)) {
    value.forEach((item, k) => unstorableText(item, [...path, k], found))
  } else if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) {
      if (UNSTORABLE.test(key)) found.push({ field: field(), message: 'has a key that is not valid Unicode text' })
      else unstorableText(item, [...path, key], found)
    }
  }
  return found
}

/** Parses one part of a request, answering 400 with every bad field named. */
export function parseOrThrow<T>(schema: z.ZodType<T>, value: unknown, part: 'body' | 'query' | 'params'): T {
  const unstorable = unstorableText(value)
  if (unstorable.length) throw new HttpError(400, 'invalid_request', `Invalid request ${part}: ${unstorable.map((f) => f.field).join(', ')}`, unstorable)
  const result = schema.safeParse(value)
  if (result.success) return result.data
  const fields = fieldErrors(result.error)
  const names = fields.map((f) => f.field).join(', ')
  throw new HttpError(400, 'invalid_request', `Invalid request ${part}: ${names}`, fields)
}
