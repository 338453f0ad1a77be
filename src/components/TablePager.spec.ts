import { mount } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import TablePager from './TablePager.vue'

describe('TablePager', () => {
  it('asks for a page, and goes back to page 1 when the page size changes', async () => {
    const wrapper = mount(TablePager, { props: { total: 95, page: 3, pageSize: 20 } })
    const pagination = wrapper.findComponent({ name: 'ElPagination' })
    pagination.vm.$emit('update:current-page', 4)
    pagination.vm.$emit('update:page-size', 50)
    expect(wrapper.emitted('change')).toEqual([[{ page: 4 }], [{ pageSize: 50, page: 1 }]])
    expect(wrapper.text()).toContain('Total 95')
  })
})
