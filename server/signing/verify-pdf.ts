/**
 * Checking the last signature of a PDF the way signPdf makes them (adbe.pkcs7.detached, ISO
 * 32000-1 12.8): the signed byte range must cover the whole file except the signature value, the
 * digest of those bytes must be the one the signer signed, and the signature must verify with
 * the certificate inside it. Whether that certificate is to be trusted is the caller's business
 * (they match its fingerprint against their own records).
 *
 * PKCS#7 structures are read with node-forge (its own verify() is not implemented); digests and
 * the RSA check are node:crypto's, which is fast on large files and checks the whole
 * RSASSA-PKCS1-v1_5 DigestInfo, algorithm included.
 */
import { createHash, createPublicKey, verify as verifySignature, type KeyObject } from 'node:crypto'
import forge from 'node-forge'
import { parseDate, PDFHexString, PDFString } from 'pdf-lib'
import { describeCertificate } from './certificate'

export type SignatureState = 'unsigned' | 'valid' | 'altered' | 'invalid'

export interface SignatureCheck {
  state: SignatureState
  /** One sentence for people, e.g. "The file was changed after it was signed". */
  reason: string
  /** Present when a signature could be read (even if altered/invalid). */
  signer: { commonName: string; fingerprintSha256: string } | null
  /** From the PKCS#7 signingTime attribute, else the dictionary's /M. */
  signingTime: Date | null
  /** The signature dictionary's text entries as written (literal or hex strings, PDFDocEncoding or UTF-16BE). */
  dictionary: { reason: string | null; name: string | null; location: string | null; contactInfo: string | null }
}

/** Never throws for any input bytes (garbage, truncated, non-PDF, huge): always answers a SignatureCheck. */
export function verifyPdfSignature(pdf: Buffer): SignatureCheck {
  const unread: SignatureFacts = { signer: null, signingTime: null, dictionary: NO_DICTIONARY_TEXTS }
  const byteRangeAt = pdf.lastIndexOf('/ByteRange')
  if (byteRangeAt < 0) return answer('unsigned', 'The file carries no digital signature', unread)
  const dictionary = findSignatureDictionary(pdf, byteRangeAt)
  if (!dictionary) return answer('invalid', 'The signature dictionary could not be read', unread)

  const dictionaryTexts = {
    reason: textOf(dictionary.get('Reason')),
    name: textOf(dictionary.get('Name')),
    location: textOf(dictionary.get('Location')),
    contactInfo: textOf(dictionary.get('ContactInfo')),
  }
  const dictionaryTime = dateOf(dictionary.get('M'))
  const byteRange = dictionary.get('ByteRange')
  const contents = dictionary.get('Contents')
  if (isUnfilledByteRange(byteRange)) {
    return answer('unsigned', 'The file has a signature field that was never signed', { ...unread, dictionary: dictionaryTexts, signingTime: dictionaryTime })
  }
  if (contents?.kind !== 'hex-string') {
    return answer('invalid', 'The signature dictionary holds no signature value', { ...unread, dictionary: dictionaryTexts, signingTime: dictionaryTime })
  }

  const signature = readSignedData(contents.hex)
  const facts: SignatureFacts = {
    signer: signature.readable ? signerOf(signature.certificate) : null,
    signingTime: (signature.readable ? signature.signingTime : null) ?? dictionaryTime,
    dictionary: dictionaryTexts,
  }

  const ranges = numbersOf(byteRange)
  if (ranges?.length !== 4) return answer('invalid', 'The signature’s byte range is malformed', facts)
  const [start, firstLength, secondStart, secondLength] = ranges as [number, number, number, number]
  if (start !== 0 || firstLength >= secondStart) return answer('invalid', 'The signature’s byte range is malformed', facts)
  const signedEnd = secondStart + secondLength
  if (signedEnd > pdf.length) return answer('altered', 'The file was changed after it was signed: it was cut short', facts)
  if (contents.start !== firstLength || contents.end !== secondStart) {
    return answer('altered', 'The file was changed after it was signed: the signed parts no longer surround the signature', facts)
  }
  if (signedEnd < pdf.length) {
    const added = pdf.length - signedEnd
    return answer('altered', `The file was changed after it was signed: ${added} ${added === 1 ? 'byte was' : 'bytes were'} added after the signed part`, facts)
  }

  if (!signature.readable) return answer('invalid', signature.reason, facts)
  const digest = createHash(signature.digestAlgorithm)
    .update(pdf.subarray(0, firstLength))
    .update(pdf.subarray(secondStart, signedEnd))
    .digest()
  if (!digest.equals(signature.messageDigest)) return answer('altered', 'The file was changed after it was signed', facts)
  if (!verifySignature(signature.digestAlgorithm, signature.signedAttributes, signature.publicKey, signature.signatureValue)) {
    return answer('invalid', 'The signature does not match its certificate', facts)
  }
  return answer('valid', 'The signature is intact and covers the whole file', facts)
}

