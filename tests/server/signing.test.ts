import { spawnSync } from 'node:child_process'
import { generateKeyPairSync, randomBytes, X509Certificate } from 'node:crypto'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { createSecureContext } from 'node:tls'
import { pdflibAddPlaceholder } from '@signpdf/placeholder-pdf-lib'
import fc from 'fast-check'
import forge from 'node-forge'
import { PDFDocument, StandardFonts } from 'pdf-lib'
import { PDFParse } from 'pdf-parse'
import { beforeAll, describe, expect, it } from 'vitest'
import { CertificateError, createDemoCertificate, readCertificate, signPdf, verifyPdfSignature, type SignatureDetails } from '../../server/signing'

const PASSWORD = 'cedar-hollow-7'
const HOLDER = 'Åsa Lindqvist'
const VALID_FROM = new Date('2026-03-01T08:00:00Z')
const DETAILS: SignatureDetails = {
  reason: 'Electrical review (plan set rev. 0) \\ stamped',
  name: HOLDER,
  location: 'Lindqvist — Cedar Hollow',
  contactInfo: 'review@larkspur-valley.example',
  signingTime: new Date('2026-03-14T09:30:00.250Z'),
}

let p12: Buffer
let unsignedPdf: Uint8Array
let signed: Buffer

/** A three-page PDF as pdf-lib saves it by default (object streams, compressed content). */
async function threePagePdf(): Promise<Uint8Array> {
  const document = await PDFDocument.create()
  const font = await document.embedFont(StandardFonts.Helvetica)
  for (let sheet = 1; sheet <= 3; sheet++) document.addPage([612, 792]).drawText(`Larkspur Valley Solar Co. sheet E-60${sheet}`, { x: 72, y: 700, size: 14, font })
  return document.save()
}

/** The four numbers of the one /ByteRange in a file signed by signPdf (ISO 32000-1 12.8.1). */
function byteRangeOf(pdf: Buffer): [number, number, number, number] {
  const match = /\/ByteRange \[(\d+) (\d+) (\d+) (\d+)\]/.exec(pdf.toString('latin1'))
  expect(match).not.toBeNull()
  return match!.slice(1).map(Number) as [number, number, number, number]
}

/** The forge-parsed certificate inside a P12, as an outside reader gets it. */
function certificateInP12(file: Buffer, password: string): forge.pki.Certificate {
  const pfx = forge.pkcs12.pkcs12FromAsn1(forge.asn1.fromDer(file.toString('binary')), password)
  const certificate = pfx.getBags({ bagType: forge.pki.oids.certBag! })[forge.pki.oids.certBag!]?.[0]?.cert
  expect(certificate).toBeDefined()
  return certificate!
}

/** A P12 made directly with forge, without our demo marker; its certificate may belong to another key, or be left out, or the key. */
function forgeP12(options: { subject: string; key: 'matching' | 'other' | 'none'; certificate: boolean }): Buffer {
  // small keys: only the bags matter here
  const pair = () => forge.pki.privateKeyFromPem(generateKeyPairSync('rsa', { modulusLength: 1024 }).privateKey.export({ type: 'pkcs1', format: 'pem' }).toString())
  const key = pair()
  const certificateKey = options.key === 'other' ? pair() : key
  const certificate = forge.pki.createCertificate()
  certificate.publicKey = forge.pki.setRsaPublicKey(certificateKey.n, certificateKey.e)
  certificate.serialNumber = '0a1b2c3d'
  certificate.validity.notBefore = VALID_FROM
  certificate.validity.notAfter = new Date('2027-03-01T08:00:00Z')
  const name = [{ shortName: 'CN', value: options.subject }, { shortName: 'O', value: 'Larkspur Valley Solar Co.' }]
  certificate.setSubject(name)
  certificate.setIssuer(name)
  certificate.sign(certificateKey, forge.md.sha256.create())
  // forge derives the bags' local key id from the first certificate: none without one
  const asn1 = forge.pkcs12.toPkcs12Asn1(options.key === 'none' ? null : key, options.certificate ? [certificate] : [], PASSWORD, {
    algorithm: '3des',
    generateLocalKeyId: options.certificate,
  })
  return Buffer.from(forge.asn1.toDer(asn1).getBytes(), 'binary')
}

