import { z } from 'zod'
import {
  SUBMISSION_STEP_DETAILS,
  type PaperworkAction,
  type RecordCorrectionsDetails,
  type RecordPermitDetails,
  type RecordResubmittalDetails,
  type RecordSubmissionDetails,
  type SubmissionStepBody,
} from '@shared/schemas/submission'

/** The paperwork steps' details as a step dialog's form holds them: every field a string as typed. */

type DetailField = keyof RecordSubmissionDetails | keyof RecordCorrectionsDetails | keyof RecordResubmittalDetails | keyof RecordPermitDetails
export type PaperworkForm = Partial<Record<DetailField, string>>

/** Dates of things that have happened: they start at today and may not lie ahead of it (the server refuses that too). */
const HAPPENED_ON: readonly DetailField[] = ['submittedOn', 'receivedOn', 'resubmittedOn', 'issuedOn']

const fieldsOf = (action: PaperworkAction) => Object.keys(SUBMISSION_STEP_DETAILS[action].shape) as DetailField[]

/** A blank form for the step: its own fields only, dates that have happened set to today. */
export function paperworkForm(action: PaperworkAction, today: string): PaperworkForm {
  return Object.fromEntries(fieldsOf(action).map((field) => [field, HAPPENED_ON.includes(field) ? today : '']))
}

/** The letter's items as typed into the text box: one per line, blank lines left out. */
export const itemLines = (text: string) => text.split('\n').map((line) => line.trim()).filter(Boolean)

const isDate = (value: unknown) => z.iso.date().safeParse(value).success
/** A date rule runs as soon as its own dates are typed, whatever else the form still lacks. */
const onceDates = (...fields: DetailField[]) => ({
  when: (payload: { value: unknown }) => fields.every((field) => isDate((payload.value as Record<string, unknown>)[field])),
})

/**
 * The step's own schema (the one the server checks) over the form: optional fields left empty are
 * left out and the items are read one per line; then the server's date rules (not after today,
 * due after received, expiry after issue). Issues keep the detail's name, which is the form field's.
 */
export function paperworkSchema(action: PaperworkAction, today: string): z.ZodType<SubmissionStepBody> {
  const shape = SUBMISSION_STEP_DETAILS[action].shape as Record<string, z.ZodType>
  const fields = fieldsOf(action)
  const optional = fields.filter((field) => shape[field]!.safeParse(undefined).success)
  const fromForm = (form: unknown) => {
    const typed = form as Record<string, string | undefined>
    const entries = fields.map((field) => {
      const value = typed[field] ?? ''
      if (field === 'items') return [field, itemLines(value)] as const
      return [field, optional.includes(field) && value.trim() === '' ? undefined : value] as const
    })
    return Object.fromEntries(entries.filter(([, value]) => value !== undefined))
  }

  let details = SUBMISSION_STEP_DETAILS[action] as z.ZodType<SubmissionStepBody>
  const date = (values: SubmissionStepBody, field: DetailField) => values[field] as string
  for (const field of HAPPENED_ON.filter((f) => fields.includes(f))) {
    details = details.refine((d) => date(d, field) <= today, { path: [field], message: 'must not be after today', ...onceDates(field) })
  }
  if (fields.includes('responseDueOn')) {
    details = details.refine((d) => date(d, 'responseDueOn') >= date(d, 'receivedOn'), { path: ['responseDueOn'], message: 'must not be before the letter was received', ...onceDates('receivedOn', 'responseDueOn') })
  }
  if (fields.includes('expiresOn')) {
    details = details.refine((d) => date(d, 'expiresOn') > date(d, 'issuedOn'), { path: ['expiresOn'], message: 'must be after the permit was issued', ...onceDates('issuedOn', 'expiresOn') })
  }
  return z.preprocess(fromForm, details)
}
