import { beforeEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { aRevision, fakePackageApi, PROJECT_ID, stubBlobUrls } from './packageFixtures'
import RevisionPreview from './RevisionPreview.vue'

async function mountPreview() {
  const api = fakePackageApi('reviewer')
  const blobs = stubBlobUrls()
  const wrapper = mount(RevisionPreview, { props: { projectId: PROJECT_ID, revision: aRevision(0) }, attachTo: document.body })
  await flushPromises()
  const fileCalls = () => api.calls.filter((c) => c.url.includes('/files/')).map((c) => c.url.split('/files/')[1])
  return { wrapper, blobs, fileCalls }
}

const button = (wrapper: Awaited<ReturnType<typeof mountPreview>>['wrapper'], label: string) =>
  wrapper.findAll('button').find((b) => b.attributes('aria-label') === label || b.text() === label)!

describe('revision preview', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
  })

  it('zooms the diagram in steps and fits it back to the frame width', async () => {
    const { wrapper } = await mountPreview()
    const img = () => wrapper.get('img.preview__diagram')
    expect(img().attributes('style')).toContain('width: 100%')

    await button(wrapper, 'Zoom in').trigger('click')
    await button(wrapper, 'Zoom in').trigger('click')
    expect(wrapper.get('[data-test="zoom"]').text()).toBe('200 %')
    expect(img().attributes('style')).toContain('width: 200%')

    await button(wrapper, 'Fit width').trigger('click')
    await button(wrapper, 'Zoom out').trigger('click')
    await button(wrapper, 'Zoom out').trigger('click')
    expect(img().attributes('style')).toContain('width: 50%')
    expect(button(wrapper, 'Zoom out').attributes('disabled')).toBeDefined()
  })

  it('fetches the plan set only when its tab opens, and frees the blob URLs of a revision left', async () => {
    const { wrapper, blobs, fileCalls } = await mountPreview()
    expect(fileCalls()).toEqual(['single-line.svg'])

    await wrapper.findAll('.el-tabs__item').find((t) => t.text() === 'Plan set (PDF)')!.trigger('click')
    await flushPromises()
    expect(fileCalls()).toEqual(['single-line.svg', 'plan-set.pdf'])
    const pdfUrl = wrapper.get('iframe.preview__pdf').attributes('src')!
    expect(blobs.get(pdfUrl)?.type).toBe('application/pdf')

    await wrapper.setProps({ revision: aRevision(1) })
    await flushPromises()
    expect(blobs.has(pdfUrl)).toBe(false)
    expect(fileCalls().slice(2)).toEqual(['single-line.svg', 'plan-set.pdf'])
    expect(fileCalls()).toHaveLength(4)
  })
})