function problemOf(action: () => unknown): string {
  try {
    action()
  } catch (error) {
    expect(error).toBeInstanceOf(CertificateError)
    return (error as CertificateError).problem
  }
  throw new Error('expected a CertificateError')
}

const opensslAvailable = spawnSync('openssl', ['version']).status === 0

beforeAll(async () => {
  p12 = createDemoCertificate({ holderName: HOLDER, password: PASSWORD, validFrom: VALID_FROM, validDays: 365 })
  unsignedPdf = await threePagePdf()
  signed = await signPdf(unsignedPdf, p12, PASSWORD, DETAILS)
})

describe('demo certificates', () => {
  it('reads back its holder, validity, demo marker and fingerprint', () => {
    const info = readCertificate(p12, PASSWORD)
    expect(info.commonName).toBe(HOLDER)
    expect(info.notBefore).toEqual(VALID_FROM)
    expect(info.notAfter).toEqual(new Date('2027-03-01T08:00:00Z'))
    expect(info.demo).toBe(true)
    expect(info.fingerprintSha256).toMatch(/^[0-9a-f]{64}$/)
  })

  it('has the fingerprint and subject node:crypto X509Certificate sees, is self-signed, and has key usage for signing (RFC 5280 4.2.1.3)', () => {
    const x509 = new X509Certificate(forge.pki.certificateToPem(certificateInP12(p12, PASSWORD)))
    expect(readCertificate(p12, PASSWORD).fingerprintSha256).toBe(x509.fingerprint256.replaceAll(':', '').toLowerCase())
    expect(x509.subject.split('\n')).toEqual([`CN=${HOLDER}`, 'O=Stringline demo certificate', 'OU=Not for permit use'])
    // self-signed: OpenSSL's checkIssued() would say no, as key usage lacks keyCertSign
    expect(x509.issuer).toBe(x509.subject)
    expect(x509.verify(x509.publicKey)).toBe(true)
    expect(x509.publicKey.asymmetricKeyDetails?.modulusLength).toBe(2048)
    // node:crypto does not list key usage; forge reads the extension
    const keyUsage = certificateInP12(p12, PASSWORD).getExtension('keyUsage') as { digitalSignature?: boolean; nonRepudiation?: boolean; critical?: boolean }
    expect(keyUsage).toMatchObject({ digitalSignature: true, nonRepudiation: true, critical: true })
  })

  it('opens in OpenSSL with its password (PKCS#12, RFC 7292)', () => {
    expect(() => createSecureContext({ pfx: p12, passphrase: PASSWORD })).not.toThrow()
  })

  it('refuses impossible validity', () => {
    expect(() => createDemoCertificate({ holderName: HOLDER, password: PASSWORD, validFrom: VALID_FROM, validDays: 0 })).toThrow(RangeError)
    expect(() => createDemoCertificate({ holderName: ' ', password: PASSWORD, validFrom: VALID_FROM, validDays: 30 })).toThrow(RangeError)
  })
})

describe('reading certificate files', () => {
  it('names the wrong password', () => {
    expect(problemOf(() => readCertificate(p12, 'cedar-hollow-8'))).toBe('wrong_password')
  })

  it('tells files that are not PKCS#12 apart', async () => {
    const png = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000', 'hex')
    expect(problemOf(() => readCertificate(png, PASSWORD))).toBe('not_pkcs12')
    expect(problemOf(() => readCertificate(randomBytes(2048), PASSWORD))).toBe('not_pkcs12')
    expect(problemOf(() => readCertificate(Buffer.alloc(0), PASSWORD))).toBe('not_pkcs12')
    expect(problemOf(() => readCertificate(Buffer.from(unsignedPdf), PASSWORD))).toBe('not_pkcs12')
  })

  it('reads a P12 made elsewhere (3DES) as not a demo certificate, and names what is missing', () => {
    const info = readCertificate(forgeP12({ subject: 'Larkspur Valley Solar Co. signer', key: 'matching', certificate: true }), PASSWORD)
    expect(info).toMatchObject({ commonName: 'Larkspur Valley Solar Co. signer', demo: false })
    expect(problemOf(() => readCertificate(forgeP12({ subject: 'x', key: 'other', certificate: true }), PASSWORD))).toBe('key_mismatch')
    expect(problemOf(() => readCertificate(forgeP12({ subject: 'x', key: 'none', certificate: true }), PASSWORD))).toBe('no_private_key')
    expect(problemOf(() => readCertificate(forgeP12({ subject: 'x', key: 'matching', certificate: false }), PASSWORD))).toBe('no_certificate')
  })
})

