import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createMemoryHistory, createRouter } from 'vue-router'
import type { Role } from '@shared/auth/roles'
import { routes } from '@/router/routes'
import SideNav from './SideNav.vue'

async function navFor(role: Role) {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push('/profile')
  const wrapper = mount(SideNav, { props: { role }, global: { plugins: [router] } })
  return wrapper.findAll('a').map((link) => ({ label: link.text(), href: link.attributes('href'), current: link.attributes('aria-current') }))
}

describe('side navigation', () => {
  it('shows an administrator every page, Users among them', async () => {
    expect((await navFor('admin')).map((item) => item.label)).toEqual(['Home', 'Projects', 'Equipment library', 'Jurisdictions', 'Submissions', 'Users', 'Caught mail', 'My profile'])
  })

  it.each<Role>(['designer', 'reviewer'])('hides Users and the submission board from a %s', async (role) => {
    const items = await navFor(role)
    expect(items.map((item) => item.label)).toEqual(['Home', 'Projects', 'Equipment library', 'Jurisdictions', 'My profile'])
    expect(items.some((item) => item.href === '/users' || item.href === '/submissions')).toBe(false)
  })

  it('shows a coordinator the submission board but not Users or the caught mail', async () => {
    const items = await navFor('coordinator')
    expect(items.map((item) => item.label)).toEqual(['Home', 'Projects', 'Equipment library', 'Jurisdictions', 'Submissions', 'My profile'])
  })

  it('links each item to its page and marks the page being shown', async () => {
    expect(await navFor('admin')).toEqual([
      { label: 'Home', href: '/', current: undefined },
      { label: 'Projects', href: '/projects', current: undefined },
      { label: 'Equipment library', href: '/equipment', current: undefined },
      { label: 'Jurisdictions', href: '/jurisdictions', current: undefined },
      { label: 'Submissions', href: '/submissions', current: undefined },
      { label: 'Users', href: '/users', current: undefined },
      { label: 'Caught mail', href: '/mailbox', current: undefined },
      { label: 'My profile', href: '/profile', current: 'page' },
    ])
  })
})
