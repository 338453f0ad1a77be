import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import type { Role } from '@shared/auth/roles'
import { NOTIFICATION_CATEGORIES, NOTIFICATION_CATEGORY_INFO, type NotificationSettingsDto } from '@shared/schemas/notifications'
import type { StampCredentialsDto } from '@shared/schemas/stamp'
import { stubBlobUrls } from '@/components/package/packageFixtures'
import { chooseFiles, fakeUploads } from '@/components/stamp/fakeUpload'
import { useAuthStore } from '@/stores/auth'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'
import ProfilePage from './ProfilePage.vue'

const FINGERPRINT = '3f9a0c7e51d24b8a' + '6'.repeat(48)

const credentialsOf = (overrides: Partial<StampCredentialsDto> = {}): StampCredentialsDto => ({
  stampImage: { uploadedAt: '2026-11-02T08:00:00.000Z', fileName: 'wren-seal.png', bytes: 48_211 },
  certificate: { commonName: 'Tobias Wren (demo)', notAfter: '2027-11-01T00:00:00.000Z', fingerprintSha256: FINGERPRINT, demo: true },
  licence: { number: 'EC-204417', region: 'Northmarch', expiry: '2031-01-15' },
  problems: [],
  ...overrides,
})

const settingsOf = (optOuts: string[] = []): NotificationSettingsDto => ({
  items: NOTIFICATION_CATEGORIES.map((category) => ({ category, ...NOTIFICATION_CATEGORY_INFO[category], enabled: !optOuts.includes(category) })),
})

/** The profile's API: `state` is the server's, changed by the spec. */
function fakeProfileApi(role: Role) {
  const member = aMember(role)
  const state = {
    credentials: credentialsOf(),
    save: (body: { optOuts: string[] }): Response | Promise<Response> => jsonResponse(200, settingsOf(body.optOuts)),
  }
  const calls: { method: string; url: string; body: unknown }[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string, init: RequestInit = {}) => {
    const method = init.method ?? 'GET'
    const body = init.body ? JSON.parse(String(init.body)) : undefined
    calls.push({ method, url, body })
    if (url === '/api/auth/refresh') return jsonResponse(200, sessionOf(member))
    if (url === '/api/auth/me') return jsonResponse(200, { user: member })
    if (url === '/api/profile/stamp') return jsonResponse(200, state.credentials)
    if (url === '/api/profile/stamp/image') return new Response(new Uint8Array([137, 80, 78, 71]), { status: 200, headers: { 'Content-Type': 'image/png' } })
    if (url === '/api/profile/notifications' && method === 'PUT') return state.save(body)
    if (url === '/api/profile/notifications') return jsonResponse(200, settingsOf())
    return errorResponse(404, 'not_found', 'Not found')
  }))
  return { member, state, calls }
}

async function openProfile(role: Role, prepare: (api: ReturnType<typeof fakeProfileApi>) => void = () => undefined) {
  const api = fakeProfileApi(role)
  prepare(api)
  const auth = useAuthStore()
  auth.user = api.member
  auth.token = `token-for-${role}`
  const wrapper = mount(ProfilePage, { attachTo: document.body })
  await flushPromises()
  return { ...api, wrapper }
}

type Wrapper = Awaited<ReturnType<typeof openProfile>>['wrapper']
const buttonNamed = (wrapper: Wrapper, label: string) => wrapper.findAll('button').find((b) => b.text() === label || b.attributes('aria-label') === label)!
const fieldError = (wrapper: Wrapper, id: string) => wrapper.get(`#${id}`).element.closest('.el-form-item')!.querySelector('.el-form-item__error')?.textContent?.trim()

