import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import { ROLE_LABELS, type Role } from '@shared/auth/roles'
import { SAFETY_CAUTION } from '@shared/electrical/caution'
import App from '@/App.vue'
import type { User } from '@/api/types'
import { createAppRouter } from '@/router'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'

/** An API where `member` has a live refresh cookie until they sign out. */
function apiSignedInAs(member: User) {
  let cookie = true
  const fetch = vi.fn(async (url: string, init?: RequestInit) => {
    if (url === '/api/auth/refresh') return cookie ? jsonResponse(200, sessionOf(member)) : errorResponse(401, 'no_session', 'Sign in')
    if (url === '/api/auth/logout') {
      cookie = false
      return new Response(null, { status: 204 })
    }
    if (url === '/api/auth/me') return jsonResponse(200, { user: member })
    if (url.startsWith('/api/users') && init?.method === 'GET') return jsonResponse(200, { items: [member], total: 1, page: 1, pageSize: 20 })
    return errorResponse(404, 'not_found', 'Not found')
  })
  vi.stubGlobal('fetch', fetch)
  return {
    fetch,
    revokeCookie() {
      cookie = false
    },
  }
}

async function openAs(role: Role, path: string) {
  const member = aMember(role)
  const api = apiSignedInAs(member)
  const router = createAppRouter(createMemoryHistory())
  await router.push(path)
  const wrapper = mount(App, { global: { plugins: [router] } })
  await flushPromises()
  return { wrapper, router, member, api }
}

describe('signed-in shell', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined) // jsdom has no layout to scroll
  })

  it('shows who is signed in, their role and organisation, and the caution on every page', async () => {
    const { wrapper, member } = await openAs('reviewer', '/profile')
    const header = wrapper.get('header').text()

    expect(header).toContain(member.name)
    expect(header).toContain(ROLE_LABELS.reviewer)
    expect(header).toContain(member.organizationName)
    expect(wrapper.get('footer').text()).toBe(SAFETY_CAUTION)
  })

  it('shows "not allowed" instead of a page the role may not open', async () => {
    const { wrapper, api } = await openAs('designer', '/users')

    expect(wrapper.text()).toContain('Not allowed')
    expect(wrapper.text()).toContain(`As a ${ROLE_LABELS.designer} you cannot open Users`)
    expect(api.fetch.mock.calls.some(([url]) => url.startsWith('/api/users'))).toBe(false)
  })

  it('opens the page for a role that may see it', async () => {
    const { wrapper } = await openAs('admin', '/users')

    expect(wrapper.text()).not.toContain('Not allowed')
    expect(wrapper.get('h1').text()).toBe('Users')
  })

  it('signs out on the server and returns to sign-in', async () => {
    const { wrapper, router, api } = await openAs('coordinator', '/')

    await wrapper.get('.shell__sign-out').trigger('click')
    await flushPromises()

    expect(api.fetch.mock.calls.some(([url]) => url === '/api/auth/logout')).toBe(true)
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/sign-in'))
  })

  it('still signs out here when the server cannot be reached, and says the server did not confirm', async () => {
    const { wrapper, router, api } = await openAs('designer', '/')
    api.fetch.mockImplementation(async () => Promise.reject(new TypeError('Failed to fetch')))

    await wrapper.get('.shell__sign-out').trigger('click')
    await flushPromises()

    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/sign-in'))
    expect(document.body.textContent).toContain('the server did not confirm it')
  })

  it('returns to sign-in with next when the session ends on its own', async () => {
    const { wrapper, router, api } = await openAs('reviewer', '/')
    api.revokeCookie()

    // a call refused with 401 whose refresh is refused too ends the session
    api.fetch.mockImplementationOnce(async () => errorResponse(401, 'token_expired', 'Sign in again'))
    await router.push('/profile')
    await flushPromises()

    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/sign-in?next=/profile'))
    expect(wrapper.text()).toContain('Sign in')
  })
})