type SignatureFacts = Omit<SignatureCheck, 'state' | 'reason'>

const NO_DICTIONARY_TEXTS: SignatureCheck['dictionary'] = { reason: null, name: null, location: null, contactInfo: null }

function answer(state: SignatureState, reason: string, facts: SignatureFacts): SignatureCheck {
  return { state, reason, ...facts }
}

function signerOf(certificate: forge.pki.Certificate): SignatureCheck['signer'] {
  const { commonName, fingerprintSha256 } = describeCertificate(certificate)
  return { commonName, fingerprintSha256 }
}

// ---------------------------------------------------------------------------------------------
// The signature dictionary, read straight from the file bytes (ISO 32000-1 7.2–7.3)

/** A PDF object, as much of it as a signature dictionary needs. Offsets are byte positions in the file. */
type PdfObject =
  | { kind: 'dictionary'; entries: PdfDictionary }
  | { kind: 'array'; items: PdfObject[] }
  /** Bytes between the parentheses, escapes as written, one character per byte. */
  | { kind: 'literal-string'; body: string }
  /** `start` at the `<`, `end` just after the `>`. */
  | { kind: 'hex-string'; hex: string; start: number; end: number }
  | { kind: 'name'; name: string }
  | { kind: 'number'; value: number }
  | { kind: 'reference' }
  /** true, false, null and anything else spelled with regular characters. */
  | { kind: 'keyword'; word: string }

/** Entries by key (without the slash), each with the file offset of its key. */
type PdfDictionary = Map<string, { keyAt: number; value: PdfObject }>

class PdfSyntaxError extends Error {}

/** How far back from /ByteRange to look for the `<<` that opens its dictionary (nested dictionaries before it count). */
const DICTIONARY_CANDIDATES = 32
/** Bytes a signature dictionary may span, /Contents included; bounds the work on crafted files. */
const MAX_DICTIONARY_BYTES = 1 << 20
/** Nesting of arrays and dictionaries deeper than any signature dictionary needs: guards the stack against crafted files. */
const MAX_NESTING = 64

const WHITESPACE = new Set([0x00, 0x09, 0x0a, 0x0c, 0x0d, 0x20])
const DELIMITERS = new Set([...'()<>[]{}/%'].map((char) => char.charCodeAt(0)))
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)$/

/** The dictionary whose own /ByteRange key sits at `byteRangeAt`: the innermost `<<` before it that reads as one. */
function findSignatureDictionary(pdf: Buffer, byteRangeAt: number): { get(key: string): PdfObject | undefined } | null {
  let candidate = byteRangeAt
  for (let tries = 0; tries < DICTIONARY_CANDIDATES && candidate > 0; tries++) {
    candidate = pdf.lastIndexOf('<<', candidate - 1)
    if (candidate < 0) return null
    const entries = readDictionaryAt(pdf, candidate)
    if (entries?.get('ByteRange')?.keyAt === byteRangeAt) return { get: (key) => entries.get(key)?.value }
  }
  return null
}

