import { computed, reactive, watch } from 'vue'
import type { z } from 'zod'
import type { ApiError } from '@/api/errors'

/**
 * Validates a form model with a zod schema as the user types (each field once it has been
 * edited, every field on submit) and shows the API's field errors beside the fields they name
 * until the field is edited again. The model may hold values the schema refuses ('' for a
 * choice not made yet); that is what the messages are for.
 */
export function useFormErrors<Output, Model extends Record<string, unknown>>(
  schema: z.ZodType<Output>,
  model: Model,
) {
  type Field = Extract<keyof Model, string>
  const fields = Object.keys(model) as Field[]
  const edited = new Set<string>()
  const typed = reactive<Record<string, string>>({})
  const fromServer = reactive<Record<string, string>>({})

  function isField(name: unknown): name is Field {
    return typeof name === 'string' && (fields as string[]).includes(name)
  }

  function check(everyField: boolean): Output | null {
    const result = schema.safeParse(model)
    for (const field of fields) delete typed[field]
    if (result.success) return result.data
    for (const issue of result.error.issues) {
      const field = issue.path[0]
      if (isField(field) && (everyField || edited.has(field)) && typed[field] === undefined) {
        typed[field] = issue.message
      }
    }
    return null
  }

  for (const field of fields) {
    watch(
      () => model[field],
      () => {
        edited.add(field)
        delete fromServer[field]
        check(false)
      },
      // synchronous so that a form reset followed by reset() leaves no field marked as edited
      { flush: 'sync' },
    )
  }

  /** Message per field: what is wrong with what the user typed, else what the server said about it. */
  const messages = computed(() => {
    const shown: Partial<Record<Field, string>> = {}
    for (const field of fields) {
      const message = typed[field] ?? fromServer[field]
      if (message !== undefined) shown[field] = message
    }
    return shown
  })

  return {
    messages,
    /** Checks every field; the parsed body when valid, else `null` with every message shown. */
    validate: () => check(true),
    /**
     * Places the error's field messages beside their fields. Returns the text to show above the
     * form: the error's message, joined with field messages the form has no field for.
     */
    showApiError(error: ApiError): string {
      const unplaced: string[] = []
      for (const { field, message } of error.fields) {
        if (isField(field)) fromServer[field] = message
        else unplaced.push(`${field}: ${message}`)
      }
      return [error.message, ...unplaced].join(' ')
    },
    placeOnField(field: Field, message: string): void {
      fromServer[field] = message
    },
    /** Call after putting fresh values in the model. */
    reset(): void {
      edited.clear()
      for (const field of fields) {
        delete typed[field]
        delete fromServer[field]
      }
    },
  }
}
