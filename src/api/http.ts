import { errorFromResponse, networkError, unreadableAnswer } from './errors'
import type { AuthSession } from './types'

/** How the client reads and updates the signed-in session it does not own (the auth store does). */
export interface SessionLink {
  accessToken(): string | null
  /** A refresh gave a new session, or `null` when the refresh cookie is missing or revoked. */
  sessionChanged(session: AuthSession | null): void
}

export type QueryValue = string | number | boolean | undefined
export interface RequestOptions {
  body?: unknown
  query?: Record<string, QueryValue>
  /** `false` for calls that must not carry a token or retry on 401 (sign-in itself). */
  authenticated?: boolean
}

/** The part of `fetch` the client uses: it always sends a string URL. */
export type Fetcher = (url: string, init: RequestInit) => Promise<Response>

export interface ApiClientOptions {
  baseUrl?: string
  fetch?: Fetcher
}

const SIGNED_OUT: SessionLink = { accessToken: () => null, sessionChanged: () => undefined }

export function createApiClient({ baseUrl = '/api', fetch: fetchOption }: ApiClientOptions = {}) {
  // read the global at call time so tests and polyfills installed later are honoured
  const send: Fetcher = fetchOption ?? ((url, init) => globalThis.fetch(url, init))
  let session: SessionLink = SIGNED_OUT
  let refreshInFlight: Promise<AuthSession | null> | null = null

  function urlFor(path: string, query?: Record<string, QueryValue>): string {
    const params = new URLSearchParams()
    for (const [key, value] of Object.entries(query ?? {})) {
      if (value !== undefined && value !== '') params.set(key, String(value))
    }
    const search = params.toString()
    return `${baseUrl}${path}${search ? `?${search}` : ''}`
  }

  async function fetchOrNetworkError(url: string, init: RequestInit): Promise<Response> {
    try {
      return await send(url, init)
    } catch (cause) {
      throw networkError(cause)
    }
  }

  async function readJson<T>(response: Response): Promise<T> {
    try {
      return (await response.json()) as T
    } catch (cause) {
      throw unreadableAnswer(response.status, cause)
    }
  }

  async function runRefresh(): Promise<AuthSession | null> {
    // the refresh token is an httpOnly cookie: only the browser can send it
    const response = await fetchOrNetworkError(urlFor('/auth/refresh'), {
      method: 'POST',
      credentials: 'include',
      headers: { Accept: 'application/json' },
    })
    if (response.status === 401) {
      session.sessionChanged(null)
      return null
    }
    if (!response.ok) throw await errorFromResponse(response)
    const fresh = await readJson<AuthSession>(response)
    session.sessionChanged(fresh)
    return fresh
  }

  /** Exchanges the refresh cookie for a new access token; callers arriving meanwhile share one request. */
  function refreshSession(): Promise<AuthSession | null> {
    refreshInFlight ??= runRefresh().finally(() => {
      refreshInFlight = null
    })
    return refreshInFlight
  }

  async function request<T>(method: string, path: string, options: RequestOptions = {}): Promise<T> {
    const authenticated = options.authenticated ?? true
    const url = urlFor(path, options.query)
    const attempt = (token: string | null) => {
      const headers: Record<string, string> = { Accept: 'application/json' }
      if (options.body !== undefined) headers['Content-Type'] = 'application/json'
      if (authenticated && token) headers.Authorization = `Bearer ${token}`
      return fetchOrNetworkError(url, {
        method,
        headers,
        credentials: 'include',
        body: options.body === undefined ? undefined : JSON.stringify(options.body),
      })
    }

    const tokenSent = session.accessToken()
    let response = await attempt(tokenSent)
    if (response.status === 401 && authenticated) {
      // another call may already have refreshed while this one was on the wire
      const current = session.accessToken()
      const token = current && current !== tokenSent ? current : (await refreshSession())?.token
      if (token) response = await attempt(token)
    }
    if (!response.ok) throw await errorFromResponse(response)
    if (response.status === 204) return undefined as T
    return readJson<T>(response)
  }

  return {
    connectSession(link: SessionLink): void {
      session = link
    },
    refreshSession,
    request,
    get: <T>(path: string, query?: Record<string, QueryValue>) => request<T>('GET', path, { query }),
    post: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>) =>
      request<T>('POST', path, { ...options, body }),
    patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, { body }),
  }
}

export type ApiClient = ReturnType<typeof createApiClient>
