/**
 * Signing certificates: reading the reviewer's PKCS#12 file and making the demo reviewer's
 * self-signed one. Parsing is node-forge's, because @signpdf/signer-p12 reads the same file with
 * it: whatever passes here is what the signer will find.
 */
import { createHash, generateKeyPairSync, randomBytes } from 'node:crypto'
import forge from 'node-forge'

export interface CertificateInfo {
  /** Subject CN; empty when the subject has none. */
  commonName: string
  notBefore: Date
  notAfter: Date
  /** SHA-256 of the certificate's DER encoding, lower-case hex (64 chars). */
  fingerprintSha256: string
  /** True for a certificate made by createDemoCertificate (our demo marker in the subject). */
  demo: boolean
}

export type CertificateProblem = 'not_pkcs12' | 'wrong_password' | 'no_private_key' | 'no_certificate' | 'key_mismatch'

export class CertificateError extends Error {
  override readonly name = 'CertificateError'
  constructor(
    readonly problem: CertificateProblem,
    message: string,
  ) {
    super(message)
  }
}

/** The demo marker: O and OU of every certificate createDemoCertificate makes. */
const DEMO_ORGANIZATION = 'Stringline demo certificate'
const DEMO_UNIT = 'Not for permit use'

const MS_PER_DAY = 86_400_000

const BAG_TYPE = { shroudedKey: forge.pki.oids.pkcs8ShroudedKeyBag!, certificate: forge.pki.oids.certBag! }

/**
 * What forge says when a password does not open the file: a failed MAC (every common tool writes
 * one), and, for files without a MAC, a key or safe that does not decrypt.
 */
const WRONG_PASSWORD_MESSAGES = ['MAC could not be verified', 'wrong password', 'Failed to decrypt']

/** A certificate's facts as CertificateInfo reports them; also used for the signer of a signed PDF. */
export function describeCertificate(certificate: forge.pki.Certificate): CertificateInfo {
  const der = Buffer.from(forge.asn1.toDer(forge.pki.certificateToAsn1(certificate)).getBytes(), 'binary')
  return {
    commonName: subjectField(certificate, 'CN') ?? '',
    notBefore: certificate.validity.notBefore,
    notAfter: certificate.validity.notAfter,
    fingerprintSha256: createHash('sha256').update(der).digest('hex'),
    demo: subjectField(certificate, 'O') === DEMO_ORGANIZATION && subjectField(certificate, 'OU') === DEMO_UNIT,
  }
}

/**
 * A subject attribute as text. forge hands UTF8String values over as their raw bytes (a binary
 * string) and decodes BMPString itself; the other string types are single-byte.
 */
function subjectField(certificate: forge.pki.Certificate, shortName: string): string | null {
  const field = certificate.subject.getField(shortName) as forge.pki.CertificateField | null
  if (typeof field?.value !== 'string') return null
  return (field.valueTagClass as number) === forge.asn1.Type.UTF8 ? forge.util.decodeUtf8(field.value) : field.value
}

/**
 * The private key and its certificate, chosen as @signpdf/signer-p12 chooses them: the first
 * password-protected (PKCS#8 shrouded) key and the last certificate whose RSA public key matches
 * it. The fingerprint people register is then the one their signatures carry.
 */
export function openPkcs12(p12: Buffer, password: string): { key: forge.pki.rsa.PrivateKey; certificate: forge.pki.Certificate } {
  let pfxAsn1: forge.asn1.Asn1
  try {
    pfxAsn1 = forge.asn1.fromDer(forge.util.createBuffer(p12.toString('binary')))
  } catch {
    throw new CertificateError('not_pkcs12', 'The file is not a certificate file (PKCS#12, .p12 or .pfx).')
  }
  let pfx: forge.pkcs12.Pkcs12Pfx
  try {
    pfx = forge.pkcs12.pkcs12FromAsn1(pfxAsn1, false, password)
  } catch (error) {
    const message = error instanceof Error ? error.message : ''
    if (WRONG_PASSWORD_MESSAGES.some((known) => message.includes(known))) {
      throw new CertificateError('wrong_password', 'The password does not open this certificate file.')
    }
    throw new CertificateError('not_pkcs12', 'The file is not a readable certificate file (PKCS#12, .p12 or .pfx).')
  }

  const keyBags = pfx.getBags({ bagType: BAG_TYPE.shroudedKey })[BAG_TYPE.shroudedKey] ?? []
  const key = keyBags[0]?.key
  if (!key) {
    throw new CertificateError('no_private_key', 'The certificate file holds no password-protected RSA private key to sign with.')
  }
  const certificates = (pfx.getBags({ bagType: BAG_TYPE.certificate })[BAG_TYPE.certificate] ?? [])
    .map((bag) => bag.cert)
    .filter((certificate) => certificate !== undefined && certificate !== null)
  if (certificates.length === 0) {
    throw new CertificateError('no_certificate', 'The certificate file holds a private key but no RSA certificate.')
  }
  const certificate = certificates.reverse().find((candidate) => {
    const publicKey = candidate.publicKey as forge.pki.rsa.PublicKey
    return publicKey.n.compareTo(key.n) === 0 && publicKey.e.compareTo(key.e) === 0
  })
  if (!certificate) {
    throw new CertificateError('key_mismatch', 'None of the certificates in the file belongs to its private key.')
  }
  return { key, certificate }
}

