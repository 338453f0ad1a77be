import packageJson from '../../package.json' with { type: 'json' }
import { openApiDocument } from '../http/openapi'
import { route, type AnyRoute } from '../http/route'

/** `GET /api/docs`: the OpenAPI document of the whole route table, itself included. */
export function docsRoutes(table: readonly AnyRoute[]): AnyRoute[] {
  let document: Record<string, unknown> | undefined
  return [
    route({
      method: 'get',
      path: '/api/docs',
      access: 'public',
      summary: 'OpenAPI 3.1 description of this API (JSON)',
      // the table is complete once the app is built, so the document is made on the first call
      handler: () => (document ??= openApiDocument(table, packageJson.version)),
    }),
  ]
}
