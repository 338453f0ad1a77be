import { performance } from 'node:perf_hooks'
import { DEMO_PASSWORD } from '../../../server/demo/seed'

/** One answer of a real HTTP server, with when it was asked and answered [ms, performance clock]. */
export interface Answer {
  status: number
  body: Record<string, unknown> & { error?: { code: string; message: string } }
  sentAt: number
  answeredAt: number
  /** Set when no HTTP answer came (refused, reset, or no answer within the time limit). */
  failure?: string
}

/** An answer slower than this counts as a hang: far above every bound the fault tests assert. */
export const HANG_MS = 8000

/**
 * Calls an API over real HTTP (fetch, keep-alive). Never throws: a missing answer comes back as
 * status 0 with `failure` saying why, so load loops can record it and go on.
 */
export async function call(baseUrl: string, method: string, path: string, options: { token?: string; body?: unknown } = {}): Promise<Answer> {
  const sentAt = performance.now()
  const headers: Record<string, string> = {}
  if (options.token) headers.Authorization = `Bearer ${options.token}`
  if (options.body !== undefined) headers['Content-Type'] = 'application/json'
  try {
    const res = await fetch(`${baseUrl}${path}`, {
      method,
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: AbortSignal.timeout(HANG_MS),
    })
    const text = await res.text()
    let body: Answer['body'] = {}
    try {
      body = text ? (JSON.parse(text) as Answer['body']) : {}
    } catch {
      body = { raw: text }
    }
    return { status: res.status, body, sentAt, answeredAt: performance.now() }
  } catch (err) {
    return { status: 0, body: {}, sentAt, answeredAt: performance.now(), failure: err instanceof Error ? `${err.name}: ${err.message}` : String(err) }
  }
}

/** Signs a demo user in over HTTP and returns the access token. */
export async function signIn(baseUrl: string, email: string): Promise<string> {
  const res = await call(baseUrl, 'POST', '/api/auth/login', { body: { email, password: DEMO_PASSWORD } })
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${JSON.stringify(res.body)}`)
  return res.body.token as string
}

/** Asks `ready` every `everyMs` until it is true; throws with `what` after `timeoutMs`. */
export async function waitFor(ready: () => Promise<boolean> | boolean, what: string, timeoutMs: number, everyMs = 100): Promise<void> {
  const until = performance.now() + timeoutMs
  while (!(await ready())) {
    if (performance.now() > until) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`)
    await new Promise((r) => setTimeout(r, everyMs))
  }
}
