import type { Evaluation } from '../../shared/electrical/evaluate'
import type { FieldError } from '../http/errors'

/**
 * What stops a design from being issued as a plan set: input errors (named by their document field)
 * and every failing check (named by its result key). Warnings do not stop it; they print on the sheets.
 */
export function generationBlockers(evaluation: Evaluation): FieldError[] {
  const inputErrors = evaluation.issues.filter((i) => i.severity === 'error').map((i) => ({ field: `document.${i.field}`, message: i.message }))
  const failing = [...evaluation.summary, ...evaluation.sections.flatMap((s) => s.items)]
    .filter((item) => item.status === 'fail')
    .map((item) => ({ field: item.key, message: `${item.label}: ${item.message}` }))
  return [...inputErrors, ...failing]
}

/** The sentence a 422 or a failed job starts with. */
export function blockersMessage(blockers: readonly FieldError[]): string {
  return `The design cannot be issued: ${blockers.length} input error(s) or failing check(s) must be resolved first`
}
