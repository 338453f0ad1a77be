import { createHash } from 'node:crypto'
import { mkdtempSync, readdirSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { StoredFileMissing } from '../../server/storage'
import { LocalDiskStorage } from '../../server/storage/local-disk-storage'
import { fieldsOf, samplePdf, startWorkspace, type Workspace } from './support/workspace'

const LIMIT = 64 * 1024
let w: Workspace
let itemId: string
let foreignItemId: string

beforeAll(async () => {
  w = await startWorkspace({ UPLOAD_MAX_BYTES: String(LIMIT) })
  const list = await request(w.h.app).get('/api/equipment?kind=battery&sort=model').set(w.as('designer'))
  itemId = list.body.items[0].id
  const foreign = await request(w.h.app)
    .post('/api/equipment')
    .set(w.asForeign('designer'))
    .send({ kind: 'optimizer', manufacturer: 'Generic', model: 'foreign optimiser', spec: { maxOutputVoltageV: 60, maxOutputCurrentA: 15, maxInputVoltageV: 80 } })
  foreignItemId = foreign.body.item.id
})
afterAll(() => w.h.close())

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex')
const upload = (id: string, role: { Authorization: string }, bytes: Buffer, filename: string, version: number, contentType = 'application/pdf') =>
  request(w.h.app).post(`/api/equipment/${id}/datasheet`).set(role).field('version', String(version)).attach('file', bytes, { filename, contentType })
const storedFiles = () => readdirSync(path.join(w.h.config.dataDir, 'files'), { recursive: true, withFileTypes: true }).filter((e) => e.isFile())
/** Files the demo seed stored (the reviewer's stamp image and certificate), before this test's uploads. */
let seeded: string[]
beforeAll(() => {
  seeded = storedFiles().map((f) => f.name)
})
const uploadedFiles = () => storedFiles().filter((f) => !seeded.includes(f.name))

describe('datasheet uploads', () => {
  it('stores a PDF by its SHA-256, keeps the original name as display text, and serves it back', async () => {
    const pdf = await samplePdf('Generic 15 kWh battery: datasheet (invented)')
    const res = await upload(itemId, w.as('designer'), pdf, '../../etc/Battery "spec".pdf', 1)
    expect(res.status).toBe(200)
    expect(res.body.item.version).toBe(2)
    expect(res.body.item.datasheet).toMatchObject({ fileName: 'Battery spec.pdf', byteSize: pdf.length, sha256: sha256(pdf) })
    expect(uploadedFiles().map((f) => f.name)).toEqual([sha256(pdf)])

    const download = await request(w.h.app).get(`/api/equipment/${itemId}/datasheet`).set(w.as('reviewer')).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => done(null, Buffer.concat(chunks)))
    })
    expect(download.status).toBe(200)
    expect(download.headers['content-type']).toBe('application/pdf')
    expect(download.headers['content-disposition']).toBe('attachment; filename="Battery spec.pdf"')
    expect(sha256(download.body as Buffer)).toBe(sha256(pdf))
  })

  it('the same content uploaded again is stored once', async () => {
    const pdf = await samplePdf('Generic 15 kWh battery: datasheet (invented)')
    const res = await upload(itemId, w.as('admin'), pdf, 'copy.pdf', 2)
    expect(res.status).toBe(200)
    expect(uploadedFiles()).toHaveLength(1)
  })

  it('refuses a file that is not a PDF by content, whatever its name and declared type (415)', async () => {
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8ffff3f0005fe02fea7d605e30000000049454e44ae426082', 'hex')
    const disguised = await upload(itemId, w.as('designer'), png, 'datasheet.pdf', 3)
    expect(disguised.status).toBe(415)
    expect(disguised.body.error.message).toMatch(/image\/png/)
    expect(fieldsOf(disguised)).toEqual(['file'])
    const text = await upload(itemId, w.as('designer'), Buffer.from('%PDF is what I say I am, honestly'), 'datasheet.pdf', 3)
    expect(text.status).toBe(415)
    expect((await request(w.h.app).get(`/api/equipment/${itemId}`).set(w.as('designer'))).body.item.version).toBe(3)
  })

  it('refuses a file over the limit (413) before looking at it', async () => {
    const big = Buffer.concat([await samplePdf('big'), Buffer.alloc(LIMIT)])
    const res = await upload(itemId, w.as('designer'), big, 'big.pdf', 3)
    expect(res.status).toBe(413)
    expect(res.body.error.code).toBe('payload_too_large')
    expect(fieldsOf(res)).toEqual(['file'])
  })

  it('answers 400 for a missing file or version, 409 for a stale version, 415 for JSON', async () => {
    const pdf = await samplePdf('another')
    const noFile = await request(w.h.app).post(`/api/equipment/${itemId}/datasheet`).set(w.as('designer')).field('version', '3')
    expect(noFile.status).toBe(400)
    expect(fieldsOf(noFile)).toEqual(['file'])
    const noVersion = await request(w.h.app).post(`/api/equipment/${itemId}/datasheet`).set(w.as('designer')).attach('file', pdf, 'a.pdf')
    expect(fieldsOf(noVersion)).toEqual(['version'])
    const stale = await upload(itemId, w.as('designer'), pdf, 'a.pdf', 1)
    expect(stale.status).toBe(409)
    expect(stale.body.currentVersion).toBe(3)
    expect((await request(w.h.app).post(`/api/equipment/${itemId}/datasheet`).set(w.as('designer')).send({ version: 3 })).status).toBe(415)
    const twoFiles = await request(w.h.app).post(`/api/equipment/${itemId}/datasheet`).set(w.as('designer')).field('version', '3').attach('other', pdf, 'a.pdf')
    expect(twoFiles.status).toBe(400)
  })

  it('checks role and organisation on upload and download', async () => {
    const pdf = await samplePdf('role check')
    expect((await upload(itemId, w.as('reviewer'), pdf, 'a.pdf', 3)).status).toBe(403)
    expect((await upload(itemId, w.as('coordinator'), pdf, 'a.pdf', 3)).status).toBe(403)
    expect((await upload(itemId, w.asForeign('designer'), pdf, 'a.pdf', 3)).status).toBe(404)
    expect((await request(w.h.app).get(`/api/equipment/${itemId}/datasheet`).set(w.asForeign('admin'))).status).toBe(404)
    expect((await upload(foreignItemId, w.as('designer'), pdf, 'a.pdf', 1)).status).toBe(404)
    expect((await request(w.h.app).get(`/api/equipment/${foreignItemId}/datasheet`).set(w.asForeign('admin'))).status).toBe(404)
  })
})

describe('local disk storage', () => {
  it('names files by SHA-256 and answers only to a SHA-256, so no key reaches outside its folder', async () => {
    const storage = new LocalDiskStorage(mkdtempSync(path.join(os.tmpdir(), 'stringline-files-')))
    const bytes = Buffer.from('invented datasheet bytes')
    const key = await storage.put(bytes)
    expect(key).toBe(sha256(bytes))
    expect((await storage.get(key)).equals(bytes)).toBe(true)
    await expect(storage.get('../../etc/passwd')).rejects.toBeInstanceOf(StoredFileMissing)
    await expect(storage.get(sha256(Buffer.from('never stored')))).rejects.toBeInstanceOf(StoredFileMissing)
  })
})
