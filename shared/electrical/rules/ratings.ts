import { fmt } from '../format'
import { necRef } from '../reference'
import type { Derived, NecEdition, Status } from '../types'

/** A computed value held against one limit of a rating, window or code section. */
export interface LimitCheck {
  edition: NecEdition
  key: string
  label: string
  /** The computed value [unit]. */
  value: number
  unit: string
  /** The limit [unit]. */
  limit: number
  /** What the limit is, e.g. "inverter maximum DC input voltage". */
  limitName: string
  /** Code section making the limit binding; null for a manufacturer's operating window. */
  section: string | null
  /** Status when the limit is crossed: `fail` for ratings and code limits, `warn` for lost energy. */
  whenCrossed: Exclude<Status, 'pass' | 'info'>
  /** What to do when the limit is crossed. */
  advice: string
}

function check(c: LimitCheck, ok: boolean, sign: [string, string], spare: number): Derived {
  return {
    key: c.key,
    label: c.label,
    value: c.value,
    unit: c.unit,
    formula: `${fmt(c.value, 1)} ${c.unit} ${ok ? sign[0] : sign[1]} ${fmt(c.limit, 1)} ${c.unit}`,
    reference: c.section === null ? '' : necRef(c.edition, c.section),
    status: ok ? 'pass' : c.whenCrossed,
    message: ok
      ? `Within the ${c.limitName} with ${fmt(spare, 1)} ${c.unit} to spare.`
      : `Crosses the ${c.limitName} by ${fmt(-spare, 1)} ${c.unit}; ${c.advice}`,
  }
}

/**
 * Passes when the value does not exceed the limit, e.g. a maximum voltage against an equipment
 * rating. Equipment ratings bind through 110.3(B) (2017, 2020, 2023).
 */
export function checkNotAbove(c: LimitCheck): Derived {
  return check(c, c.value <= c.limit, ['≤', '>'], c.limit - c.value)
}

/** Passes when the value is not below the limit, e.g. a hot-day voltage against an MPPT minimum. */
export function checkNotBelow(c: LimitCheck): Derived {
  return check(c, c.value >= c.limit, ['≥', '<'], c.value - c.limit)
}