function readDictionaryAt(pdf: Buffer, at: number): PdfDictionary | null {
  try {
    // a view from the file's start keeps offsets as they are
    const object = new PdfObjectReader(pdf.subarray(0, at + MAX_DICTIONARY_BYTES), at).read()
    return object.kind === 'dictionary' ? object.entries : null
  } catch (error) {
    if (error instanceof PdfSyntaxError) return null
    throw error
  }
}

/** Reads one PDF object from a byte position; throws PdfSyntaxError where the bytes are not PDF syntax. */
class PdfObjectReader {
  private nesting = 0

  constructor(
    private readonly bytes: Buffer,
    private position: number,
  ) {}

  read(): PdfObject {
    this.skipWhitespaceAndComments()
    const byte = this.peek()
    if (byte === '<'.charCodeAt(0)) return this.peek(1) === byte ? this.readDictionary() : this.readHexString()
    if (byte === '('.charCodeAt(0)) return this.readLiteralString()
    if (byte === '['.charCodeAt(0)) return this.readArray()
    if (byte === '/'.charCodeAt(0)) return { kind: 'name', name: this.readName() }
    const word = this.readRegularCharacters()
    if (word === '') throw new PdfSyntaxError(`unexpected byte at ${this.position}`)
    return NUMBER.test(word) ? { kind: 'number', value: Number(word) } : { kind: 'keyword', word }
  }

  private readDictionary(): PdfObject {
    this.enter(2)
    const entries: PdfDictionary = new Map()
    for (;;) {
      this.skipWhitespaceAndComments()
      if (this.peek() === '>'.charCodeAt(0) && this.peek(1) === '>'.charCodeAt(0)) {
        this.leave(2)
        return { kind: 'dictionary', entries }
      }
      const keyAt = this.position
      if (this.peek() !== '/'.charCodeAt(0)) throw new PdfSyntaxError(`dictionary key expected at ${keyAt}`)
      const key = this.readName()
      entries.set(key, { keyAt, value: this.readValueOrReference() })
    }
  }

  private readArray(): PdfObject {
    this.enter(1)
    const items: PdfObject[] = []
    for (;;) {
      this.skipWhitespaceAndComments()
      if (this.peek() === ']'.charCodeAt(0)) {
        this.leave(1)
        return { kind: 'array', items }
      }
      items.push(this.readValueOrReference())
    }
  }

  /** An object, or an indirect reference `12 0 R` taken as one value (7.3.10). */
  private readValueOrReference(): PdfObject {
    const value = this.read()
    if (value.kind !== 'number') return value
    const afterNumber = this.position
    try {
      if (this.read().kind === 'number' && this.readKeyword() === 'R') return { kind: 'reference' }
    } catch (error) {
      if (!(error instanceof PdfSyntaxError)) throw error
    }
    this.position = afterNumber
    return value
  }

  private readKeyword(): string {
    this.skipWhitespaceAndComments()
    return this.readRegularCharacters()
  }

  /** Escapes are kept as written; parentheses nest unless escaped (7.3.4.2). */
  private readLiteralString(): PdfObject {
    const start = ++this.position
    let depth = 1
    while (this.position < this.bytes.length) {
      const byte = this.bytes[this.position++]
      if (byte === '\\'.charCodeAt(0)) this.position++
      else if (byte === '('.charCodeAt(0)) depth++
      else if (byte === ')'.charCodeAt(0) && --depth === 0) {
        return { kind: 'literal-string', body: this.bytes.toString('latin1', start, this.position - 1) }
      }
    }
    throw new PdfSyntaxError('unterminated literal string')
  }

  /** Hex digits with optional whitespace between them (7.3.4.3). */
  private readHexString(): PdfObject {
    const start = this.position++
    const digits: string[] = []
    while (this.position < this.bytes.length) {
      const byte = this.bytes[this.position++]!
      if (byte === '>'.charCodeAt(0)) return { kind: 'hex-string', hex: digits.join(''), start, end: this.position }
      if (WHITESPACE.has(byte)) continue
      const digit = String.fromCharCode(byte)
      if (!/[0-9a-fA-F]/.test(digit)) throw new PdfSyntaxError(`hex digit expected at ${this.position - 1}`)
      digits.push(digit)
    }
    throw new PdfSyntaxError('unterminated hex string')
  }

