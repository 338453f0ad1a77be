import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import { SAFETY_CAUTION } from '@shared/electrical/caution'
import type { FileVerificationDto, VerifiedStampDto } from '@shared/schemas/stamp'
import App from '@/App.vue'
import { chooseFiles } from '@/components/stamp/fakeUpload'
import { createAppRouter } from '@/router'
import { errorResponse, jsonResponse } from '@/testing/fixtures'

const STAMP: VerifiedStampDto = { verificationId: '7K2M-9QXR-4T1H', projectCode: 'KF-0107', revisionNumber: 2, holderName: 'Tobias Wren', stampedAt: '2026-12-06T11:00:00.000Z' }

interface Call {
  url: string
  init: RequestInit
}

/** The public verification API; nobody is signed in. */
function fakeVerifyApi() {
  const state = {
    lookUp: (code: string): Response => (code === STAMP.verificationId ? jsonResponse(200, STAMP) : errorResponse(404, 'not_found', 'Stamp with this verification id not found')),
    check: (): Response => jsonResponse(200, { signature: 'valid', reason: 'The signature is intact: this is KF-0107 revision 2.', match: 'exact', stamp: STAMP } satisfies FileVerificationDto),
  }
  const calls: Call[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string, init: RequestInit = {}) => {
    calls.push({ url, init })
    if (url === '/api/auth/refresh') return errorResponse(401, 'unauthorized', 'No session')
    if (url.startsWith('/api/verify/')) return state.lookUp(decodeURIComponent(url.slice('/api/verify/'.length)))
    if (url === '/api/verify') return state.check()
    return errorResponse(404, 'not_found', 'Not found')
  }))
  return { state, verifyCalls: () => calls.filter((c) => c.url.startsWith('/api/verify')) }
}

async function openVerify(path: string, prepare: (api: ReturnType<typeof fakeVerifyApi>) => void = () => undefined) {
  const api = fakeVerifyApi()
  prepare(api)
  const router = createAppRouter(createMemoryHistory())
  await router.push(path)
  const wrapper = mount(App, { global: { plugins: [router] }, attachTo: document.body })
  await flushPromises()
  return { ...api, router, wrapper }
}

type Wrapper = Awaited<ReturnType<typeof openVerify>>['wrapper']
const facts = (wrapper: Wrapper, within: string) =>
  wrapper.get(within).findAll('[data-test="stamp-facts"] > div').map((d) => [d.get('dt').text(), d.get('dd').text()])

async function chooseFile(wrapper: Wrapper, file: File) {
  chooseFiles(wrapper.get('[data-test="verify-file"]').element as HTMLInputElement, [file])
  await flushPromises()
}

