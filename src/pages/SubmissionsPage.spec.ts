import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import { ElSelect } from 'element-plus'
import type { BoardRowDto } from '@shared/schemas/submission'
import App from '@/App.vue'
import { PROJECT_ID, stubBlobUrls } from '@/components/package/packageFixtures'
import { aBoardRow, catchDownloads, typeInto } from '@/components/submission/submissionFixtures'
import { formatDate, todayIso } from '@/format/dates'
import { createAppRouter } from '@/router'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'

const FENWICK = { id: '62738495-af01-4c12-93e4-5f6071829304', name: 'Fenwick Cross Building Office' }
const SECOND_ID = '7e8f9a0b-1c2d-4e3f-8a4b-5c6d7e8f9a0b'

/** The board as the server answers it, recording the query of every call. */
function fakeBoardApi(rows: BoardRowDto[], total = rows.length) {
  const calls: string[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string) => {
    calls.push(url)
    if (url === '/api/auth/refresh') return jsonResponse(200, sessionOf(aMember('coordinator')))
    if (url.startsWith('/api/jurisdictions?')) return jsonResponse(200, { items: [{ ...FENWICK, necEdition: 2023 }], total: 1, page: 1, pageSize: 100 })
    if (url.startsWith('/api/submissions.csv')) return new Response('Project code,Project\r\nKF-0107,Heronsgate barn roof\r\n', { status: 200, headers: { 'Content-Type': 'text/csv' } })
    if (url.startsWith('/api/submissions')) return jsonResponse(200, { items: rows, total, page: 1, pageSize: 20 })
    return errorResponse(404, 'not_found', 'Not found')
  }))
  return {
    boardQueries: () => calls.filter((url) => url.startsWith('/api/submissions?')).map((url) => url.split('?')[1]),
    csvCalls: () => calls.filter((url) => url.startsWith('/api/submissions.csv')),
  }
}

const ROWS = [
  aBoardRow({ nextDueOn: '2026-12-02', overdue: true }),
  aBoardRow({
    project: { id: SECOND_ID, code: 'KF-0111', name: 'Millpond cottage', status: 'permit_issued', jurisdiction: null },
    submission: { method: 'counter', submittedOn: '2026-11-02', ahjReference: null, permitNumber: 'EP-26-01884', openCorrectionItems: 0 },
    nextDueOn: null,
  }),
]

async function openBoard(path = '/submissions', rows = ROWS, total?: number) {
  const api = fakeBoardApi(rows, total)
  const router = createAppRouter(createMemoryHistory())
  await router.push(path)
  const wrapper = mount(App, { global: { plugins: [router] }, attachTo: document.body })
  await flushPromises()
  return { api, router, wrapper }
}

const cellsOf = (wrapper: Awaited<ReturnType<typeof openBoard>>['wrapper']) =>
  wrapper.findAll('.el-table__body tr').map((tr) => tr.findAll('td').map((td) => td.text().replace(/\s+/g, ' ')))

