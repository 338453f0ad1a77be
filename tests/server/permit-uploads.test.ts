import { readFileSync } from 'node:fs'
import { deflateSync } from 'node:zlib'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { StoredFileEntity, UserEntity } from '../../server/entities'
import { createDemoCertificate } from '../../server/signing'
import { fieldsOf, samplePdf, startWorkspace, type Workspace } from './support/workspace'

/**
 * Every upload of the permit workflow goes through the one upload service: the stamp image, the
 * signing certificate, correction letters, fee receipts and the public verification upload. Wrong,
 * disguised, oversize and hostile files are refused with the field and the reason, and nothing is stored.
 */
let w: Workspace
beforeAll(async () => {
  w = await startWorkspace()
})
afterAll(() => w.h.close())

const DEMO_STAMP = readFileSync(new URL('../../server/demo/assets/demo-stamp.png', import.meta.url))
const JPEG = Buffer.from('ffd8ffe000104a46494600010100000100010000ffdb004300080606070605080707070909080a0c140d0c0b0b0c1912130f141d1a1f1e1d1a1c1c20242e2720222c231c1c2837292c30313434341f27393d38323c2e333432ffc0000b080001000101011100ffc4001f0000010501010101010100000000000000000102030405060708090a0bffda0008010100003f00d2cf20ffd9', 'hex')

/** A valid PNG of the given size (PNG specification: signature, IHDR, one IDAT, IEND), white RGB. */
function png(width: number, height: number): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1
    return c >>> 0
  })
  const crc = (bytes: Buffer) => {
    let c = 0xffffffff
    for (const b of bytes) c = crcTable[(c ^ b) & 0xff]! ^ (c >>> 8)
    return (c ^ 0xffffffff) >>> 0
  }
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data])
    const out = Buffer.alloc(12 + data.length)
    out.writeUInt32BE(data.length, 0)
    body.copy(out, 4)
    out.writeUInt32BE(crc(body), 8 + data.length)
    return out
  }
  const ihdr = Buffer.alloc(13)
  ihdr.writeUInt32BE(width, 0)
  ihdr.writeUInt32BE(height, 4)
  ihdr.set([8, 2, 0, 0, 0], 8)
  const rows = Buffer.alloc((width * 3 + 1) * height, 0xff)
  for (let y = 0; y < height; y++) rows[y * (width * 3 + 1)] = 0
  return Buffer.concat([Buffer.from('89504e470d0a1a0a', 'hex'), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(rows)), chunk('IEND', Buffer.alloc(0))])
}

const storedCount = () => w.h.db.getRepository(StoredFileEntity).count()
const project = () => `/api/projects/${w.projects['CH-0101']!.id}`
const send = (path: string, role: 'admin' | 'designer' | 'reviewer' | 'coordinator', bytes: Buffer, filename: string, fields: Record<string, string> = {}) => {
  const req = request(w.h.app).post(path).set(w.as(role))
  for (const [k, v] of Object.entries(fields)) req.field(k, v)
  return req.attach('file', bytes, filename)
}

describe('stamp image', () => {
  it('takes a legible PNG and refuses a JPEG named .png, a tiny image and an oversize one, storing nothing then', async () => {
    const before = await storedCount()
    const jpeg = await send('/api/profile/stamp/image', 'reviewer', JPEG, 'stamp.png')
    expect(jpeg.status).toBe(415)
    expect(fieldsOf(jpeg)).toEqual(['file'])
    expect(jpeg.body.error.message).toContain('image/jpeg')
    const tiny = await send('/api/profile/stamp/image', 'reviewer', png(40, 40), 'stamp.png')
    expect(tiny.status).toBe(422)
    expect(tiny.body.error.message).toContain('40 × 40')
    const oversize = await send('/api/profile/stamp/image', 'reviewer', Buffer.concat([png(200, 200), Buffer.alloc(2 * 1024 * 1024)]), 'stamp.png')
    expect(oversize.status).toBe(413)
    const pdfAsPng = await send('/api/profile/stamp/image', 'reviewer', await samplePdf('not an image'), 'stamp.png')
    expect(pdfAsPng.status).toBe(415)
    expect(await storedCount()).toBe(before)

    const ok = await send('/api/profile/stamp/image', 'reviewer', png(300, 300), 'C:\\stamps\\..\\my stamp.png')
    expect(ok.status, JSON.stringify(ok.body)).toBe(200)
    expect(ok.body.stampImage).toMatchObject({ fileName: 'my stamp.png' })
    expect((await send('/api/profile/stamp/image', 'designer', png(300, 300), 'stamp.png')).status).toBe(403)
    // the demo stamp back for the other tests of this file
    expect((await send('/api/profile/stamp/image', 'reviewer', DEMO_STAMP, 'demo-stamp.png')).status).toBe(200)
  })
})

