import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { demoDesign } from '@shared/demo/designs'
import type { DesignDto } from '@/api/types'
import { useDesignEditorStore } from '@/stores/designEditor'
import { errorResponse, jsonResponse } from '@/testing/fixtures'
import DesignConflictDialog from './DesignConflictDialog.vue'

const PROJECT_ID = '5d2f0c9a-3b1e-4f6a-9c7d-2e8b1a4f6c01'

function designAt(version: number, change: (doc: DesignDto['document']) => void = () => undefined): DesignDto {
  const document = demoDesign('gridTied')
  change(document)
  return {
    projectId: PROJECT_ID, document, systemKind: 'grid_tied', necEdition: 2023, moduleCount: 20, dcWattsStc: 8000,
    lastEvaluation: null, createdAt: '2026-11-30T09:00:00.000Z', updatedAt: '2026-12-01T14:30:00.000Z', version,
  }
}

/** A colleague saved version 4 (R4 now 30 ft) after this editor read version 3. */
function apiWithNewerSave() {
  const theirs = designAt(4, (doc) => {
    doc.topology.runs[3]!.lengthFt = 30
  })
  const fetch = vi.fn(async (url: string, init?: RequestInit) => {
    if (url === `/api/projects/${PROJECT_ID}/design` && init?.method === 'PUT') {
      const { version } = JSON.parse(String(init.body)) as { version: number }
      if (version === 3) return errorResponse(409, 'version_conflict', 'Design was changed by someone else (now version 4)')
      return jsonResponse(200, { design: { ...theirs, version: 5, document: JSON.parse(String(init.body)).document } })
    }
    if (url === `/api/projects/${PROJECT_ID}/design`) return jsonResponse(200, { design: theirs })
    return errorResponse(404, 'not_found', 'Not found')
  })
  vi.stubGlobal('fetch', fetch)
  return fetch
}

async function editAndSave() {
  const editor = useDesignEditorStore()
  editor.open(PROJECT_ID, designAt(3))
  editor.document!.topology.arrays[0]!.tiltDeg = 30
  mount(DesignConflictDialog, { attachTo: document.body })
  const outcome = await editor.save()
  await flushPromises()
  return { editor, outcome }
}

const dialog = () => document.querySelector('.el-dialog')
const button = (label: string) => [...(dialog()?.querySelectorAll('button') ?? [])].find((b) => b.textContent?.trim() === label)!

describe('design save conflict', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
  })

  it('shows what the other save changed, what it was and what this editor holds', async () => {
    apiWithNewerSave()
    const { outcome } = await editAndSave()

    expect(outcome).toBe('conflict')
    await vi.waitFor(() => expect(dialog()?.textContent).toContain('Someone else saved this design first'))
    expect(dialog()?.textContent).toContain('Version 4 was saved')
    expect(dialog()?.textContent).toContain('It changes 1 field(s); you have 1 unsaved change(s).')
    const row = [...dialog()!.querySelectorAll('.el-table__body tr')].map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent?.trim()))
    expect(row).toEqual([['topology.runs[R4].lengthFt', '15', '30', '15']])
  })

  it('loads their version and drops these edits when asked', async () => {
    apiWithNewerSave()
    const { editor } = await editAndSave()

    button('Load their version').click()
    await flushPromises()

    expect(editor.conflict).toBeNull()
    expect(editor.version).toBe(4)
    expect(editor.document?.topology.runs[3]?.lengthFt).toBe(30)
    expect(editor.document?.topology.arrays[0]?.tiltDeg).toBe(26)
    expect(editor.dirty).toBe(false)
  })

  it('keeps these edits on top of their version, and the next save goes through at it', async () => {
    const fetch = apiWithNewerSave()
    const { editor } = await editAndSave()

    button('Keep my edits').click()
    await flushPromises()

    expect(editor.conflict).toBeNull()
    expect(editor.document?.topology.arrays[0]?.tiltDeg).toBe(30)
    expect(editor.dirty).toBe(true)
    expect(await editor.save()).toBe('saved')
    const lastPut = fetch.mock.calls.filter(([, init]) => init?.method === 'PUT').at(-1)!
    expect(JSON.parse(String(lastPut[1]?.body)).version).toBe(4)
    expect(editor.version).toBe(5)
  })
})