describe('submission board page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined) // jsdom has no layout to scroll
    document.body.innerHTML = ''
  })

  it('lists each project with its status, AHJ paperwork and next due date, late ones in red', async () => {
    const { api, wrapper } = await openBoard()
    expect(api.boardQueries()).toEqual(['page=1&pageSize=20&sort=nextDueOn'])
    expect(cellsOf(wrapper)).toEqual([
      ['KF-0107', 'Heronsgate barn roof', 'AHJ corrections', 'Fenwick Cross Building Office', 'Online portal', formatDate('2026-12-01'), 'FX-BLD-26-0417', '—', '1', `${formatDate('2026-12-02')} · overdue`],
      ['KF-0111', 'Millpond cottage', 'Permit issued', '—', 'At the counter', formatDate('2026-11-02'), '—', 'EP-26-01884', '0', '—'],
    ])
    const nextDue = wrapper.findAll('[data-test="next-due"]')
    expect(nextDue.map((d) => d.classes().includes('submissions__overdue'))).toEqual([true, false])
    expect(wrapper.get('.el-table__body a').attributes('href')).toBe(`/projects/${PROJECT_ID}`)
    expect(wrapper.text()).toContain('2 projects')
  })

  it('asks for the statuses, jurisdiction, due date and search held in the address, and exports the same as CSV', async () => {
    const { api, wrapper } = await openBoard(`/submissions?status=submitted,ahj_corrections,nonsense&jurisdictionId=${FENWICK.id}&dueBefore=2026-12-31&q=heron&sort=-code`)
    expect(api.boardQueries()).toEqual([`page=1&pageSize=20&sort=-code&q=heron&status=submitted&status=ahj_corrections&jurisdictionId=${FENWICK.id}&dueBefore=2026-12-31`])
    expect(wrapper.get<HTMLInputElement>('#submissions-due-before').element.value).toBe('2026-12-31')

    stubBlobUrls()
    const downloads = catchDownloads()
    await wrapper.get('[data-test="export-csv"]').trigger('click')
    await flushPromises()
    expect(api.csvCalls()).toEqual([`/api/submissions.csv?sort=-code&q=heron&status=submitted&status=ahj_corrections&jurisdictionId=${FENWICK.id}&dueBefore=2026-12-31`])
    expect(downloads).toEqual([`submissions-${todayIso()}.csv`])
  })

  it('filters from the toolbar, back at the first page', async () => {
    const { api, router, wrapper } = await openBoard('/submissions?page=2')
    wrapper.findAllComponents(ElSelect).find((s) => s.attributes('data-test') === 'status-filter')!.vm.$emit('update:modelValue', ['ahj_corrections', 'resubmitted'])
    await flushPromises()
    expect(router.currentRoute.value.query).toEqual({ status: 'ahj_corrections,resubmitted' })
    expect(api.boardQueries().at(-1)).toBe('page=1&pageSize=20&sort=nextDueOn&status=ahj_corrections&status=resubmitted')

    typeInto(wrapper.get<HTMLInputElement>('#submissions-due-before').element, '2026-12-20')
    await flushPromises()
    expect(api.boardQueries().at(-1)).toBe('page=1&pageSize=20&sort=nextDueOn&status=ahj_corrections&status=resubmitted&dueBefore=2026-12-20')

    await wrapper.get('#submissions-search').setValue('FX-BLD')
    await vi.waitFor(() => expect(api.boardQueries().at(-1)).toBe('page=1&pageSize=20&sort=nextDueOn&q=FX-BLD&status=ahj_corrections&status=resubmitted&dueBefore=2026-12-20'))
  })

  it('sorts on the server when a sortable column header is clicked', async () => {
    const { api, wrapper } = await openBoard()
    await wrapper.findAll('.el-table__header th').find((th) => th.text().includes('Submitted'))!.get('.cell').trigger('click')
    await flushPromises()
    expect(api.boardQueries().at(-1)).toBe('page=1&pageSize=20&sort=submittedOn')
  })

  it('shows the same filtered projects as cards in status columns, up to 100 at once', async () => {
    const { api, router, wrapper } = await openBoard('/submissions?status=ahj_corrections,permit_issued&page=3', ROWS, 140)
    const board = [...wrapper.findAll('.el-radio-button')].find((b) => b.text() === 'Board')!
    await board.get('input').setValue(true)
    await flushPromises()
    expect(router.currentRoute.value.query).toEqual({ status: 'ahj_corrections,permit_issued', view: 'board' })
    expect(api.boardQueries().at(-1)).toBe('page=1&pageSize=100&sort=nextDueOn&status=ahj_corrections&status=permit_issued')
    expect(wrapper.find('.el-table').exists()).toBe(false)

    const columns = wrapper.findAll('[data-test="board-column"]').map((c) => ({
      heading: c.get('h2').text().replace(/\s+/g, ' '),
      cards: c.findAll('[data-test="board-card"]').map((card) => card.text().replace(/\s+/g, ' ')),
    }))
    expect(columns).toEqual([
      { heading: 'AHJ corrections 1', cards: [`KF-0107Heronsgate barn roofFenwick Cross Building OfficeAHJ ref. FX-BLD-26-04171 open correction itemsNext due ${formatDate('2026-12-02')} · overdue`] },
      { heading: 'Permit issued 1', cards: ['KF-0111Millpond cottageNo jurisdictionPermit EP-26-01884'] },
    ])
    expect(wrapper.get('[data-test="board-card"]').classes()).toContain('board__card--overdue')
    expect(wrapper.text()).toContain('The board shows the first 2 of 140 projects')
  })
})