/** Opens a PKCS#12 file with its password: the signing certificate (the one whose public key matches the private key) and its facts. Throws CertificateError with a message fit for people. */
export function readCertificate(p12: Buffer, password: string): CertificateInfo {
  return describeCertificate(openPkcs12(p12, password).certificate)
}

/**
 * A self-signed demo signing certificate and key as PKCS#12 bytes (for the demo reviewer only).
 * Subject CN = holderName, O and OU carry the demo marker; RSA 2048 (generated by node:crypto,
 * which is far faster than forge); validity from `validFrom` (whole seconds, as X.509 stores
 * time) for `validDays` days; keyUsage digitalSignature + nonRepudiation. The key is encrypted with
 * `password` (PBES2, AES-256) and the file carries an HMAC-SHA-1 integrity MAC (forge writes no
 * other); forge and OpenSSL both read it.
 */
export function createDemoCertificate(options: { holderName: string; password: string; validFrom: Date; validDays: number }): Buffer {
  const { holderName, password, validFrom, validDays } = options
  if (holderName.trim() === '') throw new RangeError('A demo certificate needs a holder name.')
  if (!Number.isInteger(validDays) || validDays < 1) throw new RangeError(`validDays must be a whole number of days ≥ 1, got ${validDays}.`)
  if (Number.isNaN(validFrom.getTime())) throw new RangeError('validFrom must be a valid date.')

  const { privateKey: privateKeyPem } = generateKeyPairSync('rsa', {
    modulusLength: 2048,
    publicKeyEncoding: { type: 'spki', format: 'pem' },
    privateKeyEncoding: { type: 'pkcs1', format: 'pem' },
  })
  const privateKey = forge.pki.privateKeyFromPem(privateKeyPem)
  const notBefore = new Date(Math.floor(validFrom.getTime() / 1000) * 1000)

  const certificate = forge.pki.createCertificate()
  certificate.publicKey = forge.pki.setRsaPublicKey(privateKey.n, privateKey.e)
  // 16 random bytes, kept positive and minimally encoded by a first byte of 0x01–0x7f (RFC 5280 4.1.2.2)
  const serial = randomBytes(16)
  serial[0] = 0x01 + (serial[0]! % 0x7f)
  certificate.serialNumber = serial.toString('hex')
  certificate.validity.notBefore = notBefore
  certificate.validity.notAfter = new Date(notBefore.getTime() + validDays * MS_PER_DAY)
  const subject = [
    { shortName: 'CN', ...directoryString(holderName) },
    { shortName: 'O', ...directoryString(DEMO_ORGANIZATION) },
    { shortName: 'OU', ...directoryString(DEMO_UNIT) },
  ]
  certificate.setSubject(subject)
  certificate.setIssuer(subject)
  certificate.setExtensions([
    { name: 'basicConstraints', cA: false, critical: true },
    { name: 'keyUsage', digitalSignature: true, nonRepudiation: true, critical: true },
    { name: 'subjectKeyIdentifier' },
  ])
  certificate.sign(privateKey, forge.md.sha256.create())

  const pfx = forge.pkcs12.toPkcs12Asn1(privateKey, [certificate], password, {
    algorithm: 'aes256',
    friendlyName: holderName,
  })
  return Buffer.from(forge.asn1.toDer(pfx).getBytes(), 'binary')
}

/**
 * A name attribute's value and string type: ASCII as UTF8String, anything else as BMPString.
 * When P12Signer writes the signer's issuer into the PKCS#7, forge UTF-8-encodes UTF8String values
 * a second time, so a non-ASCII issuer (ours: the subject, self-signed) would no longer name the
 * certificate and other readers would not find the signer. BMPString values forge copies exactly.
 */
function directoryString(value: string): { value: string; valueTagClass: forge.asn1.Class } {
  // eslint-disable-next-line no-control-regex -- the ASCII range is the point
  const type = /^[\x00-\x7f]*$/.test(value) ? forge.asn1.Type.UTF8 : forge.asn1.Type.BMPSTRING
  // the typings call valueTagClass a Class; forge reads it as the value's ASN.1 string Type
  return { value, valueTagClass: type as unknown as forge.asn1.Class }
}
