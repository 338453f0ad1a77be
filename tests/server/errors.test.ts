import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startHarness, type Harness } from './support/harness'

let h: Harness
beforeAll(async () => {
  h = await startHarness({ JSON_BODY_LIMIT: '2kb' })
})
afterAll(() => h.close())

describe('error answers', () => {
  it('invalid JSON answers 400 in the common error shape', async () => {
    const res = await request(h.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":')
    expect(res.status).toBe(400)
    expect(res.body).toEqual({ error: { code: 'invalid_json', message: expect.any(String), fields: [{ field: 'body', message: expect.any(String) }] } })
  })

  it('a body that is not JSON answers 415', async () => {
    const res = await request(h.app).post('/api/auth/login').set('Content-Type', 'text/plain').send('email=a')
    expect(res.status).toBe(415)
    expect(res.body.error.code).toBe('unsupported_media_type')
  })

  it('a body over the limit answers 413', async () => {
    const res = await request(h.app).post('/api/auth/login').send({ email: 'a@b.example', password: 'x'.repeat(5000) })
    expect(res.status).toBe(413)
  })

  it('an unknown API route answers 404 in JSON, not the client page', async () => {
    const res = await request(h.app).get('/api/nothing-here')
    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('not_found')
  })

  it('sends security headers and no framework banner', async () => {
    const res = await request(h.app).get('/api/health')
    expect(res.headers['x-powered-by']).toBeUndefined()
    expect(res.headers['x-content-type-options']).toBe('nosniff')
    expect(res.headers['content-security-policy']).toContain("default-src 'self'")
  })
})
