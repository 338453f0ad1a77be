import type { z } from 'zod'
import { HttpError, type FieldError } from './errors'

/** zod issues as field errors named by their path, e.g. `licenceExpiry` or `strings.2.mppt`. */
export function fieldErrors(error: z.ZodError): FieldError[] {
  return error.issues.map((issue) => ({
    field: issue.path.length ? issue.path.map(String).join('.') : '(root)',
    message: issue.message,
  }))
}

/** Parses one part of a request, answering 400 with every bad field named. */
export function parseOrThrow<T>(schema: z.ZodType<T>, value: unknown, part: 'body' | 'query' | 'params'): T {
  const result = schema.safeParse(value)
  if (result.success) return result.data
  const fields = fieldErrors(result.error)
  const names = fields.map((f) => f.field).join(', ')
  throw new HttpError(400, 'invalid_request', `Invalid request ${part}: ${names}`, fields)
}
