import { describe, expect, it } from 'vitest'
import { formatBytes, shortHash } from './format'

describe('file size and hash formats', () => {
  it('writes sizes in binary multiples', () => {
    expect(formatBytes(0)).toBe('0 B')
    expect(formatBytes(1023)).toBe('1023 B')
    expect(formatBytes(1536)).toMatch(/^1[.,]5 KiB$/)
    expect(formatBytes(3 * 1024 * 1024)).toBe('3 MiB')
  })

  it('shortens a SHA-256 to its first 12 digits', () => {
    expect(shortHash('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855')).toBe('e3b0c44298fc')
  })
})
