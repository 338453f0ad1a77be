/**
 * Signing a PDF: a PKCS#7 detached signature (adbe.pkcs7.detached, SHA-256) over the whole file
 * except the signature value itself (ISO 32000-1 12.8.1).
 */
import { pdflibAddPlaceholder } from '@signpdf/placeholder-pdf-lib'
import { P12Signer } from '@signpdf/signer-p12'
import { SignPdf } from '@signpdf/signpdf'
import { PDFDocument } from 'pdf-lib'
import { openPkcs12 } from './certificate'

export interface SignatureDetails {
  reason: string
  name: string
  location: string
  contactInfo: string
  signingTime: Date
}

/**
 * Room for the signature beyond the certificates, in bytes: signer info, signed attributes and an
 * RSA signature value (512 bytes at 4096 bits), with margin.
 */
const SIGNATURE_OVERHEAD_BYTES = 2048

/**
 * Adds a signature placeholder with @signpdf/placeholder-pdf-lib (saved without object streams so
 * the placeholder stays findable in the raw bytes), then signs with @signpdf/signpdf and P12Signer.
 * The signature dictionary carries Reason, Name, Location, ContactInfo and M (signingTime).
 * Returns the signed bytes. Throws CertificateError for a wrong password or an unreadable P12;
 * pdf-lib's errors for a PDF it cannot load (e.g. EncryptedPDFError).
 */
export async function signPdf(pdf: Uint8Array, p12: Buffer, password: string, details: SignatureDetails): Promise<Buffer> {
  // fails early, with a CertificateError, on what P12Signer would only report as a forge message
  openPkcs12(p12, password)

  const document = await PDFDocument.load(pdf, { updateMetadata: false })
  pdflibAddPlaceholder({
    pdfDoc: document,
    reason: pdfTextStringBody(details.reason),
    name: pdfTextStringBody(details.name),
    location: pdfTextStringBody(details.location),
    contactInfo: pdfTextStringBody(details.contactInfo),
    signingTime: details.signingTime,
    signatureLength: placeholderHexLength(p12),
  })
  const prepared = Buffer.from(await document.save({ useObjectStreams: false }))
  return new SignPdf().sign(prepared, new P12Signer(p12, { passphrase: password }), details.signingTime)
}

/**
 * Hex digits to reserve for the signature. P12Signer puts every certificate of the P12 into the
 * signature, and the P12 holds them all, so its size bounds theirs.
 */
function placeholderHexLength(p12: Buffer): number {
  return 2 * (p12.length + SIGNATURE_OVERHEAD_BYTES)
}

/**
 * The body of a PDF literal string for a text string (ISO 32000-1 7.9.2.2): printable ASCII (where
 * PDFDocEncoding agrees with it) as is, anything else as UTF-16BE with its byte order mark.
 * pdf-lib writes the body byte for byte without escaping, so backslash and parentheses are
 * escaped here, and CR too, which readers would otherwise turn into LF (7.3.4.2).
 */
function pdfTextStringBody(text: string): string {
  const bytes = /^[\t\n\r\x20-\x7e]*$/.test(text)
    ? Buffer.from(text, 'latin1')
    : Buffer.concat([Buffer.from([0xfe, 0xff]), Buffer.from(text, 'utf16le').swap16()])
  return [...bytes].map(escapeLiteralStringByte).join('')
}

function escapeLiteralStringByte(byte: number): string {
  switch (byte) {
    case 0x5c:
      return '\\\\'
    case 0x28:
      return '\\('
    case 0x29:
      return '\\)'
    case 0x0d:
      return '\\r'
    default:
      return String.fromCharCode(byte)
  }
}