describe('verify page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined)
    document.body.innerHTML = ''
  })

  it('looks up the id in the address at once, without a token, and shows only the stamp’s public facts', async () => {
    const { wrapper, verifyCalls } = await openVerify('/verify/7k2m 9qxr 4tlh')

    expect(wrapper.find('.shell').exists()).toBe(false)
    expect(verifyCalls().map((c) => c.url)).toEqual(['/api/verify/7K2M-9QXR-4T1H'])
    const init = verifyCalls()[0]!.init
    expect(init.credentials).toBe('omit')
    expect(JSON.stringify(init.headers)).not.toContain('Authorization')
    expect(wrapper.get('[data-test="reads-as"]').text()).toBe('Reads as 7K2M-9QXR-4T1H')
    expect(facts(wrapper, '[data-test="code-found"]')).toEqual([
      ['Project', 'KF-0107'],
      ['Revision', '2'],
      ['Stamped by', 'Tobias Wren'],
      ['Stamped on', expect.stringMatching(/2026/)],
      ['Verification id', '7K2M-9QXR-4T1H'],
    ])
    expect(wrapper.text()).toContain('A valid signature shows only that the file has not changed since it was stamped. It does not show that the design complies with the code')
    expect(wrapper.text()).toContain(SAFETY_CAUTION)
  })

  it('checks the id as it is typed, sends nothing until it is one, and says when no stamp has it', async () => {
    const { wrapper, router, verifyCalls } = await openVerify('/verify')
    const error = () => wrapper.find('.verify-code .el-form-item__error')

    await wrapper.get('#verification-id').setValue('Q3W8-T0PA')
    await vi.waitFor(() => expect(error().text()).toBe('must be 12 letters and digits in groups of four, such as 7K2M-9QXR-4T1H'))
    await wrapper.get('.verify-code form').trigger('submit')
    await flushPromises()
    expect(verifyCalls()).toEqual([])

    await wrapper.get('#verification-id').setValue('q3w8t0pa6n2c')
    await vi.waitFor(() => expect(error().exists()).toBe(false))
    await wrapper.get('.verify-code form').trigger('submit')
    await flushPromises()
    expect(router.currentRoute.value.fullPath).toBe('/verify/Q3W8-T0PA-6N2C')
    expect(verifyCalls().map((c) => c.url)).toEqual(['/api/verify/Q3W8-T0PA-6N2C'])
    expect(wrapper.get('[data-test="code-problem"]').text()).toContain('No stamp has the verification id Q3W8-T0PA-6N2C')
    expect(wrapper.find('[data-test="code-found"]').exists()).toBe(false)
  })

  it('sends a PDF as the form field `file` and shows an intact signature with the stamp it belongs to', async () => {
    const { wrapper, verifyCalls } = await openVerify('/verify')
    await chooseFile(wrapper, new File(['%PDF-1.7 …'], 'KF-0107_plan-set.pdf', { type: 'application/pdf' }))

    const [call] = verifyCalls()
    expect(call!.init.method).toBe('POST')
    expect(call!.init.credentials).toBe('omit')
    expect(((call!.init.body as FormData).get('file') as File).name).toBe('KF-0107_plan-set.pdf')
    expect(wrapper.get('[data-test="file-result"] .el-tag').text()).toBe('Signature intact')
    expect(wrapper.get('[data-test="file-reason"]').text()).toBe('The signature is intact: this is KF-0107 revision 2.')
    expect(wrapper.get('[data-test="file-match"]').text()).toBe('This is the very file that was stamped:')
    expect(facts(wrapper, '[data-test="file-result"]').map(([label]) => label)).toEqual(['Project', 'Revision', 'Stamped by', 'Stamped on', 'Verification id'])
  })

  it('says when a stamped file was changed, when a file is not ours, and when it is not a PDF', async () => {
    const { wrapper, state } = await openVerify('/verify')
    state.check = () => jsonResponse(200, { signature: 'altered', reason: 'The file claims to be KF-0107 revision 2, but it was changed after signing.', match: 'altered_copy', stamp: STAMP })
    await chooseFile(wrapper, new File(['%PDF'], 'edited.pdf', { type: 'application/pdf' }))
    expect(wrapper.get('[data-test="file-result"] .el-tag').text()).toBe('Changed after stamping')
    expect(wrapper.get('[data-test="file-match"]').text()).toBe('The file names this stamp, but it is not the file that was stamped:')

    state.check = () => jsonResponse(200, { signature: 'unsigned', reason: 'The file carries no digital signature, and it is not a plan set stamped in Stringline.', match: 'unknown', stamp: null })
    await chooseFile(wrapper, new File(['%PDF'], 'other.pdf', { type: 'application/pdf' }))
    expect(wrapper.get('[data-test="file-result"] .el-tag').text()).toBe('Not signed')
    expect(wrapper.find('[data-test="file-result"] [data-test="stamp-facts"]').exists()).toBe(false)

    state.check = () => errorResponse(415, 'unsupported_media_type', 'A PDF to verify must be PDF; this file’s content is image/png', [{ field: 'file', message: 'must be a PDF' }])
    await chooseFile(wrapper, new File(['png'], 'photo.png', { type: 'image/png' }))
    expect(wrapper.get('[data-test="file-problem"]').text()).toBe('A PDF to verify must be PDF; this file’s content is image/png')
    expect(wrapper.find('[data-test="file-result"]').exists()).toBe(false)
  })
})