describe('signing a PDF', () => {
  it('verifies: signer, fingerprint, signing time and the dictionary texts round-trip', () => {
    const check = verifyPdfSignature(signed)
    const certificate = readCertificate(p12, PASSWORD)
    expect(check.state).toBe('valid')
    expect(check.reason).toBe('The signature is intact and covers the whole file')
    expect(check.signer).toEqual({ commonName: certificate.commonName, fingerprintSha256: certificate.fingerprintSha256 })
    expect(Math.abs(check.signingTime!.getTime() - DETAILS.signingTime.getTime())).toBeLessThan(1000)
    expect(check.dictionary).toEqual({ reason: DETAILS.reason, name: DETAILS.name, location: DETAILS.location, contactInfo: DETAILS.contactInfo })
  })

  it('covers the whole file except the /Contents hex string (ISO 32000-1 12.8.1 ByteRange)', () => {
    const [start, firstLength, secondStart, secondLength] = byteRangeOf(signed)
    expect(start).toBe(0)
    expect(secondStart + secondLength).toBe(signed.length)
    const hole = signed.toString('latin1', firstLength, secondStart)
    expect(hole).toMatch(/^<[0-9a-f]+>$/)
    expect(signed.toString('latin1', firstLength - '/Contents '.length, firstLength)).toBe('/Contents ')
    expect(signed.toString('latin1').match(/\/ByteRange/g)).toHaveLength(1)
    expect(signed.toString('latin1')).toMatch(/\/SubFilter \/adbe\.pkcs7\.detached/)
  })

  it('is a PKCS#7 detached SHA-256 signature OpenSSL verifies (RFC 5652)', ({ skip }) => {
    if (!opensslAvailable) skip()
    // OpenSSL finds the signer by issuer and serial number: with the non-ASCII holder this also
    // shows the issuer name survives P12Signer (see directoryString in certificate.ts)
    const [, firstLength, secondStart, secondLength] = byteRangeOf(signed)
    const folder = mkdtempSync(path.join(tmpdir(), 'stringline-signing-'))
    try {
      const signature = path.join(folder, 'signature.der')
      const content = path.join(folder, 'signed-bytes.bin')
      // the hex string is zero-padded after the DER; OpenSSL reads the first element only
      writeFileSync(signature, Buffer.from(signed.toString('latin1', firstLength + 1, secondStart - 1), 'hex'))
      writeFileSync(content, Buffer.concat([signed.subarray(0, firstLength), signed.subarray(secondStart, secondStart + secondLength)]))
      const verified = spawnSync('openssl', ['cms', '-verify', '-binary', '-inform', 'DER', '-in', signature, '-content', content, '-noverify', '-out', '/dev/null'])
      expect(verified.stderr.toString()).toContain('Verification successful')
      const parsed = spawnSync('openssl', ['cms', '-cmsout', '-print', '-inform', 'DER', '-in', signature]).stdout.toString()
      expect(parsed).toContain('sha256')
      expect(parsed).toMatch(/eContent: <ABSENT>/)
    } finally {
      rmSync(folder, { recursive: true, force: true })
    }
  })

  it('still opens in pdf-lib and pdf-parse with every page and its text', async () => {
    const document = await PDFDocument.load(signed)
    expect(document.getPageCount()).toBe(3)
    const parser = new PDFParse({ data: new Uint8Array(signed) })
    const text = await parser.getText()
    await parser.destroy()
    expect(text.pages.map((page) => page.text.trim())).toEqual([1, 2, 3].map((sheet) => `Larkspur Valley Solar Co. sheet E-60${sheet}`))
  })

  it('rejects a wrong password with a CertificateError before touching the PDF', async () => {
    await expect(signPdf(unsignedPdf, p12, 'not-it', DETAILS)).rejects.toMatchObject({ name: 'CertificateError', problem: 'wrong_password' })
    await expect(signPdf(unsignedPdf, randomBytes(512), PASSWORD, DETAILS)).rejects.toMatchObject({ problem: 'not_pkcs12' })
  })
})

