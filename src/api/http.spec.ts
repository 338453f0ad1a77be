import { describe, expect, it, vi } from 'vitest'
import { ApiError } from './errors'
import { createApiClient, type SessionLink } from './http'
import type { AuthSession } from './types'
import { aMember, errorResponse, jsonResponse as json } from '@/testing/fixtures'

const member = aMember('designer')

/** A session held the way the auth store holds it, to watch what the client does with it. */
function memorySession(token: string | null): SessionLink & { token: string | null; changes: (AuthSession | null)[] } {
  const link = {
    token,
    changes: [] as (AuthSession | null)[],
    accessToken: () => link.token,
    sessionChanged(session: AuthSession | null) {
      link.changes.push(session)
      link.token = session?.token ?? null
    },
  }
  return link
}

function bearerOf(init: RequestInit | undefined): string | undefined {
  return (init?.headers as Record<string, string> | undefined)?.Authorization
}

describe('API client', () => {
  it('sends the bearer token and parses the answer', async () => {
    const fetch = vi.fn(async (_url: string, _init?: RequestInit) => json(200, { user: member }))
    const api = createApiClient({ fetch })
    api.connectSession(memorySession('token-1'))

    await expect(api.get('/auth/me')).resolves.toEqual({ user: member })
    const [url, init] = fetch.mock.calls[0] ?? []
    expect(url).toBe('/api/auth/me')
    expect(bearerOf(init)).toBe('Bearer token-1')
  })

  it('puts query parameters in the URL and leaves empty ones out', async () => {
    const fetch = vi.fn(async (_url: string, _init?: RequestInit) => json(200, { items: [], total: 0, page: 2, pageSize: 50 }))
    const api = createApiClient({ fetch })
    await api.get('/users', { page: 2, pageSize: 50, q: '', sort: '-createdAt' })
    expect(fetch.mock.calls[0]?.[0]).toBe('/api/users?page=2&pageSize=50&sort=-createdAt')
  })

  it('on 401 refreshes once and retries the call once with the new token', async () => {
    const fetch = vi.fn(async (url: string, init?: RequestInit) => {
      if (url === '/api/auth/refresh') return json(200, { token: 'token-2', user: member })
      return bearerOf(init) === 'Bearer token-2' ? json(200, { user: member }) : errorResponse(401, 'token_expired', 'Sign in again')
    })
    const api = createApiClient({ fetch })
    const session = memorySession('token-1')
    api.connectSession(session)

    await expect(api.get('/auth/me')).resolves.toEqual({ user: member })
    expect(fetch.mock.calls.map(([url]) => url)).toEqual(['/api/auth/me', '/api/auth/refresh', '/api/auth/me'])
    expect(fetch.mock.calls[1]?.[1]?.credentials).toBe('include')
    expect(session.changes).toEqual([{ token: 'token-2', user: member }])
  })

  it('does not retry a second time when the retried call is refused too', async () => {
    const fetch = vi.fn(async (url: string) =>
      url === '/api/auth/refresh'
        ? json(200, { token: 'token-2', user: member })
        : errorResponse(401, 'token_invalid', 'Sign in again'),
    )
    const api = createApiClient({ fetch })
    api.connectSession(memorySession('token-1'))

    await expect(api.get('/auth/me')).rejects.toMatchObject({ status: 401, code: 'token_invalid' })
    expect(fetch).toHaveBeenCalledTimes(3)
  })

  it('runs one refresh for calls refused at the same time', async () => {
    let releaseRefresh: () => void = () => undefined
    const refreshAnswered = new Promise<void>((resolve) => (releaseRefresh = resolve))
    const fetch = vi.fn(async (url: string, init?: RequestInit) => {
      if (url === '/api/auth/refresh') {
        await refreshAnswered
        return json(200, { token: 'token-2', user: member })
      }
      return bearerOf(init) === 'Bearer token-2' ? json(200, { url }) : errorResponse(401, 'token_expired', 'Sign in again')
    })
    const api = createApiClient({ fetch })
    api.connectSession(memorySession('token-1'))

    const calls = Promise.all([api.get('/a'), api.get('/b'), api.get('/c'), api.refreshSession()])
    await vi.waitFor(() => expect(fetch.mock.calls.filter(([url]) => url === '/api/auth/refresh')).toHaveLength(1))
    releaseRefresh()
    const answers = await calls

    expect(answers.slice(0, 3)).toEqual([{ url: '/api/a' }, { url: '/api/b' }, { url: '/api/c' }])
    expect(fetch.mock.calls.filter(([url]) => url === '/api/auth/refresh')).toHaveLength(1)
  })

  it('ends the session when the refresh cookie is refused and reports the 401', async () => {
    const fetch = vi.fn(async (url: string) =>
      url === '/api/auth/refresh'
        ? errorResponse(401, 'no_session', 'Sign in to continue')
        : errorResponse(401, 'token_expired', 'Your session has ended'),
    )
    const api = createApiClient({ fetch })
    const session = memorySession('token-1')
    api.connectSession(session)

    await expect(api.get('/users')).rejects.toMatchObject({ status: 401, code: 'token_expired' })
    expect(session.changes).toEqual([null])
    expect(fetch).toHaveBeenCalledTimes(2)
  })

  it('never refreshes for a call made without the session (sign-in)', async () => {
    const fetch = vi.fn(async (_url: string, _init?: RequestInit) => errorResponse(401, 'invalid_credentials', 'Email or password is incorrect'))
    const api = createApiClient({ fetch })
    api.connectSession(memorySession('token-1'))

    const failure = api.post('/auth/login', { email: 'a@b.example', password: 'x' }, { authenticated: false })
    await expect(failure).rejects.toMatchObject({ status: 401, code: 'invalid_credentials', message: 'Email or password is incorrect' })
    expect(fetch).toHaveBeenCalledTimes(1)
    expect(bearerOf(fetch.mock.calls[0]?.[1])).toBeUndefined()
  })

  it('turns an error body into an ApiError with its field messages', async () => {
    const body = {
      error: {
        code: 'validation_failed',
        message: 'Check the highlighted fields',
        fields: [{ field: 'password', message: 'Use at least 12 characters' }],
      },
    }
    const api = createApiClient({ fetch: async () => json(400, body) })
    const error = await api.post('/users', {}).catch((caught: unknown) => caught)

    expect(error).toBeInstanceOf(ApiError)
    expect(error).toMatchObject({ status: 400, code: 'validation_failed', message: 'Check the highlighted fields' })
    expect((error as ApiError).fieldMessage('password')).toBe('Use at least 12 characters')
  })

  it('gives a plain message for an answer that is not our error shape', async () => {
    const api = createApiClient({ fetch: async () => new Response('<h1>Bad gateway</h1>', { status: 502, statusText: 'Bad Gateway' }) })
    await expect(api.get('/users')).rejects.toMatchObject({ status: 502, code: 'http_502', fields: [] })
  })

  it('reports an unreachable server as a network error, not a crash', async () => {
    const api = createApiClient({ fetch: async () => Promise.reject(new TypeError('Failed to fetch')) })
    await expect(api.get('/users')).rejects.toMatchObject({ status: 0, code: 'network_error' })
  })

  it('reports a success answer that is not JSON instead of crashing', async () => {
    const api = createApiClient({ fetch: async () => new Response('<!doctype html><title>Stringline</title>', { status: 200 }) })
    await expect(api.get('/users')).rejects.toMatchObject({ status: 200, code: 'unreadable_answer' })
  })

  it('answers 204 with no body', async () => {
    const api = createApiClient({ fetch: async () => new Response(null, { status: 204 }) })
    await expect(api.post('/auth/logout')).resolves.toBeUndefined()
  })
})
