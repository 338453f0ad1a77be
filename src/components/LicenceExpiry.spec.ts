import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { mount } from '@vue/test-utils'
import LicenceExpiry from './LicenceExpiry.vue'

const shown = (expiry: string | null) => mount(LicenceExpiry, { props: { expiry } }).text()

describe('licence expiry', () => {
  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['Date'] })
    vi.setSystemTime(new Date(2026, 11, 1, 9, 30)) // 1 December 2026, local time
  })
  afterEach(() => vi.useRealTimers())

  it('marks a licence past its date as expired', () => {
    expect(shown('2026-11-30')).toContain('Expired')
  })

  it('counts down the last 60 days', () => {
    expect(shown('2026-12-01')).toContain('Expires today')
    expect(shown('2026-12-02')).toContain('Expires in 1 day')
    expect(shown('2027-01-30')).toContain('Expires in 60 days')
  })

  it('shows only the date further out, and a dash when there is none', () => {
    const later = shown('2027-01-31')
    expect(later).not.toContain('Expire')
    expect(later).toContain('2027')
    expect(shown(null)).toBe('—')
  })
})