describe('verifying a signed PDF', () => {
  const changed = (at: number) => {
    const copy = Buffer.from(signed)
    copy[at] = copy[at]! ^ 0x01
    return copy
  }

  it('calls a changed page "altered"', () => {
    // the second page's content stream: compressed bytes inside the first signed range
    const streams = [...signed.toString('latin1').matchAll(/stream\n/g)].map((match) => match.index + match[0].length)
    const check = verifyPdfSignature(changed(streams[1]! + 10))
    expect(check).toMatchObject({ state: 'altered', reason: 'The file was changed after it was signed' })
    expect(check.signer?.commonName).toBe(HOLDER)
  })

  it('calls a changed byte at either end or in the middle of the signed ranges "altered"', () => {
    const [, firstLength, secondStart, secondLength] = byteRangeOf(signed)
    // away from the signature dictionary, whose syntax a changed byte may break ("invalid", see the random changes below)
    for (const at of [0, Math.floor(firstLength / 2), secondStart + Math.floor(secondLength / 2), signed.length - 1]) {
      expect(verifyPdfSignature(changed(at)).state, `byte ${at}`).toBe('altered')
    }
  })

  it('reads a changed reason and still calls the file "altered"', () => {
    const at = signed.indexOf('Electrical review')
    const copy = Buffer.from(signed)
    copy.write('Electricol', at, 'latin1')
    expect(verifyPdfSignature(copy)).toMatchObject({ state: 'altered', dictionary: { reason: DETAILS.reason.replace('Electrical', 'Electricol') } })
  })

  it('calls bytes appended after %%EOF (an incremental update) "altered", with their count', () => {
    const tail = Buffer.from('\n12 0 obj\n<< /Type /Annot >>\nendobj\ntrailer\n<< /Size 13 >>\n%%EOF\n', 'latin1')
    const check = verifyPdfSignature(Buffer.concat([signed, tail]))
    expect(check.state).toBe('altered')
    expect(check.reason).toBe(`The file was changed after it was signed: ${tail.length} bytes were added after the signed part`)
    expect(check.signer?.commonName).toBe(HOLDER)
  })

  it('calls a truncated file "altered" or "invalid", never throwing', () => {
    const [, firstLength, secondStart] = byteRangeOf(signed)
    for (const length of [signed.length - 1, signed.length - 200, secondStart, secondStart - 1, Math.floor((firstLength + secondStart) / 2), firstLength + 1, 200]) {
      const check = verifyPdfSignature(signed.subarray(0, length))
      expect(['altered', 'invalid', 'unsigned'], `length ${length}`).toContain(check.state)
      if (length > firstLength) expect(check.state, `length ${length}`).not.toBe('unsigned')
    }
  })

  it('calls a changed signature value "invalid" (RFC 5652 5.4: the signature over the DER SET of signed attributes)', () => {
    const [, firstLength] = byteRangeOf(signed)
    const hex = signed.toString('latin1', firstLength + 1, firstLength + 9)
    expect(hex.slice(0, 4)).toBe('3082') // SEQUENCE with a two-byte length
    const derLength = 4 + parseInt(hex.slice(4, 8), 16)
    // the RSA signature value is the last 256 bytes of the DER; change a hex digit in its middle
    const at = firstLength + 1 + 2 * (derLength - 128)
    const copy = Buffer.from(signed)
    copy[at] = copy[at] === '0'.charCodeAt(0) ? '1'.charCodeAt(0) : '0'.charCodeAt(0)
    const check = verifyPdfSignature(copy)
    expect(check).toMatchObject({ state: 'invalid', reason: 'The signature does not match its certificate' })
    expect(check.signer?.commonName).toBe(HOLDER)
  })

  it('calls data in the zero padding after the signature "invalid"', () => {
    const [, , secondStart] = byteRangeOf(signed)
    const copy = Buffer.from(signed)
    copy.write('1', secondStart - 10, 'latin1')
    expect(verifyPdfSignature(copy).state).toBe('invalid')
  })

  it('calls files without a signature "unsigned", whatever they are', () => {
    for (const bytes of [Buffer.from(unsignedPdf), Buffer.alloc(0), randomBytes(4096), Buffer.from('Larkspur Valley Solar Co.\nCedar Hollow\n', 'utf8')]) {
      expect(verifyPdfSignature(bytes)).toEqual({
        state: 'unsigned',
        reason: 'The file carries no digital signature',
        signer: null,
        signingTime: null,
        dictionary: { reason: null, name: null, location: null, contactInfo: null },
      })
    }
  })

  it('calls a prepared but never signed signature field "unsigned"', async () => {
    const document = await PDFDocument.load(unsignedPdf)
    pdflibAddPlaceholder({ pdfDoc: document, reason: 'Review', name: 'n', location: 'Cedar Hollow', contactInfo: 'c' })
    const check = verifyPdfSignature(Buffer.from(await document.save({ useObjectStreams: false })))
    expect(check).toMatchObject({ state: 'unsigned', signer: null, dictionary: { reason: 'Review', location: 'Cedar Hollow' } })
  })

  it('decodes dictionary strings as written: escapes, octal PDFDocEncoding, hex UTF-16BE (ISO 32000-1 7.3.4, 7.9.2.2), /M as the time', () => {
    const file = Buffer.from(
      [
        '%PDF-1.7',
        '4 0 obj',
        "<< /Type /Sig /Filter /Adobe.PPKLite /Prop_Build << /App << /Name /Stringline >> >> /P 3 0 R",
        '/Reason (Caf\\351 \\(rev. 1\\)\\\\ ok) /Name <FEFF00C5007300610020004C>',
        "/Location <43656461 7220486f6c6c6f77> /ContactInfo (line\\\none) /M (D:20260314093000+01'00')",
        '/ByteRange [0 10 20 30] /Contents <3000> >>',
        'endobj',
        '%%EOF',
      ].join('\n'),
      'latin1',
    )
    expect(verifyPdfSignature(file)).toMatchObject({
      signer: null,
      signingTime: new Date('2026-03-14T08:30:00Z'),
      dictionary: { reason: 'Café (rev. 1)\\ ok', name: 'Åsa L', location: 'Cedar Hollow', contactInfo: 'lineone' },
    })
  })

  it('never throws, and never calls a changed file "valid" (random changes and random files)', () => {
    const [, firstLength, secondStart, secondLength] = byteRangeOf(signed)
    const signedOffset = fc.oneof(fc.integer({ min: 0, max: firstLength - 1 }), fc.integer({ min: secondStart, max: secondStart + secondLength - 1 }))
    fc.assert(
      fc.property(signedOffset, fc.integer({ min: 1, max: 255 }), (at, flip) => {
        const copy = Buffer.from(signed)
        copy[at] = copy[at]! ^ flip
        expect(verifyPdfSignature(copy).state).not.toBe('valid')
      }),
      { numRuns: 150 },
    )
    const withSignatureWords = fc.array(fc.oneof(fc.uint8Array({ maxLength: 40 }), fc.constantFrom('/ByteRange', '[0 1 2 3]', '<<', '>>', '/Contents <30', '(', ')', '>', '\\', '%', '1 0 R')), { maxLength: 30 })
    fc.assert(
      fc.property(withSignatureWords, (parts) => {
        const bytes = Buffer.concat(parts.map((part) => (typeof part === 'string' ? Buffer.from(part, 'latin1') : Buffer.from(part))))
        expect(['unsigned', 'invalid', 'altered']).toContain(verifyPdfSignature(bytes).state)
      }),
      { numRuns: 300 },
    )
  })
})
