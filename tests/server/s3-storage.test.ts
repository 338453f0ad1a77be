import { createHash } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import { createRequire } from 'node:module'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { createFileStorage, readS3Settings, S3SettingsError, StoredFileMissing } from '../../server/storage'
import { LocalDiskStorage } from '../../server/storage/local-disk-storage'
import { S3Storage } from '../../server/storage/s3-storage'

/** The part of s3rver (a local S3 fake, no types shipped) the test uses. */
type S3rverClass = new (options: Record<string, unknown>) => { run(): Promise<AddressInfo>; close(): Promise<void> }
const S3rver = createRequire(import.meta.url)('s3rver') as S3rverClass

const BUCKET = 'stringline-test'
const directory = mkdtempSync(path.join(os.tmpdir(), 'stringline-s3-'))
let server: InstanceType<S3rverClass>
let storage: S3Storage
let env: Record<string, string>

beforeAll(async () => {
  // port 0: the system picks a free one; s3rver checks signatures against its fixed key pair
  server = new S3rver({ address: '127.0.0.1', port: 0, directory, silent: true, configureBuckets: [{ name: BUCKET }] })
  const { port } = await server.run()
  env = {
    S3_ENDPOINT: `http://127.0.0.1:${port}`, S3_REGION: 'us-east-1', S3_BUCKET: BUCKET,
    S3_ACCESS_KEY_ID: 'S3RVER', S3_SECRET_ACCESS_KEY: 'S3RVER', S3_FORCE_PATH_STYLE: 'true',
  }
  storage = new S3Storage(readS3Settings(env)!)
})

afterAll(async () => {
  storage.destroy()
  await server.close()
  rmSync(directory, { recursive: true, force: true })
})

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex')

describe('S3 storage against a local fake', () => {
  it('stores and returns the bytes under their SHA-256', async () => {
    const bytes = Buffer.from('%PDF-1.7 datasheet of a generic inverter\n\u0000\u00ff binary tail')
    const key = await storage.put(bytes)
    expect(key).toBe(sha(bytes))
    expect(Buffer.compare(await storage.get(key), bytes)).toBe(0)
  })

  it('stores the same content once: the second put only asks HEAD', async () => {
    const bytes = Buffer.alloc(64 * 1024, 7)
    const first = await storage.put(bytes)
    const client = (storage as unknown as { client: { send: (command: object) => Promise<unknown> } }).client
    const send = vi.spyOn(client, 'send')
    expect(await storage.put(bytes)).toBe(first)
    expect(send.mock.calls.map(([command]) => command.constructor.name)).toEqual(['HeadObjectCommand'])
    send.mockRestore()
    expect(Buffer.compare(await storage.get(first), bytes)).toBe(0)
  })

  it('answers StoredFileMissing for an absent object', async () => {
    await expect(storage.get('0'.repeat(64))).rejects.toBeInstanceOf(StoredFileMissing)
  })

  it('refuses keys outside the SHA-256 pattern before asking the store', async () => {
    for (const bad of ['../../etc/passwd', `${'a'.repeat(63)}/`, 'A'.repeat(64), '', `files/${'a'.repeat(64)}`]) {
      await expect(storage.get(bad)).rejects.toThrow(/not a SHA-256/)
    }
  })
})

describe('S3 settings', () => {
  it('none set: local disk', () => {
    expect(readS3Settings({})).toBeNull()
    expect(createFileStorage({ dataDir: directory, s3: readS3Settings({}) })).toBeInstanceOf(LocalDiskStorage)
  })

  it('all set: the object store', () => {
    const settings = readS3Settings(env)!
    expect(settings).toMatchObject({ bucket: BUCKET, forcePathStyle: true, region: 'us-east-1' })
    const chosen = createFileStorage({ dataDir: directory, s3: settings })
    expect(chosen).toBeInstanceOf(S3Storage)
    ;(chosen as S3Storage).destroy()
  })

  it('a partial set names the missing variables', () => {
    const partial = { ...env, S3_BUCKET: '', S3_SECRET_ACCESS_KEY: ' ' }
    expect(() => readS3Settings(partial)).toThrow(S3SettingsError)
    expect(() => readS3Settings(partial)).toThrow(/^S3_BUCKET, S3_SECRET_ACCESS_KEY must be set/)
  })

  it('a bad endpoint or path-style flag is named', () => {
    expect(() => readS3Settings({ ...env, S3_ENDPOINT: 'not a url' })).toThrow(/S3_ENDPOINT must be a URL/)
    expect(() => readS3Settings({ ...env, S3_ENDPOINT: 'ftp://127.0.0.1' })).toThrow(/S3_ENDPOINT must be an http/)
    expect(() => readS3Settings({ ...env, S3_FORCE_PATH_STYLE: 'yes' })).toThrow(/S3_FORCE_PATH_STYLE must be true or false/)
  })
})
