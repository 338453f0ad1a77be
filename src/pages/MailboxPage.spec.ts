import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import { NOTIFICATION_CATEGORY_INFO, type CaughtMailDto } from '@shared/schemas/notifications'
import App from '@/App.vue'
import { createAppRouter } from '@/router'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'

const HTML = '<p>Revision 2 of <b>KF-0107</b> waits for your review.</p><script>window.parent.stolen = document.cookie</script>'

const aMail = (overrides: Partial<CaughtMailDto> = {}): CaughtMailDto => ({
  id: 'mail-1', receivedAt: '2026-12-03T09:01:00.000Z', from: 'Stringline <noreply@kestrelfen-solar.example>',
  to: ['reviewer@kestrelfen-solar.example'], subject: 'KF-0107 is ready for your review', category: 'review_requested',
  text: 'Revision 2 of KF-0107 waits for your review.', html: HTML, ...overrides,
})

function fakeMailbox(answer: () => Response) {
  const urls: string[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string) => {
    urls.push(url)
    if (url === '/api/auth/refresh') return jsonResponse(200, sessionOf(aMember('admin')))
    if (url === '/api/dev/mailbox') return answer()
    if (url === '/api/dev/mailbox/mail-1') return jsonResponse(200, aMail())
    return errorResponse(404, 'not_found', 'Not found')
  }))
  return urls
}

async function openMailbox() {
  const router = createAppRouter(createMemoryHistory())
  await router.push('/mailbox')
  const wrapper = mount(App, { global: { plugins: [router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

describe('caught mail page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined)
    document.body.innerHTML = ''
  })

  it('lists the caught messages and shows one’s HTML only inside a sandboxed frame', async () => {
    const { html: _html, text: _text, ...summary } = aMail()
    const urls = fakeMailbox(() => jsonResponse(200, { items: [summary, { ...summary, id: 'mail-2', category: null, subject: 'Daily list' }] }))
    const wrapper = await openMailbox()

    const rows = wrapper.findAll('.mailbox__list .el-table__body tr.el-table__row').map((row) => row.findAll('td').map((td) => td.text()))
    expect(rows).toEqual([
      [expect.stringMatching(/2026/), 'reviewer@kestrelfen-solar.example', 'KF-0107 is ready for your review', NOTIFICATION_CATEGORY_INFO.review_requested.label],
      [expect.stringMatching(/2026/), 'reviewer@kestrelfen-solar.example', 'Daily list', '—'],
    ])

    await wrapper.findAll('.mailbox__subject')[0]!.trigger('click')
    await flushPromises()
    expect(urls.filter((u) => u.startsWith('/api/dev/mailbox/'))).toEqual(['/api/dev/mailbox/mail-1'])
    const frame = wrapper.get('iframe[data-test="mail-html"]').element as HTMLIFrameElement
    expect(frame.getAttribute('sandbox')).toBe('')
    expect(frame.srcdoc || frame.getAttribute('srcdoc')).toBe(HTML)
    // the message's markup is never part of this page
    expect(wrapper.find('.mail b').exists()).toBe(false)
    expect(document.querySelectorAll('script')).toHaveLength(0)

    await wrapper.findAll('.mail .el-radio-button').find((b) => b.text() === 'Text')!.get('input').setValue(true)
    expect(wrapper.get('[data-test="mail-text"]').text()).toBe('Revision 2 of KF-0107 waits for your review.')
  })

  it('explains that the mail catcher runs only in development when the server has none', async () => {
    fakeMailbox(() => errorResponse(404, 'not_found', 'Not found'))
    const wrapper = await openMailbox()

    expect(wrapper.get('[data-test="no-catcher"]').text()).toContain('The mail catcher runs only in development, when the app is started with npm start or npm run dev.')
    expect(wrapper.find('.mailbox__list').exists()).toBe(false)
  })

  it('shows another failure as it is, keeping the list', async () => {
    fakeMailbox(() => errorResponse(500, 'internal', 'The mail catcher folder cannot be read'))
    const wrapper = await openMailbox()
    expect(wrapper.get('.mailbox .el-alert').text()).toContain('The mail catcher folder cannot be read')
    expect(wrapper.find('[data-test="no-catcher"]').exists()).toBe(false)
  })
})
