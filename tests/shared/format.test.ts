import { describe, expect, it } from 'vitest'
import { fmt } from '../../shared/electrical/format'

describe('fmt', () => {
  it('rounds to the given decimals and drops trailing zeros', () => {
    expect(fmt(12.3456)).toBe('12.35')
    expect(fmt(12.3456, 3)).toBe('12.346')
    expect(fmt(40.040000000000006)).toBe('40.04')
    expect(fmt(3)).toBe('3')
    expect(fmt(2.5, 0)).toBe('3')
  })
  it('prints no negative zero and keeps non-finite values visible', () => {
    expect(fmt(-0.001)).toBe('0')
    expect(fmt(-1.234)).toBe('-1.23')
    expect(fmt(Number.NaN)).toBe('NaN')
  })
})
