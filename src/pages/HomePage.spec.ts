import { beforeEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { ROLE_LABELS, type Role } from '@shared/auth/roles'
import { SAFETY_CAUTION } from '@shared/electrical/caution'
import type { User } from '@/api/types'
import { ROLE_DUTIES } from '@/content/roleDuties'
import { routes } from '@/router/routes'
import { useAuthStore } from '@/stores/auth'
import { aMember } from '@/testing/fixtures'
import HomePage from './HomePage.vue'

function homeOf(member: User) {
  useAuthStore().user = member
  const router = createRouter({ history: createMemoryHistory(), routes })
  return mount(HomePage, { global: { plugins: [router] } })
}

describe('home page', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it.each<Role>(['admin', 'designer', 'reviewer', 'coordinator'])(
    'tells a %s who they are signed in as, what the role does, and the caution',
    (role) => {
      const member = aMember(role)
      const text = homeOf(member).text()

      expect(text).toContain(`Signed in as ${member.email} · ${ROLE_LABELS[role]} at ${member.organizationName}`)
      for (const duty of ROLE_DUTIES[role]) expect(text).toContain(duty)
      expect(text).toContain(SAFETY_CAUTION)
    },
  )

  it('asks a reviewer with no licence on file to have one added', () => {
    expect(homeOf(aMember('reviewer')).text()).toContain('No licence number is on file')
  })

  it('shows a reviewer the licence their stamp carries', () => {
    const text = homeOf(aMember('reviewer', { licenceNumber: 'EC-204417', licenceRegion: 'Northmarch', licenceExpiry: '2031-01-15' })).text()
    expect(text).toContain('EC-204417 · Northmarch')
    expect(text).not.toContain('No licence number is on file')
  })

  it('offers shortcuts only to the pages the role may open', () => {
    const shortcuts = (role: Role) => homeOf(aMember(role)).findAll('.home__shortcut').map((link) => link.text())
    expect(shortcuts('admin')).toEqual(['Projects', 'Equipment library', 'Jurisdictions', 'Users', 'My profile'])
    expect(shortcuts('coordinator')).toEqual(['Projects', 'Equipment library', 'Jurisdictions', 'My profile'])
  })
})
