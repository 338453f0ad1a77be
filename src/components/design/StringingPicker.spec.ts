import { beforeEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { demoDesign } from '@shared/demo/designs'
import { useDesignEditorStore } from '@/stores/designEditor'
import StringingPicker from './StringingPicker.vue'

async function openPicker(moduleCount: number) {
  const editor = useDesignEditorStore()
  const doc = demoDesign('gridTied')
  doc.topology.arrays[0]!.moduleCount = moduleCount
  editor.start('5d2f0c9a-3b1e-4f6a-9c7d-2e8b1a4f6c01', doc)
  const wrapper = mount(StringingPicker, { props: { arrayId: 'A1', open: true, 'onUpdate:open': () => undefined }, attachTo: document.body })
  await flushPromises()
  return { editor, wrapper }
}

const layoutRows = () => [...document.querySelectorAll('.el-dialog .el-table__body tr')].map((tr) => tr.textContent ?? '')

describe('auto-stringing picker', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    document.body.innerHTML = ''
  })

  it('lists the valid layouts for the array on its inverter with their voltages', async () => {
    await openPicker(24)

    const rows = layoutRows()
    expect(rows).toHaveLength(1)
    // NFPA 70-2023 690.7(A)(1): 12 × 37.1 V × (1 + (−0.27 %/°C)(−18 − 25) °C) = 496.9 V, held to the
    // 600 V limit for one- and two-family dwellings (690.7, value from memory)
    expect(rows[0]).toContain('2 × 12')
    expect(rows[0]).toContain('496.9 / 600 V')
    // 3 × 8 would put two strings on one MPPT: 2 × 1.25 × 13.8 A = 34.5 A > the 20 A input rating (690.8(A)(1))
    expect(rows.join()).not.toContain('3 × 8')
  })

  it('rewrites the array’s strings over the MPPT inputs when a layout is picked, keeping the run settings', async () => {
    const { editor, wrapper } = await openPicker(24)
    expect(editor.live?.issues.map((i) => i.field)).toContain('topology.arrays[0].moduleCount')

    ;(document.querySelector('.el-dialog button[aria-label="Use 2 strings of 12"]') as HTMLButtonElement).click()
    await flushPromises()

    const doc = editor.document!
    expect(doc.topology.strings.map((s) => [s.id, s.modulesInSeries, s.inverterId, s.mppt])).toEqual([
      ['A1-S1', 12, 'INV1', 1],
      ['A1-S2', 12, 'INV1', 2],
    ])
    const stringRuns = doc.topology.runs.filter((run) => run.kind === 'pv_source')
    expect(stringRuns.map((run) => [run.from, run.to, run.lengthFt, run.racewayId])).toEqual([
      ['A1-S1', 'INV1', 65, 'C1'],
      ['A1-S2', 'INV1', 65, 'C1'],
    ])
    expect(wrapper.emitted('picked')).toHaveLength(1)
    editor.evaluateNow()
    expect(editor.live?.valid).toBe(true)
  })

  it('says so when no layout fits', async () => {
    await openPicker(7)

    expect(layoutRows()).toEqual([])
    expect(document.querySelector('.el-dialog .el-table__empty-text')?.textContent).toBe('No valid layout for this module count on this inverter')
  })
})
