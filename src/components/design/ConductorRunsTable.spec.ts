import { beforeEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { demoDesign } from '@shared/demo/designs'
import { useDesignEditorStore } from '@/stores/designEditor'
import ConductorRunsTable from './ConductorRunsTable.vue'

const PROJECT_ID = '5d2f0c9a-3b1e-4f6a-9c7d-2e8b1a4f6c01'

async function openDemo() {
  const editor = useDesignEditorStore()
  editor.start(PROJECT_ID, demoDesign('gridTied'))
  const wrapper = mount(ConductorRunsTable, { attachTo: document.body })
  await flushPromises()
  return { editor, wrapper }
}
type Opened = Awaited<ReturnType<typeof openDemo>>

const resultLine = (wrapper: Opened['wrapper'], runId: string) => wrapper.get(`.runs__result[data-run="${runId}"]`)

async function typeNumber(wrapper: Opened['wrapper'], label: string, value: string) {
  const input = wrapper.get(`input[aria-label="${label}"]`)
  await input.setValue(value)
  await input.trigger('change')
  await flushPromises()
}

describe('conductor-run table', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
  })

  it('shows one row per run with the engine’s conductor, OCPD, EGC, conduit and voltage drop', async () => {
    const { wrapper } = await openDemo()

    expect(wrapper.findAll('.runs__result')).toHaveLength(4)
    // R3 carries the 7.6 kW inverter's output: 32 A × 1.25 = 40 A → 8 AWG Cu at 75 °C terminals
    // (NFPA 70-2023 Table 310.16, 75 °C copper column: 8 AWG = 50 A, 10 AWG = 35 A; values from memory)
    expect(resultLine(wrapper, 'R3').text()).toContain('8 AWG Cu')
    expect(resultLine(wrapper, 'R3').text()).toContain('OCPD 40 A')
  })

  it('updates the document when a length is edited, and the result line follows once typing pauses', async () => {
    const { editor, wrapper } = await openDemo()
    const dropBefore = resultLine(wrapper, 'R4').get('.runs__drop').text()

    await typeNumber(wrapper, 'Run R4 length in feet', '400')

    expect(editor.document?.topology.runs.find((run) => run.id === 'R4')?.lengthFt).toBe(400)
    // a longer run can only drop more voltage; past the 3 % limit the engine upsizes the conductor
    await expect.poll(() => resultLine(wrapper, 'R4').get('.runs__drop').text()).not.toBe(dropBefore)
    expect(resultLine(wrapper, 'R4').find('.runs__conductor').text()).not.toBe('8 AWG Cu')
    expect(editor.dirty).toBe(true)
  })

  it('never lets a length the schema refuses into the document', async () => {
    const { editor, wrapper } = await openDemo()

    await typeNumber(wrapper, 'Run R1 length in feet', '0')

    expect(editor.document?.topology.runs[0]?.lengthFt).toBe(1)
  })

  it('shows the engine’s reason beside the field an edit made wrong, and no result for that run', async () => {
    const { editor, wrapper } = await openDemo()

    editor.document!.topology.runs[0]!.from = 'MSP'

    await expect.poll(() => wrapper.find('.runs__problem').exists()).toBe(true)
    expect(wrapper.get('.runs__problem').text()).toBe('a pv_source run cannot start at a panel ("MSP"); expected string')
    expect(wrapper.findAll('.runs__result')).toHaveLength(0)
  })

  it('adds a run with a fresh id and removes one', async () => {
    const { editor, wrapper } = await openDemo()

    await wrapper.findAll('button').find((b) => b.text() === 'Add run')!.trigger('click')
    expect(editor.document?.topology.runs.map((run) => run.id)).toEqual(['R1', 'R2', 'R3', 'R4', 'R5'])

    await wrapper.get('button[aria-label="Remove run R2"]').trigger('click')
    expect(editor.document?.topology.runs.map((run) => run.id)).toEqual(['R1', 'R3', 'R4', 'R5'])
  })
})
