import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import GenerateDialog from './GenerateDialog.vue'
import { fakePackageApi, PROJECT_ID } from './packageFixtures'

// only the route the dialog links to: the app's router would start loading its pages
const router = createRouter({ history: createMemoryHistory(), routes: [{ path: '/projects/:projectId/design', name: 'project-design', component: { render: () => null } }] })

async function mountDialog() {
  const wrapper = mount(GenerateDialog, {
    props: { open: true, projectId: PROJECT_ID },
    global: { plugins: [router] },
    attachTo: document.body,
  })
  await flushPromises()
  const submit = async (description: string) => {
    await wrapper.get('#revision-description').setValue(description)
    await wrapper.findAll('.el-dialog button').find((b) => b.text() === 'Generate')!.trigger('click')
    await flushPromises()
  }
  return { wrapper, submit }
}

const fieldError = () => document.querySelector('.el-form-item__error')?.textContent?.trim()

describe('generate dialog', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
  })

  it('refuses an empty description and one too long for the revision table, sending nothing', async () => {
    const api = fakePackageApi('designer')
    const { submit } = await mountDialog()

    await submit('   ')
    await vi.waitFor(() => expect(fieldError()).toBe('must say what this revision is for'))
    // the input caps typing at 80; a pasted value set programmatically can still be longer
    await submit('x'.repeat(81))
    await vi.waitFor(() => expect(fieldError()).toBe('must fit the revision table: at most 80 characters'))
    expect(api.writes()).toEqual([])
  })

  it('sends the trimmed description and hands the queued job to the page', async () => {
    const api = fakePackageApi('designer')
    const { wrapper, submit } = await mountDialog()

    await submit('  Issued for permit  ')
    expect(api.writes()).toEqual([{ method: 'POST', url: `/api/projects/${PROJECT_ID}/revisions`, body: { description: 'Issued for permit' } }])
    expect(wrapper.emitted('started')?.[0]?.[0]).toMatchObject({ id: 'job-1', state: 'queued' })
    expect(wrapper.emitted('update:open')?.at(-1)).toEqual([false])
  })

  it('passes a 409 on to the page as busy and closes', async () => {
    const api = fakePackageApi('admin')
    api.state.generate = () => new Response(JSON.stringify({ error: { code: 'job_running', message: 'Already generating' } }), { status: 409 })
    const { wrapper, submit } = await mountDialog()

    await submit('Resubmittal 1')
    expect(wrapper.emitted('busy')).toEqual([['Already generating']])
    expect(wrapper.emitted('started')).toBeUndefined()
  })
})
