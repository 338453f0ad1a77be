import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import { useAuthStore } from '@/stores/auth'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'
import { createAppRouter } from './index'
import { routes } from './routes'

const admin = aMember('admin')

/** The API as the browser sees it with no refresh cookie; sign-in accepts the admin's password. */
function signedOutApi() {
  return vi.fn(async (url: string, init?: RequestInit) => {
    if (url === '/api/auth/refresh') return errorResponse(401, 'no_session', 'Sign in to continue')
    if (url === '/api/auth/login') {
      const { password } = JSON.parse(String(init?.body)) as { password: string }
      return password === 'correct horse battery'
        ? jsonResponse(200, sessionOf(admin))
        : errorResponse(401, 'invalid_credentials', 'Email or password is incorrect')
    }
    return errorResponse(401, 'no_token', 'Sign in to continue')
  })
}

describe('session guard', () => {
  let fetch: ReturnType<typeof signedOutApi>

  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined) // jsdom has no layout to scroll
    fetch = signedOutApi()
    vi.stubGlobal('fetch', fetch)
  })

  it('sends a signed-out visitor to sign-in with the page they wanted as next', async () => {
    const router = createAppRouter(createMemoryHistory())
    await router.push('/users?q=wren')

    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query.next).toBe('/users?q=wren')
  })

  it('asks the server for the session once per page load, however many navigations follow', async () => {
    const router = createAppRouter(createMemoryHistory())
    await router.push('/profile')
    await router.push('/users')
    await router.push('/')

    expect(fetch.mock.calls.filter(([url]) => url === '/api/auth/refresh')).toHaveLength(1)
  })

  it('lets a signed-in member through, and sends them on from sign-in to next', async () => {
    const router = createAppRouter(createMemoryHistory())
    await router.push('/')
    await useAuthStore().signIn({ email: admin.email, password: 'correct horse battery' })
    await router.push('/sign-in?next=/users')

    expect(router.currentRoute.value.name).toBe('users')
  })

  it('ignores a next that points outside the app', async () => {
    const router = createAppRouter(createMemoryHistory())
    await router.push('/')
    await useAuthStore().signIn({ email: admin.email, password: 'correct horse battery' })
    await router.push('/sign-in?next=//elsewhere.example/phish')

    expect(router.currentRoute.value.name).toBe('home')
  })

  it('shows the not-found page for an unknown address without asking to sign in', async () => {
    const router = createAppRouter(createMemoryHistory())
    await router.push('/no/such/page')

    expect(router.currentRoute.value.name).toBe('not-found')
  })

  it('resumes the session from the refresh cookie on the first navigation', async () => {
    fetch.mockImplementation(async (url: string) =>
      url === '/api/auth/refresh' ? jsonResponse(200, sessionOf(admin)) : errorResponse(404, 'not_found', 'Not found'),
    )
    const router = createAppRouter(createMemoryHistory())
    await router.push('/users')

    expect(router.currentRoute.value.name).toBe('users')
    expect(useAuthStore().user).toEqual(admin)
  })

  it('knows route names at compile time: a name that is not a route does not type-check', () => {
    const router = createAppRouter(createMemoryHistory())
    // @ts-expect-error 'no-such-page' is not a route; vue-tsc fails this file if the name were accepted
    expect(() => router.resolve({ name: 'no-such-page' })).toThrow()
  })
})

describe('route table', () => {
  it('declares who may open every route, and a title for every route', () => {
    const records = routes.flatMap((record) => [record, ...(record.children ?? [])])
    for (const record of records) {
      expect(record.meta?.access, record.path).toBeDefined()
      expect(record.meta?.title, record.path).toMatch(/\S/)
    }
    expect(records.map((record) => record.path)).toEqual([
      '/sign-in', '/verify/:code?', '/', '/', '/projects', '/equipment', '/jurisdictions', '/submissions', '/users', '/mailbox', '/profile',
      '/projects/:projectId', '/projects/:projectId/design', '/projects/:projectId/package', '/projects/:projectId/review', '/:pathMatch(.*)*',
    ])
  })
})
