import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import type { Role } from '@shared/auth/roles'
import { PACKAGE_STEP_LABELS } from '@shared/schemas/revision'
import App from '@/App.vue'
import { JOB_POLL_MS } from '@/components/package/usePackageJob'
import { aJob, aRevision, DIAGRAM_SVG, fakePackageApi, PROJECT_ID, stubBlobUrls } from '@/components/package/packageFixtures'
import { createAppRouter } from '@/router'
import { errorResponse, jsonResponse } from '@/testing/fixtures'

type Api = ReturnType<typeof fakePackageApi>

async function openPage(role: Role, prepare: (api: Api) => void = () => undefined) {
  const api = fakePackageApi(role)
  prepare(api)
  const router = createAppRouter(createMemoryHistory())
  await router.push(`/projects/${PROJECT_ID}/package`)
  const wrapper = mount(App, { global: { plugins: [router] }, attachTo: document.body })
  await flushPromises()
  return { api, router, wrapper }
}

const buttonNamed = (root: ParentNode, label: string) => [...root.querySelectorAll('button')].find((b) => b.textContent?.trim() === label)
/** jsdom's Blob has no text(); FileReader reads it. */
const textOf = (blob: Blob) =>
  new Promise<string>((resolve) => {
    const reader = new FileReader()
    reader.onload = () => resolve(String(reader.result))
    reader.readAsText(blob)
  })
const progressText = () => document.querySelector('[data-test="job-step"]')?.textContent?.replace(/\s+/g, ' ').trim()

async function generate(description: string) {
  buttonNamed(document.body, 'Generate a revision')!.click()
  await flushPromises()
  const input = document.querySelector<HTMLInputElement>('#revision-description')!
  input.value = description
  input.dispatchEvent(new Event('input'))
  await flushPromises()
  buttonNamed(document.querySelector('.el-dialog')!, 'Generate')!.click()
  await flushPromises()
}