describe('signing certificate', () => {
  it('opens a PKCS#12 with its password and records its facts; a wrong password, a non-certificate or an oversize file is refused', async () => {
    const before = await storedCount()
    const p12 = createDemoCertificate({ holderName: 'Teodor Lindqvist', password: 'correct horse', validFrom: new Date(Date.now() - 3_600_000), validDays: 30 })
    const wrong = await send('/api/profile/stamp/certificate', 'reviewer', p12, 'me.p12', { password: 'battery staple' })
    expect(wrong.status).toBe(422)
    expect(fieldsOf(wrong)).toEqual(['password'])
    const notP12 = await send('/api/profile/stamp/certificate', 'reviewer', await samplePdf('a PDF named .p12'), 'me.p12', { password: 'x' })
    expect(notP12.status).toBe(415)
    const noPassword = await send('/api/profile/stamp/certificate', 'reviewer', p12, 'me.p12')
    expect(noPassword.status).toBe(400)
    expect(fieldsOf(noPassword)).toEqual(['password'])
    const oversize = await send('/api/profile/stamp/certificate', 'reviewer', Buffer.concat([p12, Buffer.alloc(70 * 1024)]), 'me.p12', { password: 'correct horse' })
    expect(oversize.status).toBe(413)
    expect(await storedCount()).toBe(before)

    const reviewer = await w.h.db.getRepository(UserEntity).findOneByOrFail({ id: w.userIds.reviewer })
    const ok = await send('/api/profile/stamp/certificate', 'reviewer', p12, 'me.p12', { password: 'correct horse' })
    expect(ok.status, JSON.stringify(ok.body)).toBe(200)
    expect(ok.body.certificate).toMatchObject({ commonName: 'Teodor Lindqvist', demo: true })
    expect(ok.body.certificate.fingerprintSha256).toMatch(/^[0-9a-f]{64}$/)
    expect(ok.body.certificate.fingerprintSha256).not.toBe(reviewer.certificateFingerprint)
    // the password is used once and never kept
    const row = JSON.stringify(await w.h.db.getRepository(UserEntity).findOneByOrFail({ id: w.userIds.reviewer }))
    expect(row).not.toContain('correct horse')
    expect((await send('/api/profile/stamp/certificate', 'admin', p12, 'me.p12', { password: 'correct horse' })).status).toBe(403)
  })
})

describe('correction letters, fee receipts and the verification upload', () => {
  it('takes a letter only as PDF and a receipt as PDF, PNG or JPEG; never an SVG or HTML page', async () => {
    const before = await storedCount()
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>')
    for (const [path, bytes, name] of [
      [`${project()}/submission/letters`, png(200, 200), 'letter.pdf'],
      [`${project()}/submission/letters`, svg, 'letter.pdf'],
      [`${project()}/submission/receipt`, svg, 'receipt.svg'],
      [`${project()}/submission/receipt`, Buffer.from('<html><body>paid</body></html>'), 'receipt.pdf'],
    ] as const) {
      const res = await send(path, 'coordinator', bytes, name)
      expect(res.status, `${path} ${name}`).toBe(415)
      expect(fieldsOf(res)).toEqual(['file'])
    }
    const broken = await send(`${project()}/submission/letters`, 'coordinator', (await samplePdf('cut short')).subarray(0, 300), 'letter.pdf')
    expect(broken.status).toBe(415)
    expect(broken.body.error.message).toContain('no PDF trailer')
    expect(await storedCount()).toBe(before)

    const receipt = await send(`${project()}/submission/receipt`, 'coordinator', JPEG, '../../receipt 2026.jpg')
    expect(receipt.status).toBe(201)
    expect(receipt.body.file).toMatchObject({ name: 'receipt 2026.jpg', mediaType: 'image/jpeg' })
    expect((await send(`${project()}/submission/letters`, 'designer', await samplePdf('x'), 'letter.pdf')).status).toBe(403)
    expect((await request(w.h.app).post(`${project()}/submission/letters`).set(w.asForeign('coordinator')).attach('file', await samplePdf('x'), 'letter.pdf')).status).toBe(404)
    // a file of the organisation that no submission uses is not served through a project
    expect((await request(w.h.app).get(`${project()}/submission/files/${receipt.body.file.id}`).set(w.as('designer'))).status).toBe(404)
  })

  it('checks any uploaded PDF publicly, and refuses anything else', async () => {
    const png200 = await request(w.h.app).post('/api/verify').attach('file', png(200, 200), 'plan-set.pdf')
    expect(png200.status).toBe(415)
    const none = await request(w.h.app).post('/api/verify').field('nothing', 'here')
    expect(none.status).toBe(400)
    expect(fieldsOf(none)).toEqual(['file'])
  })
})
