import express from 'express'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { errorHandler } from '../../server/http/error-handler'
import { mountRoutes } from '../../server/http/mount'
import { route } from '../../server/http/route'
import { buildRoutes } from '../../server/routes'
import type { Services } from '../../server/services'
import { SAFETY_CAUTION } from '../../shared/electrical/caution'
import { startHarness, testConfig, type Harness } from './support/harness'

let h: Harness
beforeAll(async () => {
  h = await startHarness()
})
afterAll(() => h.close())

type Operation = {
  summary: string
  description: string
  'x-access': string | string[]
  security: unknown[]
  parameters: { name: string; in: string; required: boolean }[]
  requestBody?: { content: Record<string, { schema: { properties: Record<string, { type?: string; format?: string }>; required?: string[] } }> }
  responses: Record<string, unknown>
}

describe('GET /api/docs', () => {
  it('is public JSON: an OpenAPI 3.1 document of every route in the table, each with its access', async () => {
    const res = await request(h.app).get('/api/docs')
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/application\/json/)
    expect(res.body.openapi).toBe('3.1.0')
    expect(res.body.info.description).toContain(SAFETY_CAUTION)
    const paths = res.body.paths as Record<string, Record<string, Operation>>
    const routes = buildRoutes(testConfig())
    const documented = Object.values(paths).reduce((n, ops) => n + Object.keys(ops).length, 0)
    expect(documented).toBe(routes.length)
    for (const r of routes) {
      const op = paths[r.path.replace(/:(\w+)/g, '{$1}')]?.[r.method]
      expect(op, `${r.method} ${r.path}`).toBeDefined()
      expect(op!.summary).toBe(r.summary)
      if (r.access === 'public') {
        expect(op!.description).toContain('public')
        expect(op!.security).toEqual([])
      } else {
        expect(op!.description).toBe(`Access: ${r.access.join(', ')}.`)
        expect(op!['x-access']).toEqual([...r.access])
        expect(op!.responses).toHaveProperty('403')
      }
    }
  })

  it('describes bodies and parameters from the routes\u2019 own zod schemas', async () => {
    const paths = (await request(h.app).get('/api/docs')).body.paths as Record<string, Record<string, Operation>>
    const create = paths['/api/projects']!.post!
    const schema = create.requestBody!.content['application/json']!.schema
    expect(schema.required).toEqual(expect.arrayContaining(['code', 'name', 'customerName', 'siteAddress', 'siteCity', 'systemKind']))
    expect(schema.required).not.toContain('customerEmail')
    const list = paths['/api/projects']!.get!
    expect(list.parameters.map((p) => p.name)).toEqual(expect.arrayContaining(['page', 'pageSize', 'sort', 'q', 'status', 'assigneeId']))
    expect(list.parameters.every((p) => p.in === 'query' && !p.required)).toBe(true)

    const upload = paths['/api/equipment/{id}/datasheet']!.post!
    expect(upload.parameters).toEqual([expect.objectContaining({ name: 'id', in: 'path', required: true })])
    const form = upload.requestBody!.content['multipart/form-data']!.schema
    expect(form.properties.file).toMatchObject({ type: 'string', format: 'binary' })
    expect(form.required).toEqual(['version', 'file'])
    expect(upload.responses).toHaveProperty('413')
    expect(upload.responses).toHaveProperty('415')

    const answer = (paths['/api/projects']!.get!.responses['2XX'] as { content: Record<string, { schema: { properties: Record<string, unknown> } }> }).content
    expect(Object.keys(answer['application/json']!.schema.properties)).toEqual(['items', 'total', 'page', 'pageSize'])
    const ids = Object.values(paths).flatMap((ops) => Object.values(ops).map((op) => (op as unknown as { operationId: string }).operationId))
    expect(new Set(ids).size).toBe(ids.length)
  })

  it('under test, an answer that does not match its documented schema fails loudly instead of drifting', async () => {
    const drifting = route({
      method: 'get',
      path: '/api/drift',
      access: 'public',
      summary: 'Answers a body its schema refuses',
      response: z.object({ count: z.number() }),
      handler: () => ({ count: 'three' }),
    })
    const app = express()
    app.use(mountRoutes([drifting], {} as Services, () => (_req, _res, next) => next(), { jsonBodyLimit: '1kb', uploadMaxBytes: 1024, nodeEnv: 'test' }))
    app.use(errorHandler(pino({ level: 'silent' })))
    expect((await request(app).get('/api/drift')).status).toBe(500)
  })
})