describe('profile page', () => {
  let blobs: ReturnType<typeof stubBlobUrls>
  beforeEach(() => {
    setActivePinia(createPinia())
    blobs = stubBlobUrls()
    document.body.innerHTML = ''
  })

  it('shows a reviewer the stamp image, the certificate facts with a demo warning, and copies the fingerprint', async () => {
    const writeText = vi.fn(async () => undefined)
    vi.stubGlobal('navigator', { ...navigator, clipboard: { writeText } })
    const { wrapper } = await openProfile('reviewer')

    const img = wrapper.get('img[data-test="stamp-image"]')
    expect(blobs.get(img.attributes('src')!)?.type).toBe('image/png')
    expect(wrapper.text()).toContain('wren-seal.png, uploaded')
    const facts = wrapper.get('[data-test="certificate-facts"]')
    expect(facts.text()).toContain('Tobias Wren (demo)')
    expect(facts.text()).toMatch(/Valid until.*2027/)
    expect(wrapper.get('[data-test="demo-certificate"]').text()).toBe('Demo certificate — not for permit use')
    expect(wrapper.get('[data-test="fingerprint"]').text()).toBe('3f9a0c7e51d2…')

    await buttonNamed(wrapper, 'Copy the certificate fingerprint').trigger('click')
    expect(writeText).toHaveBeenCalledWith(FINGERPRINT)
    expect(wrapper.get('[data-test="stamp-readiness"]').text()).toContain('Everything stamping needs is on your profile.')
  })

  it('lists what still blocks stamping', async () => {
    const { wrapper } = await openProfile('reviewer', ({ state }) => {
      state.credentials = credentialsOf({
        stampImage: null,
        certificate: null,
        problems: [
          { field: 'licenceExpiry', message: 'the licence expired on 2026-06-30; renew it and update your profile before stamping' },
          { field: 'stampImage', message: 'is missing from your profile; upload the PNG image of your stamp' },
        ],
      })
    })
    const items = wrapper.findAll('[data-test="stamp-readiness"] li').map((li) => li.text())
    expect(items).toEqual([
      'Licence expiry: the licence expired on 2026-06-30; renew it and update your profile before stamping',
      'Stamp image: is missing from your profile; upload the PNG image of your stamp',
    ])
    expect(wrapper.text()).toContain('An administrator of your organisation updates the licence details.')
    expect(wrapper.find('img[data-test="stamp-image"]').exists()).toBe(false)
    expect(wrapper.text()).toContain('No signing certificate yet.')
  })

  it('offers the stamp section to reviewers only, and asks nothing about it for others', async () => {
    const { wrapper, calls } = await openProfile('designer')
    expect(wrapper.text()).not.toContain('Stamp and signing certificate')
    expect(calls.some((c) => c.url.startsWith('/api/profile/stamp'))).toBe(false)
    expect(wrapper.text()).toContain('E-mail notifications')
  })

  it('uploads a new stamp image with its progress and shows the one the server now holds', async () => {
    const uploads = fakeUploads()
    const { wrapper, state, calls } = await openProfile('reviewer', ({ state }) => {
      state.credentials = credentialsOf({ stampImage: null, problems: [{ field: 'stampImage', message: 'is missing from your profile; upload the PNG image of your stamp' }] })
    })
    chooseFiles(wrapper.get('[data-test="stamp-image-file"]').element as HTMLInputElement, [new File(['png'], 'wren-seal.png', { type: 'image/png' })])
    await flushPromises()

    const [upload] = uploads
    expect(upload!.url).toBe('/api/profile/stamp/image')
    expect(upload!.headers.Authorization).toBe('Bearer token-for-reviewer')
    expect((upload!.form.get('file') as File).name).toBe('wren-seal.png')
    upload!.progress(40)
    await flushPromises()
    expect(wrapper.get('.el-progress').attributes('aria-valuenow')).toBe('40')

    state.credentials = credentialsOf()
    upload!.answer(200, state.credentials)
    await flushPromises()
    expect(wrapper.find('.el-progress').exists()).toBe(false)
    expect(calls.filter((c) => c.url === '/api/profile/stamp/image')).toHaveLength(1)
    expect(wrapper.find('img[data-test="stamp-image"]').exists()).toBe(true)
    expect(wrapper.get('[data-test="stamp-readiness"]').text()).toContain('Everything stamping needs is on your profile.')
  })

  it('checks the certificate form, sends file and password, and puts a refusal on the field it names', async () => {
    const uploads = fakeUploads()
    const { wrapper } = await openProfile('reviewer')
    await buttonNamed(wrapper, 'Upload the certificate').trigger('click')
    await vi.waitFor(() => expect(fieldError(wrapper, 'certificate-password')).toBe('is required to open the certificate'))
    expect(fieldError(wrapper, 'certificate-file')).toBe('choose the .p12 or .pfx file of your certificate')
    expect(uploads).toEqual([])

    chooseFiles(wrapper.get('#certificate-file').element as HTMLInputElement, [new File(['p12'], 'wren.p12', { type: 'application/x-pkcs12' })])
    await wrapper.get('#certificate-password').setValue('fen-kestrel-7')
    await buttonNamed(wrapper, 'Upload the certificate').trigger('click')
    await flushPromises()
    expect(uploads.map((u) => u.url)).toEqual(['/api/profile/stamp/certificate'])
    expect(uploads[0]!.form.get('password')).toBe('fen-kestrel-7')
    expect((uploads[0]!.form.get('file') as File).name).toBe('wren.p12')

    uploads[0]!.answer(422, { error: { code: 'unprocessable', message: 'The password does not open this certificate', fields: [{ field: 'password', message: 'does not open the signing certificate' }] } })
    await flushPromises()
    await vi.waitFor(() => expect(fieldError(wrapper, 'certificate-password')).toBe('does not open the signing certificate'))
    expect(fieldError(wrapper, 'certificate-file') ?? '').toBe('')
    expect(wrapper.get('[data-test="certificate-problem"]').text()).toBe('The password does not open this certificate')

    await buttonNamed(wrapper, 'Upload the certificate').trigger('click')
    await flushPromises()
    uploads[1]!.answer(415, { error: { code: 'unsupported_media_type', message: 'This file is not a PKCS#12 certificate', fields: [{ field: 'file', message: 'must be a PKCS#12 file (.p12 or .pfx)' }] } })
    await vi.waitFor(() => expect(fieldError(wrapper, 'certificate-file')).toBe('must be a PKCS#12 file (.p12 or .pfx)'))
  })

  it('switches an e-mail category at once, saves every opt-out, and puts the switch back when saving fails', async () => {
    let release: (answer: Response) => void = () => undefined
    const { wrapper, calls, state } = await openProfile('coordinator', ({ state }) => {
      state.save = () => new Promise<Response>((resolve) => (release = resolve))
    })
    const rows = wrapper.findAll('.notification-settings__list li')
    expect(rows.map((r) => r.get('.notification-settings__label').text())).toEqual(NOTIFICATION_CATEGORIES.map((c) => NOTIFICATION_CATEGORY_INFO[c].label))
    expect(rows[0]!.text()).toContain(`Sent to: ${NOTIFICATION_CATEGORY_INFO.review_requested.recipients}`)
    const switchOf = (category: string) => wrapper.get(`[data-category="${category}"] .el-switch`)
    expect(switchOf('stamped').get('input').attributes('aria-label')).toBe(NOTIFICATION_CATEGORY_INFO.stamped.label)

    await switchOf('daily_digest').trigger('click')
    expect(switchOf('daily_digest').classes()).not.toContain('is-checked')
    expect(calls.filter((c) => c.method === 'PUT')).toEqual([{ method: 'PUT', url: '/api/profile/notifications', body: { optOuts: ['daily_digest'] } }])
    release(jsonResponse(200, settingsOf(['daily_digest'])))
    await flushPromises()
    expect(switchOf('daily_digest').classes()).not.toContain('is-checked')

    state.save = () => errorResponse(500, 'internal', 'The settings could not be stored')
    await switchOf('stamped').trigger('click')
    await flushPromises()
    expect(calls.filter((c) => c.method === 'PUT').at(-1)!.body).toEqual({ optOuts: ['stamped', 'daily_digest'] })
    expect(switchOf('stamped').classes()).toContain('is-checked')
    expect(wrapper.get('[data-test="notification-problem"]').text()).toBe(`“${NOTIFICATION_CATEGORY_INFO.stamped.label}” could not be switched off. The settings could not be stored`)
  })
})
