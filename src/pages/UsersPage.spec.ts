import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import App from '@/App.vue'
import type { User } from '@/api/types'
import { createAppRouter } from '@/router'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'

const admin = aMember('admin')
const reviewer = aMember('reviewer', { licenceNumber: 'EC-204417', licenceRegion: 'Northmarch', licenceExpiry: '2031-01-15' })
const designer = aMember('designer')

interface Call {
  method: string
  url: string
  body: unknown
}

/** The users API of an organisation of three, recording what the page asks of it. */
function fakeApi() {
  const calls: Call[] = []
  const members = [admin, reviewer, designer]
  const fetch = vi.fn(async (url: string, init?: RequestInit) => {
    const method = init?.method ?? 'GET'
    const body = init?.body ? (JSON.parse(String(init.body)) as Record<string, unknown>) : undefined
    calls.push({ method, url, body })
    if (url === '/api/auth/refresh') return jsonResponse(200, sessionOf(admin))
    if (url.startsWith('/api/users?')) return jsonResponse(200, { items: members, total: 3, page: 1, pageSize: 20 })
    if (url === '/api/users' && method === 'POST') {
      return body?.email === designer.email
        ? errorResponse(409, 'conflict', 'A user with this e-mail already exists', [{ field: 'email', message: 'Already in use' }])
        : jsonResponse(201, { user: aMember('coordinator', body as Partial<User>) })
    }
    const patched = members.find((member) => url === `/api/users/${member.id}`)
    if (patched && method === 'PATCH') return jsonResponse(200, { user: { ...patched, ...body } })
    return errorResponse(404, 'not_found', 'Not found')
  })
  vi.stubGlobal('fetch', fetch)
  return {
    calls,
    listQueries: () => calls.filter((call) => call.url.startsWith('/api/users?')).map((call) => call.url.split('?')[1]),
    writes: () => calls.filter((call) => call.method !== 'GET' && !call.url.startsWith('/api/auth/')),
  }
}

async function openUsers(path = '/users') {
  const api = fakeApi()
  const router = createAppRouter(createMemoryHistory())
  await router.push(path)
  const wrapper = mount(App, { global: { plugins: [router] }, attachTo: document.body })
  await flushPromises()
  return { api, router, wrapper }
}

const rowOf = (wrapper: Awaited<ReturnType<typeof openUsers>>['wrapper'], name: string) => {
  const row = wrapper.findAll('.el-table__body tr').find((tr) => tr.text().includes(name))
  if (!row) throw new Error(`no row for ${name}`)
  return row
}

const buttonNamed = (root: ParentNode, label: string) => {
  const button = [...root.querySelectorAll('button')].find((b) => b.textContent?.trim() === label)
  if (!button) throw new Error(`no button "${label}"`)
  return button
}