describe('project plan-set page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined) // jsdom has no layout to scroll
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] })
    stubBlobUrls()
    document.body.innerHTML = ''
  })
  afterEach(() => {
    vi.useRealTimers()
  })

  it('shows the caution and an empty state before the first revision', async () => {
    const { wrapper } = await openPage('designer')

    expect(wrapper.text()).toContain('No revision yet.')
    expect(wrapper.find('.caution-panel').exists()).toBe(true)
    expect(buttonNamed(document.body, 'Generate the first revision')).toBeDefined()
  })

  it('generates: queues the job, follows its steps each second and selects the new revision', async () => {
    const { api, wrapper } = await openPage('designer', ({ state }) => {
      state.polls = [
        aJob({ state: 'running', step: 'drawing', progress: 40 }),
        aJob({ state: 'completed', step: 'done', progress: 100, revisionNumber: 0, revisionId: 'rev-0' }),
      ]
    })

    await generate('Issued for permit')
    expect(api.writes()).toEqual([{ method: 'POST', url: `/api/projects/${PROJECT_ID}/revisions`, body: { description: 'Issued for permit' } }])
    expect(progressText()).toBe(`Step: ${PACKAGE_STEP_LABELS.queued} · 0 %`)
    expect(buttonNamed(document.body, 'Generate a revision')!.disabled).toBe(true)

    await vi.advanceTimersByTimeAsync(JOB_POLL_MS)
    await flushPromises()
    expect(progressText()).toBe(`Step: ${PACKAGE_STEP_LABELS.drawing} · 40 %`)
    expect(wrapper.get('.el-progress').attributes('aria-valuenow')).toBe('40')

    api.state.revisions = [aRevision(0)]
    await vi.advanceTimersByTimeAsync(JOB_POLL_MS)
    await flushPromises()
    expect(wrapper.text()).toContain('Revision 0 is published')
    expect(wrapper.find('.el-table__body tr.revisions__selected').text()).toContain('Issued for permit')
    expect(wrapper.get('#preview-heading').text()).toBe('Revision 0: Issued for permit')

    const pollsAtEnd = api.polls()
    await vi.advanceTimersByTimeAsync(JOB_POLL_MS * 3)
    expect(api.polls()).toBe(pollsAtEnd)
  })

  it('shows why a generation failed and retries it', async () => {
    const { api, wrapper } = await openPage('designer', ({ state }) => {
      state.activeJob = aJob({ state: 'running', step: 'packing', progress: 80 })
      state.polls = [aJob({ state: 'failed', step: 'packing', progress: 80, error: 'Storage refused the zip: disk full' })]
    })
    await vi.advanceTimersByTimeAsync(JOB_POLL_MS)
    await flushPromises()

    expect(wrapper.text()).toContain('The plan set could not be generated')
    expect(wrapper.text()).toContain('Storage refused the zip: disk full')
    expect(wrapper.find('.el-progress.is-exception').exists()).toBe(true)

    api.state.polls = [aJob({ state: 'running', step: 'evaluating', progress: 10, attempts: 2 })]
    buttonNamed(document.body, 'Retry')!.click()
    await flushPromises()
    expect(api.writes()).toEqual([{ method: 'POST', url: `/api/projects/${PROJECT_ID}/package-jobs/job-1/retry`, body: undefined }])
    expect(progressText()).toContain('attempt 2')

    await vi.advanceTimersByTimeAsync(JOB_POLL_MS)
    await flushPromises()
    expect(progressText()).toBe(`Step: ${PACKAGE_STEP_LABELS.evaluating} · 10 % · attempt 2`)
  })

  it('on 409 shows the generation already running instead of starting another', async () => {
    const { api, wrapper } = await openPage('admin', ({ state }) => {
      state.revisions = [aRevision(0)]
      state.generate = () => {
        state.activeJob = aJob({ id: 'job-7', state: 'running', step: 'labels', progress: 65, description: 'Started by a colleague' })
        return errorResponse(409, 'job_running', 'A plan set is already being generated for this project')
      }
      state.polls = [aJob({ id: 'job-7', state: 'running', step: 'labels', progress: 66 })]
    })

    await generate('Second try')
    expect(wrapper.text()).toContain('Generating: “Started by a colleague”')
    expect(progressText()).toBe(`Step: ${PACKAGE_STEP_LABELS.labels} · 65 %`)
    expect(document.querySelector('.el-message')?.textContent).toContain('already being generated')

    await vi.advanceTimersByTimeAsync(JOB_POLL_MS)
    expect(api.calls.at(-1)?.url).toBe(`/api/projects/${PROJECT_ID}/package-jobs/job-7`)
  })

  it.each(['reviewer', 'coordinator'] as const)('offers no generate button to a %s, who still reads the revisions', async (role) => {
    const { wrapper } = await openPage(role, ({ state }) => {
      state.revisions = [aRevision(1), aRevision(0)]
    })

    expect(buttonNamed(document.body, 'Generate a revision')).toBeUndefined()
    expect(wrapper.findAll('.revisions > .el-table__inner-wrapper .el-table__body > tbody > tr')).toHaveLength(2)
  })

  it('stops asking for the job once the page is left', async () => {
    const { api, router } = await openPage('designer', ({ state }) => {
      state.activeJob = aJob({ state: 'running', step: 'drawing', progress: 30 })
      state.polls = [aJob({ state: 'running', step: 'drawing', progress: 31 })]
    })
    await vi.advanceTimersByTimeAsync(JOB_POLL_MS)
    const pollsBefore = api.polls()
    expect(pollsBefore).toBe(1)

    await router.push(`/projects/${PROJECT_ID}`)
    await flushPromises()
    await vi.advanceTimersByTimeAsync(JOB_POLL_MS * 3)
    expect(api.polls()).toBe(pollsBefore)
  })

  it('shows the diagram from a blob URL in an <img>, never as markup in the page', async () => {
    const blobs = stubBlobUrls()
    const { wrapper } = await openPage('coordinator', ({ state }) => {
      state.revisions = [aRevision(0)]
    })
    await vi.waitFor(() => expect(wrapper.find('img.preview__diagram').exists()).toBe(true))

    const img = wrapper.get('img.preview__diagram')
    const src = img.attributes('src')!
    expect(src).toMatch(/^blob:/)
    const blob = blobs.get(src)!
    expect(blob.type).toBe('image/svg+xml')
    expect(await textOf(blob)).toBe(DIAGRAM_SVG)
    expect(wrapper.find('.preview svg').exists()).toBe(false)
    expect(img.attributes('alt')).toBe('Single-line diagram of revision 0')
  })

  it('keeps the 422 reason in the dialog with a way to the design', async () => {
    const { wrapper } = await openPage('designer', ({ state }) => {
      state.generate = () =>
        jsonResponse(422, { error: { code: 'design_failing', message: 'The design has failing checks', fields: [{ field: 'runs.R3.conductor', message: 'ampacity 30 A below 36 A required' }] } })
    })

    await generate('Issued for permit')
    const problem = wrapper.get('[data-test="generate-problem"]')
    expect(problem.text()).toContain('The design has failing checks')
    expect(problem.text()).toContain('runs.R3.conductor: ampacity 30 A below 36 A required')
    expect(problem.get('a').attributes('href')).toBe(`/projects/${PROJECT_ID}/design`)
  })
})
