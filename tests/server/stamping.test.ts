import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { seedDemo } from '../../server/demo/seed'
import { UserEntity } from '../../server/entities'
import { normalizeVerificationId } from '../../shared/schemas/stamp'
import { startHarness, type Harness } from './support/harness'

let h: Harness
beforeAll(async () => {
  h = await startHarness()
  await seedDemo(h.db, h.config.bcryptCost)
}, 60_000)
afterAll(() => h.close())

describe('stamp storage (migration 1764979200000)', () => {
  it('creates revision_stamps with its immutability trigger', async () => {
    const [table] = await h.db.query(`SELECT to_regclass('revision_stamps') AS t`)
    expect(table.t).toBe('revision_stamps')
    const triggers = await h.db.query(`SELECT tgname FROM pg_trigger WHERE tgrelid = 'revision_stamps'::regclass AND NOT tgisinternal`)
    expect(triggers.map((t: { tgname: string }) => t.tgname)).toEqual(['revision_stamps_immutable'])
  })

  it('refuses a certificate recorded without its fingerprint, name, expiry and demo flag', async () => {
    const reviewer = await h.db.getRepository(UserEntity).findOneByOrFail({ role: 'reviewer' })
    await expect(h.db.query(`UPDATE users SET certificate_common_name = 'x' WHERE id = $1`, [reviewer.id])).rejects.toThrow(/users_certificate_complete/)
  })
})

describe('verification ids as people type them', () => {
  it('reads case, spaces, dashes and the look-alike letters the Crockford way', () => {
    expect(normalizeVerificationId('7k2m 9qxr-4t1h')).toBe('7K2M-9QXR-4T1H')
    expect(normalizeVerificationId('7K2M9QXR4TIH')).toBe('7K2M-9QXR-4T1H')
    expect(normalizeVerificationId('OOOO-LLLL-0000')).toBe('0000-1111-0000')
  })
  it('refuses wrong lengths and the letter U', () => {
    expect(normalizeVerificationId('7K2M-9QXR')).toBeNull()
    expect(normalizeVerificationId('UUUU-UUUU-UUUU')).toBeNull()
  })
})