describe('users page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined) // jsdom has no layout to scroll
    document.body.innerHTML = ''
  })

  it('asks the server for the page, size, sort and search held in the address', async () => {
    const { api, wrapper } = await openUsers('/users?page=2&pageSize=50&sort=-createdAt&q=wren')

    expect(api.listQueries()).toEqual(['page=2&pageSize=50&q=wren&sort=-createdAt'])
    expect(wrapper.findAll('.el-table__body tr')).toHaveLength(3)
    expect(rowOf(wrapper, reviewer.name).text()).toContain('EC-204417 · Northmarch')
  })

  it('searches after typing stops, from the first page', async () => {
    const { api, wrapper, router } = await openUsers('/users?page=3')

    await wrapper.get('#users-search').setValue('okafor')

    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({ q: 'okafor' }))
    await vi.waitFor(() => expect(api.listQueries().at(-1)).toBe('page=1&pageSize=20&q=okafor&sort=name'))
  })

  it('sorts on the server when a column header is clicked', async () => {
    const { api, wrapper } = await openUsers()

    const addedHeader = wrapper.findAll('.el-table__header th').find((th) => th.text().includes('Added'))
    await addedHeader?.get('.cell').trigger('click')
    await flushPromises()

    expect(api.listQueries().at(-1)).toBe('page=1&pageSize=20&sort=createdAt')
  })

  it('checks a new member as the admin types and sends nothing while a field is wrong', async () => {
    const { api, wrapper } = await openUsers()
    await buttonNamed(document.body, 'Add member').click()
    await flushPromises()

    await wrapper.get('#new-user-email').setValue('not an address')
    await wrapper.get('#new-user-password').setValue('too short')
    await buttonNamed(document.querySelector('.el-dialog')!, 'Add member').click()
    await flushPromises()

    await vi.waitFor(() => {
      const errors = wrapper.findAll('.el-dialog .el-form-item__error').map((error) => error.text())
      expect(errors).toEqual(['Enter a valid e-mail address', 'Enter a name', 'Choose a role', 'Use at least 12 characters'])
    })
    expect(api.writes()).toEqual([])
  })

  it('suggests an initial password that meets the length rule and shows it once to copy', async () => {
    const { wrapper } = await openUsers()
    await buttonNamed(document.body, 'Add member').click()
    await flushPromises()

    await buttonNamed(document.querySelector('.el-dialog')!, 'Suggest one').click()
    await flushPromises()

    const password = (wrapper.get('#new-user-password').element as HTMLInputElement).value
    expect(password).toMatch(/^[a-km-zA-HJ-NP-Z2-9_!%-]{16}$/)
    expect(wrapper.get('.el-dialog .suggested').text()).toBe(password)
    await wrapper.get('#new-user-password').setValue(`${password}x`)
    expect(wrapper.find('.el-dialog .suggested').exists()).toBe(false)
  })

  it('shows the API’s answer beside the e-mail field when the address is taken', async () => {
    const { api, wrapper } = await openUsers()
    await buttonNamed(document.body, 'Add member').click()
    await flushPromises()

    await wrapper.get('#new-user-email').setValue(designer.email)
    await wrapper.get('#new-user-name').setValue('Ines Okafor')
    await wrapper.get('.el-dialog .el-select__wrapper').trigger('click')
    await wrapper.findAll('.el-dialog .el-select-dropdown__item').find((option) => option.text() === 'PV designer')?.trigger('click')
    await wrapper.get('#new-user-password').setValue('twelve or more chars')
    await wrapper.get('#new-user-password').trigger('keydown', { key: 'Enter' })
    await flushPromises()

    expect(api.writes()).toEqual([
      { method: 'POST', url: '/api/users', body: { email: designer.email, name: 'Ines Okafor', role: 'designer', password: 'twelve or more chars' } },
    ])
    await vi.waitFor(() => expect(wrapper.get('.el-dialog .el-form-item__error').text()).toBe('Already in use'))
    expect(wrapper.get('.el-dialog .el-alert').text()).toContain('A user with this e-mail already exists')
  })

  it('sends only the licence fields that changed, and clears an emptied one', async () => {
    const { api, wrapper } = await openUsers()
    await rowOf(wrapper, reviewer.name).get('button').trigger('click')
    await vi.waitFor(() => expect((wrapper.find('#edit-user-licence-number').element as HTMLInputElement)?.value).toBe('EC-204417'))

    await wrapper.get('#edit-user-licence-number').setValue('EC-300001')
    await wrapper.get('#edit-user-licence-region').setValue('  ')
    await buttonNamed(document.querySelector('.el-dialog')!, 'Save changes').click()
    await flushPromises()

    expect(api.writes()).toEqual([
      { method: 'PATCH', url: `/api/users/${reviewer.id}`, body: { licenceNumber: 'EC-300001', licenceRegion: null } },
    ])
    expect(rowOf(wrapper, reviewer.name).text()).toContain('EC-300001')
  })

  it('deactivates a member only after confirmation, and never offers it on your own row', async () => {
    const { api, wrapper } = await openUsers()
    expect(buttonNamed(rowOf(wrapper, admin.name).element, 'Deactivate').disabled).toBe(true)

    buttonNamed(rowOf(wrapper, designer.name).element, 'Deactivate').click()
    await vi.waitFor(() => expect(document.querySelector('.el-message-box')?.textContent).toContain(`Deactivate ${designer.name}?`))
    expect(api.writes()).toEqual([])

    buttonNamed(document.querySelector('.el-message-box')!, 'Deactivate').click()
    await vi.waitFor(() => expect(api.writes()).toEqual([{ method: 'PATCH', url: `/api/users/${designer.id}`, body: { active: false } }]))
    await vi.waitFor(() => expect(rowOf(wrapper, designer.name).text()).toContain('Inactive'))
  })
})
