import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import { createAppRouter } from '@/router'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'
import SignInPage from './SignInPage.vue'

type LoginAnswer = () => Response | Promise<Response>

/** The API with no refresh cookie; `login` decides how sign-in answers. */
function stubApi(login: LoginAnswer) {
  const fetch = vi.fn(async (url: string, _init?: RequestInit) =>
    url === '/api/auth/login' ? login() : errorResponse(401, 'no_session', 'Sign in to continue'),
  )
  vi.stubGlobal('fetch', fetch)
  return fetch
}

async function mountAt(path: string) {
  const router = createAppRouter(createMemoryHistory())
  await router.push(path)
  const wrapper = mount(SignInPage, { global: { plugins: [router] }, attachTo: document.body })
  return { wrapper, router }
}

async function fillIn(wrapper: Awaited<ReturnType<typeof mountAt>>['wrapper'], email: string, password: string) {
  await wrapper.get('#sign-in-email').setValue(email)
  await wrapper.get('#sign-in-password').setValue(password)
}

/** Message shown under each field, by the field's id; Element Plus shows them after a short debounce. */
function fieldErrors(wrapper: Awaited<ReturnType<typeof mountAt>>['wrapper']): Record<string, string> {
  const shown: Record<string, string> = {}
  for (const item of wrapper.findAll('.el-form-item')) {
    const id = item.find('input').attributes('id')
    const error = item.find('.el-form-item__error')
    if (id && error.exists()) shown[id] = error.text()
  }
  return shown
}

const loginCalls = (fetch: ReturnType<typeof stubApi>) => fetch.mock.calls.filter(([url]) => url === '/api/auth/login')

describe('sign-in page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined) // jsdom has no layout to scroll
    document.body.innerHTML = ''
  })

  it('puts the cursor in the email field', async () => {
    stubApi(() => jsonResponse(200, sessionOf(aMember('designer'))))
    const { wrapper } = await mountAt('/sign-in')
    expect(document.activeElement).toBe(wrapper.get('#sign-in-email').element)
  })

  it('submits on Enter in the password field and goes on to the page in next', async () => {
    const fetch = stubApi(() => jsonResponse(200, sessionOf(aMember('designer'))))
    const { wrapper, router } = await mountAt('/sign-in?next=/profile')
    await fillIn(wrapper, 'designer@kestrelfen-solar.example', 'a long enough password')

    await wrapper.get('#sign-in-password').trigger('keydown', { key: 'Enter' })
    await flushPromises()

    expect(loginCalls(fetch)).toHaveLength(1)
    const [, init] = loginCalls(fetch)[0] ?? []
    expect(JSON.parse(String(init?.body))).toEqual({ email: 'designer@kestrelfen-solar.example', password: 'a long enough password' })
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/profile'))
  })

  it('shows the message the API gives for wrong credentials and stays on the page', async () => {
    stubApi(() => errorResponse(401, 'invalid_credentials', 'Email or password is incorrect'))
    const { wrapper, router } = await mountAt('/sign-in')
    await fillIn(wrapper, 'designer@kestrelfen-solar.example', 'not the password')

    await wrapper.get('form').trigger('submit')
    await flushPromises()

    expect(wrapper.get('[role="alert"]').text()).toContain('Email or password is incorrect')
    expect(router.currentRoute.value.name).toBe('sign-in')
  })

  it('shows the rate-limit message after too many attempts', async () => {
    stubApi(() => errorResponse(429, 'rate_limited', 'Too many attempts. Try again in 15 minutes.'))
    const { wrapper } = await mountAt('/sign-in')
    await fillIn(wrapper, 'designer@kestrelfen-solar.example', 'guess number six')

    await wrapper.get('form').trigger('submit')
    await flushPromises()

    const alert = wrapper.get('[role="alert"]').text()
    expect(alert).toContain('Wait before trying again')
    expect(alert).toContain('Too many attempts. Try again in 15 minutes.')
  })

  it('shows the API’s field errors beside the fields', async () => {
    stubApi(() =>
      errorResponse(400, 'validation_failed', 'Check the highlighted fields', [
        { field: 'email', message: 'This address is not allowed to sign in here' },
      ]),
    )
    const { wrapper } = await mountAt('/sign-in')
    await fillIn(wrapper, 'designer@kestrelfen-solar.example', 'a long enough password')

    await wrapper.get('form').trigger('submit')
    await flushPromises()

    await vi.waitFor(() =>
      expect(fieldErrors(wrapper)).toEqual({ 'sign-in-email': 'This address is not allowed to sign in here' }),
    )
  })

  it('checks the fields before sending anything', async () => {
    const fetch = stubApi(() => jsonResponse(200, sessionOf(aMember('designer'))))
    const { wrapper } = await mountAt('/sign-in')
    await wrapper.get('form').trigger('submit')
    await flushPromises()

    await vi.waitFor(() =>
      expect(fieldErrors(wrapper)).toEqual({
        'sign-in-email': 'Enter your e-mail address',
        'sign-in-password': 'Enter your password',
      }),
    )
    expect(loginCalls(fetch)).toHaveLength(0)
  })

  it('disables the form while the request is on its way and sends it once', async () => {
    let answer: (response: Response) => void = () => undefined
    const fetch = stubApi(() => new Promise<Response>((resolve) => (answer = resolve)))
    const { wrapper } = await mountAt('/sign-in')
    await fillIn(wrapper, 'designer@kestrelfen-solar.example', 'a long enough password')

    await wrapper.get('form').trigger('submit')
    await wrapper.get('#sign-in-password').trigger('keydown', { key: 'Enter' })

    expect(wrapper.get('#sign-in-email').attributes('disabled')).toBeDefined()
    expect(wrapper.get('button[type="submit"]').text()).toContain('Signing in')
    expect(loginCalls(fetch)).toHaveLength(1)
    answer(errorResponse(401, 'invalid_credentials', 'Email or password is incorrect'))
    await flushPromises()
    expect(wrapper.get('#sign-in-email').attributes('disabled')).toBeUndefined()
  })
})