  /** A name after its slash, with #xx escapes decoded (7.3.5). */
  private readName(): string {
    this.position++
    return this.readRegularCharacters().replace(/#([0-9a-fA-F]{2})/g, (_, hex: string) => String.fromCharCode(parseInt(hex, 16)))
  }

  private readRegularCharacters(): string {
    const start = this.position
    while (this.position < this.bytes.length && !WHITESPACE.has(this.bytes[this.position]!) && !DELIMITERS.has(this.bytes[this.position]!)) {
      this.position++
    }
    return this.bytes.toString('latin1', start, this.position)
  }

  private skipWhitespaceAndComments(): void {
    while (this.position < this.bytes.length) {
      const byte = this.bytes[this.position]!
      if (byte === '%'.charCodeAt(0)) {
        while (this.position < this.bytes.length && this.bytes[this.position] !== 0x0a && this.bytes[this.position] !== 0x0d) this.position++
      } else if (WHITESPACE.has(byte)) {
        this.position++
      } else {
        return
      }
    }
  }

  private peek(ahead = 0): number {
    const byte = this.bytes[this.position + ahead]
    if (byte === undefined) throw new PdfSyntaxError('unexpected end of file')
    return byte
  }

  private enter(openerLength: number): void {
    if (++this.nesting > MAX_NESTING) throw new PdfSyntaxError('objects nested too deeply')
    this.position += openerLength
  }

  private leave(closerLength: number): void {
    this.nesting--
    this.position += closerLength
  }
}

/** A prepared but never signed field still holds the placeholder names instead of offsets. */
function isUnfilledByteRange(value: PdfObject | undefined): boolean {
  return value?.kind === 'array' && value.items.length > 1 && value.items.slice(1).every((item) => item.kind === 'name')
}

/** The array's items when all are non-negative whole numbers, else null. */
function numbersOf(value: PdfObject | undefined): number[] | null {
  if (value?.kind !== 'array') return null
  const numbers = value.items.map((item) => (item.kind === 'number' && Number.isSafeInteger(item.value) && item.value >= 0 ? item.value : null))
  return numbers.every((number) => number !== null) ? numbers : null
}

/** A text string (7.9.2.2): PDFDocEncoding, or UTF-16BE after its byte order mark. */
function textOf(value: PdfObject | undefined): string | null {
  if (value?.kind === 'literal-string') return PDFString.of(value.body).decodeText()
  if (value?.kind === 'hex-string') return PDFHexString.of(value.hex).decodeText()
  return null
}

/** A date string such as `D:20250314093000Z` (7.9.4). */
function dateOf(value: PdfObject | undefined): Date | null {
  const text = textOf(value)
  const date = text === null ? undefined : parseDate(text)
  return date && !Number.isNaN(date.getTime()) ? date : null
}

// ---------------------------------------------------------------------------------------------
// The PKCS#7 SignedData in /Contents (RFC 2315 9; RFC 5652 5)

type SignedDataReading =
  | {
      readable: true
      /** The signer's certificate and its public key. */
      certificate: forge.pki.Certificate
      publicKey: KeyObject
      /** node:crypto's name for the signer's digest algorithm. */
      digestAlgorithm: string
      messageDigest: Buffer
      signingTime: Date | null
      /** The DER the signature covers: the signed attributes re-tagged as a SET (RFC 5652 5.4). */
      signedAttributes: Buffer
      signatureValue: Buffer
    }
  | { readable: false; reason: string }

class UnreadableSignature extends Error {}

const UNREADABLE = 'The signature value could not be read as a PKCS#7 signature'

const DIGEST_ALGORITHMS: Record<string, string> = {
  [forge.pki.oids.sha1!]: 'sha1',
  [forge.pki.oids.sha256!]: 'sha256',
  [forge.pki.oids.sha384!]: 'sha384',
  [forge.pki.oids.sha512!]: 'sha512',
}

/** rsaEncryption and the sha*WithRSAEncryption family: RSASSA-PKCS1-v1_5 with the signer's digest algorithm. */
const RSA_SIGNATURE_ALGORITHMS = new Set(
  ['rsaEncryption', 'sha1WithRSAEncryption', 'sha256WithRSAEncryption', 'sha384WithRSAEncryption', 'sha512WithRSAEncryption'].map((name) => forge.pki.oids[name]),
)

const OID = {
  signedData: forge.pki.oids.signedData!,
  messageDigest: forge.pki.oids.messageDigest!,
  signingTime: forge.pki.oids.signingTime!,
}

function readSignedData(hex: string): SignedDataReading {
  try {
    return { readable: true, ...parseSignedData(Buffer.from(hex, 'hex')) }
  } catch (error) {
    // forge reports malformed input with plain Errors; ours say what was missing
    return { readable: false, reason: error instanceof UnreadableSignature ? error.message : UNREADABLE }
  }
}

function parseSignedData(contents: Buffer): Omit<Extract<SignedDataReading, { readable: true }>, 'readable'> {
  const length = derElementLength(contents)
  if (length === null) throw new UnreadableSignature(UNREADABLE)
  // the placeholder is padded with zero bytes after the DER (12.8.1)
  if (contents.subarray(length).some((byte) => byte !== 0)) throw new UnreadableSignature('The signature value carries unexpected data after the signature')

  const contentInfo = forge.asn1.fromDer(forge.util.createBuffer(contents.toString('binary', 0, length)))
  if (oidOf(child(contentInfo, 0)) !== OID.signedData) throw new UnreadableSignature('The signature value is not PKCS#7 signed data')
  const message = forge.pkcs7.messageFromAsn1(contentInfo) as forge.pkcs7.Captured<forge.pkcs7.PkcsSignedData>
  const capture = message.rawCapture as { certificates?: forge.asn1.Asn1; signerInfos?: forge.asn1.Asn1[] }
  const signerInfos = capture.signerInfos ?? []
  if (signerInfos.length !== 1) throw new UnreadableSignature(`The signature has ${signerInfos.length} signers instead of one`)
  const signerInfo = signerInfos[0]!

  // SignerInfo: version, issuerAndSerialNumber, digestAlgorithm, [0] signedAttrs, signatureAlgorithm, signature
  const signerId = child(signerInfo, 1)
  const digestAlgorithm = DIGEST_ALGORITHMS[oidOf(child(child(signerInfo, 2), 0))]
  if (!digestAlgorithm) throw new UnreadableSignature('The signature uses a digest algorithm we do not check')
  const attributes = child(signerInfo, 3)
  if (attributes.tagClass !== forge.asn1.Class.CONTEXT_SPECIFIC || attributes.type !== 0) {
    throw new UnreadableSignature('The signature has no signed attributes')
  }
  if (!RSA_SIGNATURE_ALGORITHMS.has(oidOf(child(child(signerInfo, 4), 0)))) {
    throw new UnreadableSignature('The signature uses a signature algorithm we do not check')
  }
  const signatureValue = Buffer.from(bytesOf(child(signerInfo, 5)), 'binary')

  const attributeList = childrenOf(attributes)
  const attributeValue = (oid: string) => {
    const attribute = attributeList.find((candidate) => oidOf(child(candidate, 0)) === oid)
    return attribute ? child(child(attribute, 1), 0) : null
  }
  const digestAttribute = attributeValue(OID.messageDigest)
  if (!digestAttribute) throw new UnreadableSignature('The signature does not say which digest it signed')
  const timeAttribute = attributeValue(OID.signingTime)

  const certificate = signerCertificate(message.certificates, childrenOf(capture.certificates), signerId)
  return {
    certificate,
    publicKey: createPublicKey(forge.pki.publicKeyToPem(certificate.publicKey)),
    digestAlgorithm,
    messageDigest: Buffer.from(bytesOf(digestAttribute), 'binary'),
    signingTime: timeAttribute ? timeOf(timeAttribute) : null,
    signedAttributes: Buffer.from(forge.asn1.toDer(forge.asn1.create(forge.asn1.Class.UNIVERSAL, forge.asn1.Type.SET, true, attributeList)).getBytes(), 'binary'),
    signatureValue,
  }
}

/**
 * The certificate named by the signer's issuer and serial number, else the first one: a signer
 * identified by key identifier, or an issuer name forge wrote wrongly (it UTF-8-encodes UTF8String
 * names twice). The signature check then shows whether it is the signer's. `parsed` and `raw` are
 * the same certificates, forge's and as ASN.1.
 */
function signerCertificate(parsed: forge.pki.Certificate[], raw: forge.asn1.Asn1[], signerId: forge.asn1.Asn1): forge.pki.Certificate {
  const byIssuerAndSerial = signerId.tagClass === forge.asn1.Class.UNIVERSAL && signerId.type === forge.asn1.Type.SEQUENCE
  const named = byIssuerAndSerial
    ? raw.findIndex((certificate) => {
        const tbs = child(certificate, 0)
        // TBSCertificate: [0] version (optional), serialNumber, signature, issuer, …
        const first = child(tbs, 0).tagClass === forge.asn1.Class.CONTEXT_SPECIFIC ? 1 : 0
        return derOf(child(tbs, first)) === derOf(child(signerId, 1)) && derOf(child(tbs, first + 2)) === derOf(child(signerId, 0))
      })
    : -1
  const certificate = parsed[Math.max(named, 0)]
  if (!certificate) throw new UnreadableSignature('The signature does not carry its signer’s certificate')
  return certificate
}

/** Length in bytes of the definite-length DER SEQUENCE at the start of `bytes`, or null when there is none. */
function derElementLength(bytes: Buffer): number | null {
  if (bytes[0] !== 0x30 || bytes.length < 2) return null
  const firstLengthByte = bytes[1]!
  let headerLength = 2
  let contentLength = firstLengthByte
  if (firstLengthByte >= 0x80) {
    const lengthBytes = firstLengthByte & 0x7f
    if (lengthBytes === 0 || lengthBytes > 4 || bytes.length < 2 + lengthBytes) return null
    contentLength = bytes.readUIntBE(2, lengthBytes)
    headerLength += lengthBytes
  }
  return headerLength + contentLength <= bytes.length ? headerLength + contentLength : null
}

function childrenOf(node: forge.asn1.Asn1 | undefined): forge.asn1.Asn1[] {
  if (!node) return []
  if (!Array.isArray(node.value)) throw new UnreadableSignature(UNREADABLE)
  return node.value
}

function child(node: forge.asn1.Asn1, index: number): forge.asn1.Asn1 {
  const found = childrenOf(node)[index]
  if (!found) throw new UnreadableSignature(UNREADABLE)
  return found
}

function bytesOf(node: forge.asn1.Asn1): string {
  if (typeof node.value !== 'string') throw new UnreadableSignature(UNREADABLE)
  return node.value
}

function oidOf(node: forge.asn1.Asn1): string {
  return forge.asn1.derToOid(bytesOf(node))
}

function derOf(node: forge.asn1.Asn1): string {
  return forge.asn1.toDer(node).getBytes()
}

function timeOf(node: forge.asn1.Asn1): Date | null {
  const text = bytesOf(node)
  const date =
    node.type === forge.asn1.Type.UTCTIME ? forge.asn1.utcTimeToDate(text)
    : node.type === forge.asn1.Type.GENERALIZEDTIME ? forge.asn1.generalizedTimeToDate(text)
    : null
  return date && !Number.isNaN(date.getTime()) ? date : null
}
