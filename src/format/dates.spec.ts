import { describe, expect, it } from 'vitest'
import { daysBetween, formatDate, todayIso } from './dates'

describe('dates', () => {
  it('reads a calendar date as that day wherever the reader is, not as UTC midnight', () => {
    const expected = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' }).format(new Date(2027, 0, 15))
    expect(formatDate('2027-01-15')).toBe(expected)
  })

  it('counts calendar days across a month end and a leap day', () => {
    expect(daysBetween('2026-12-01', '2027-01-30')).toBe(60)
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2)
    expect(daysBetween('2026-12-02', '2026-12-01')).toBe(-1)
  })

  it('gives today in the local calendar', () => {
    expect(todayIso(new Date(2026, 0, 5, 23, 59))).toBe('2026-01-05')
  })

  it('leaves text that is not a date as it is, and shows a dash for none', () => {
    expect(formatDate('soon')).toBe('soon')
    expect(formatDate(null)).toBe('—')
  })
})
