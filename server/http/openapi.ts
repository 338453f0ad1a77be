import { z } from 'zod'
import { SAFETY_CAUTION } from '../../shared/electrical/caution'
import type { AnyRoute } from './route'

type JsonSchema = Record<string, unknown> & { properties?: Record<string, JsonSchema>; required?: string[] }

/** JSON Schema of what a client sends (`input`: defaults optional, transforms as their input) or receives (`output`). */
function jsonSchemaOf(schema: z.ZodType, io: 'input' | 'output' = 'input'): JsonSchema {
  const { $schema: _drop, ...rest } = z.toJSONSchema(schema, { io, unrepresentable: 'any', target: 'draft-2020-12' }) as JsonSchema
  return rest
}

function parameters(schema: z.ZodType | undefined, where: 'path' | 'query') {
  if (!schema) return []
  const json = jsonSchemaOf(schema)
  return Object.entries(json.properties ?? {}).map(([name, property]) => ({
    name,
    in: where,
    required: where === 'path' || (json.required ?? []).includes(name),
    schema: property,
  }))
}

function requestBody(def: AnyRoute) {
  if (def.upload) {
    const fields = def.body ? jsonSchemaOf(def.body) : { type: 'object', properties: {}, required: [] }
    return {
      required: true,
      content: {
        'multipart/form-data': {
          schema: {
            ...fields,
            properties: { ...fields.properties, [def.upload.field]: { type: 'string', format: 'binary', description: def.upload.description } },
            required: [...(fields.required ?? []), def.upload.field],
          },
        },
      },
    }
  }
  if (!def.body) return undefined
  return { required: true, content: { 'application/json': { schema: jsonSchemaOf(def.body) } } }
}

const errorResponse = (description: string) => ({ description, content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } })

function responses(def: AnyRoute) {
  const success = 'Success (200, 201 for a creation, 204 without content)'
  const out: Record<string, unknown> = {
    '2XX': def.response ? { description: success, content: { 'application/json': { schema: jsonSchemaOf(def.response, 'output') } } } : { description: success },
  }
  if (def.body || def.query || def.params || def.upload) out['400'] = errorResponse('A field is missing or malformed; `error.fields` names each one')
  if (def.access !== 'public') {
    out['401'] = errorResponse('Not signed in, or the session has ended')
    out['403'] = errorResponse('The caller\u2019s role may not call this route')
  }
  if (def.params) out['404'] = errorResponse('No such resource in the caller\u2019s organisation')
  if (['put', 'patch', 'delete'].includes(def.method) || def.body) out['409'] = errorResponse('Someone else saved first (`currentVersion` and `current` are sent), or the state does not allow it')
  if (def.upload) {
    out['413'] = errorResponse('The file is over the upload limit')
    out['415'] = errorResponse('The content of the file is not of the accepted type')
  }
  if (def.method !== 'get' && def.method !== 'delete') out['422'] = errorResponse('Well-formed but inconsistent; `error.fields` names each problem')
  return out
}

/**
 * The OpenAPI 3.1 document of a route table, from the same zod schemas the routes validate with.
 * Each operation's description names who may call it; `x-access` carries the same list.
 */
export function openApiDocument(routes: readonly AnyRoute[], version: string): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {}
  for (const def of routes) {
    const path = def.path.replace(/:(\w+)/g, '{$1}')
    const access = def.access === 'public' ? 'public (no sign-in)' : def.access.join(', ')
    paths[path] ??= {}
    paths[path][def.method] = {
      operationId: `${def.method}${path.replace(/^\/api/, '').replace(/[{}]/g, '').replace(/[/-](\w)/g, (_m, c: string) => c.toUpperCase())}`,
      summary: def.summary,
      description: `Access: ${access}.`,
      'x-access': def.access === 'public' ? 'public' : [...def.access],
      security: def.access === 'public' ? [] : [{ bearer: [] }],
      parameters: [...parameters(def.params, 'path'), ...parameters(def.query, 'query')],
      ...(requestBody(def) ? { requestBody: requestBody(def) } : {}),
      responses: responses(def),
    }
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Stringline API',
      version,
      description: `PV permitting calculations, drawings and plan sets. ${SAFETY_CAUTION}`,
    },
    servers: [{ url: '/' }],
    components: {
      securitySchemes: { bearer: { type: 'http', scheme: 'bearer', bearerFormat: 'JWT' } },
      schemas: {
        Error: {
          type: 'object',
          required: ['error'],
          properties: {
            error: {
              type: 'object',
              required: ['code', 'message'],
              properties: {
                code: { type: 'string' },
                message: { type: 'string' },
                fields: { type: 'array', items: { type: 'object', required: ['field', 'message'], properties: { field: { type: 'string' }, message: { type: 'string' } } } },
              },
            },
          },
        },
      },
    },
    paths,
  }
}
