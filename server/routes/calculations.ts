import { ANY_ROLE } from '../../shared/auth/roles'
import { designDocumentJsonSchema, evaluateDocument } from '../../shared/electrical'
import { HttpError } from '../http/errors'
import { route } from '../http/route'

/** The schema never changes while the process runs: build it once, on first request. */
let jsonSchema: Record<string, unknown> | undefined

export const calculationRoutes = [
  route({
    method: 'post',
    path: '/api/calculations',
    access: ANY_ROLE,
    summary: 'Compute a design document without saving it: every rule with its derivation',
    handler: ({ req }) => {
      const evaluation = evaluateDocument(req.body)
      if (!evaluation.valid) {
        const fields = evaluation.issues.map((i) => ({ field: i.field, message: i.message }))
        throw new HttpError(400, 'invalid_design', `Invalid design document: ${fields.map((f) => f.field).join(', ')}`, fields)
      }
      return evaluation
    },
  }),
  route({
    method: 'get',
    path: '/api/calculations/schema',
    access: ANY_ROLE,
    summary: 'JSON Schema of the design document',
    handler: () => (jsonSchema ??= designDocumentJsonSchema()),
  }),
]
