import { CONDUCTOR_SIZES, NEC_EDITIONS, type EngineIssue } from '../types'

/**
 * Input checks shared by the rules: each returns an issue naming the field and the reason, or
 * null when the value is acceptable. Rules collect these before computing anything, so no rule
 * ever computes with NaN, Infinity or an unknown key.
 */
export function inputIssue(field: string, message: string): EngineIssue {
  return { field, message, severity: 'error' }
}

export function collectIssues(...found: (EngineIssue | null)[]): EngineIssue[] {
  return found.filter((i): i is EngineIssue => i !== null)
}

export function checkInputObject(input: unknown): EngineIssue | null {
  return typeof input === 'object' && input !== null && !Array.isArray(input)
    ? null
    : inputIssue('', 'expected an object with the calculation inputs')
}

function describe(value: unknown): string {
  if (typeof value === 'string') return `"${value}"`
  if (typeof value === 'number' || typeof value === 'boolean' || value == null) return String(value)
  return typeof value
}

/** A finite number greater than zero. */
export function checkPositive(field: string, value: unknown, unit: string): EngineIssue | null {
  if (typeof value !== 'number' || !Number.isFinite(value)) return inputIssue(field, `must be a number in ${unit}, got ${describe(value)}`)
  return value > 0 ? null : inputIssue(field, `must be greater than 0 ${unit}, got ${value}`)
}

/** A finite number within [min, max]. */
export function checkInRange(field: string, value: unknown, unit: string, min: number, max: number): EngineIssue | null {
  if (typeof value !== 'number' || !Number.isFinite(value)) return inputIssue(field, `must be a number in ${unit}, got ${describe(value)}`)
  return value >= min && value <= max ? null : inputIssue(field, `must be between ${min} and ${max} ${unit}, got ${value}`)
}

/** A whole number of at least `min`. */
export function checkWholeNumber(field: string, value: unknown, min: number): EngineIssue | null {
  return typeof value === 'number' && Number.isInteger(value) && value >= min
    ? null
    : inputIssue(field, `must be a whole number of at least ${min}, got ${describe(value)}`)
}

export function checkOneOf<T>(field: string, value: unknown, allowed: readonly T[]): EngineIssue | null {
  return allowed.includes(value as T)
    ? null
    : inputIssue(field, `must be one of ${allowed.map((a) => String(a)).join(', ')}, got ${describe(value)}`)
}

export function checkBoolean(field: string, value: unknown): EngineIssue | null {
  return typeof value === 'boolean' ? null : inputIssue(field, `must be true or false, got ${describe(value)}`)
}

export function checkKey(value: unknown): EngineIssue | null {
  return typeof value === 'string' && value.trim() !== '' ? null : inputIssue('key', 'must be a non-empty result key, e.g. "run.R1"')
}

export const checkEdition = (value: unknown): EngineIssue | null => checkOneOf('edition', value, NEC_EDITIONS)

export const checkSize = (field: string, value: unknown): EngineIssue | null => checkOneOf(field, value, CONDUCTOR_SIZES)

export const checkMaterial = (value: unknown): EngineIssue | null => checkOneOf('material', value, ['Cu', 'Al'])
