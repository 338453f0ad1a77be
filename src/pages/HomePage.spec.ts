import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { ROLE_LABELS, type Role } from '@shared/auth/roles'
import { SAFETY_CAUTION } from '@shared/electrical/caution'
import type { DueItemDto } from '@shared/schemas/submission'
import type { User } from '@/api/types'
import { PROJECT_ID } from '@/components/package/packageFixtures'
import { aDueItem } from '@/components/submission/submissionFixtures'
import { ROLE_DUTIES } from '@/content/roleDuties'
import { formatDate } from '@/format/dates'
import { routes } from '@/router/routes'
import { useAuthStore } from '@/stores/auth'
import { aMember, jsonResponse } from '@/testing/fixtures'
import HomePage from './HomePage.vue'

function homeOf(member: User) {
  useAuthStore().user = member
  const router = createRouter({ history: createMemoryHistory(), routes })
  return mount(HomePage, { global: { plugins: [router] } })
}

/** The reminders route as the server answers it; every call is recorded. */
function fakeDueApi(items: DueItemDto[]) {
  const calls: string[] = []
  vi.stubGlobal('fetch', vi.fn(async (url: string) => {
    calls.push(url)
    return jsonResponse(200, { items, horizonDays: 7 })
  }))
  return calls
}

describe('home page', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    fakeDueApi([])
  })

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
    expect(shortcuts('admin')).toEqual(['Projects', 'Equipment library', 'Jurisdictions', 'Submissions', 'Users', 'Caught mail', 'My profile'])
    expect(shortcuts('coordinator')).toEqual(['Projects', 'Equipment library', 'Jurisdictions', 'Submissions', 'My profile'])
    expect(shortcuts('designer')).toEqual(['Projects', 'Equipment library', 'Jurisdictions', 'My profile'])
  })

  it('lists for a coordinator what is due and what is late, each with its project', async () => {
    const calls = fakeDueApi([
      aDueItem({ kind: 'fee_payment', summary: 'Pay the permit fee of 350.00', dueOn: '2026-12-02', overdue: true }),
      aDueItem(),
    ])
    const wrapper = homeOf(aMember('coordinator'))
    await flushPromises()
    expect(calls).toEqual(['/api/submissions/due'])
    const items = wrapper.findAll('[data-test="due-item"]')
    const rows = items.map((i) => [i.get('.due-list__date').text(), i.get('.due-list__what').text().replace(/\s+/g, ' ')])
    expect(rows).toEqual([
      [`${formatDate('2026-12-02')} Overdue`, 'Fee payment · Pay the permit fee of 350.00 · KF-0107 Heronsgate barn roof (Fenwick Cross Building Office)'],
      [formatDate('2026-12-18'), 'Corrections response · Answer the AHJ’s corrections (1 open item) and resubmit · KF-0107 Heronsgate barn roof (Fenwick Cross Building Office)'],
    ])
    expect(items[0]!.classes()).toContain('due-list__item--overdue')
    expect(items[1]!.classes()).not.toContain('due-list__item--overdue')
    expect(items[0]!.get('a').attributes('href')).toBe(`/projects/${PROJECT_ID}`)
  })

  it('tells an administrator when nothing is due, and asks nothing for other roles', async () => {
    const wrapper = homeOf(aMember('admin'))
    await flushPromises()
    expect(wrapper.get('[aria-labelledby="due-title"]').text()).toContain('Nothing is overdue or due in the next 7 days.')

    const calls = fakeDueApi([aDueItem()])
    const designerHome = homeOf(aMember('designer'))
    await flushPromises()
    expect(calls).toEqual([])
    expect(designerHome.text()).not.toContain('Due and overdue')
  })
})
