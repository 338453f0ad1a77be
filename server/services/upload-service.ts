import path from 'node:path'
import { fileTypeFromBuffer } from 'file-type'
import type { DataSource, EntityManager } from 'typeorm'
import type { AuthUser } from '../auth/auth-user'
import { StoredFileEntity, type StoredFile } from '../entities'
import { badRequest, notFound, payloadTooLarge, unsupportedMediaType } from '../http/errors'
import { StoredFileMissing, type FileStorage } from '../storage'
import { findOwned } from './rows'

/** A file as it arrived in a multipart form. */
export interface IncomingFile {
  buffer: Buffer
  originalname: string
}

/** The original name as harmless display text: no folders, no control characters, at most 200 characters. */
export function displayName(originalName: string, fallback: string): string {
  // eslint-disable-next-line no-control-regex
  const cleaned = path.basename(originalName.replace(/\\/g, '/')).replace(/[\u0000-\u001f\u007f"]/g, '').trim().slice(0, 200)
  return cleaned || fallback
}

type SniffedType = 'application/pdf' | 'image/png' | 'image/jpeg'

const TYPE_WORDS: Record<SniffedType, string> = { 'application/pdf': 'PDF', 'image/png': 'PNG', 'image/jpeg': 'JPEG' }

/** What each kind of upload may be. Sizes are ours (common practice, no source): a page of scan or a datasheet. */
export const UPLOAD_USES = {
  datasheet: { what: 'datasheet', types: ['application/pdf'], maxBytes: 20 * 1024 * 1024, fallbackName: 'datasheet.pdf' },
  stampImage: { what: 'stamp image', types: ['image/png'], maxBytes: 2 * 1024 * 1024, fallbackName: 'stamp.png' },
  feeReceipt: { what: 'fee receipt', types: ['application/pdf', 'image/png', 'image/jpeg'], maxBytes: 10 * 1024 * 1024, fallbackName: 'receipt' },
  correctionLetter: { what: 'correction letter', types: ['application/pdf'], maxBytes: 20 * 1024 * 1024, fallbackName: 'corrections.pdf' },
  verification: { what: 'PDF to verify', types: ['application/pdf'], maxBytes: 100 * 1024 * 1024, fallbackName: 'plan-set.pdf' },
} as const satisfies Record<string, { what: string; types: readonly SniffedType[]; maxBytes: number; fallbackName: string }>
export type UploadUse = keyof typeof UPLOAD_USES

/** A PDF's file trailer ends with `%%EOF` (ISO 32000-1, 7.5.5); a few tools append bytes after it. */
const hasPdfTrailer = (bytes: Buffer) => bytes.subarray(Math.max(0, bytes.length - 2048)).includes('%%EOF')

const listOf = (words: string[]) => (words.length > 1 ? `${words.slice(0, -1).join(', ')} or ${words.at(-1)}` : words[0]!)

/**
 * Uploaded files: what they are is decided by their content (file-type reads the magic bytes, then a
 * PDF's trailer is checked), never by the name or the declared type; each use allows its own types
 * and size. Bytes go to storage by SHA-256; a row records who sent what under which name.
 */
export class UploadService {
  constructor(
    private readonly db: DataSource,
    private readonly storage: FileStorage,
  ) {}

  /**
   * The file's content type when it is one `use` accepts: 400 for no file or an empty one, 413 over
   * the use's size, 415 for any other content. Stores nothing.
   */
  async check(file: IncomingFile | undefined, field: string, use: UploadUse): Promise<SniffedType> {
    const policy = UPLOAD_USES[use]
    const allowed = listOf(policy.types.map((t) => TYPE_WORDS[t]))
    if (!file || file.buffer.length === 0) throw badRequest(`Attach the ${policy.what} (${allowed})`, [{ field, message: 'is required and must not be empty' }])
    if (file.buffer.length > policy.maxBytes) {
      throw payloadTooLarge(`A ${policy.what} may be at most ${Math.round(policy.maxBytes / 1024 / 1024)} MB; this one is ${(file.buffer.length / 1024 / 1024).toFixed(1)} MB`, [
        { field, message: `must be at most ${policy.maxBytes} bytes` },
      ])
    }
    const sniffed = await fileTypeFromBuffer(file.buffer)
    const mime = sniffed?.mime as SniffedType | undefined
    if (!mime || !(policy.types as readonly string[]).includes(mime)) {
      throw unsupportedMediaType(`A ${policy.what} must be ${allowed}; this file's content is ${sniffed ? sniffed.mime : 'not a recognised binary format'}`, [
        { field, message: `must be ${allowed} by its content` },
      ])
    }
    if (mime === 'application/pdf' && !hasPdfTrailer(file.buffer)) {
      throw unsupportedMediaType('The file starts like a PDF but has no PDF trailer; it is damaged or not a PDF', [{ field, message: 'must be a complete PDF document' }])
    }
    return mime
  }

  /** Checks the file for `use` (see `check`) and stores it; the row is written with `manager`. */
  async store(actor: AuthUser, file: IncomingFile | undefined, field: string, use: UploadUse, manager: EntityManager = this.db.manager): Promise<StoredFile> {
    const mediaType = await this.check(file, field, use)
    return this.save(actor, file!.buffer, mediaType, displayName(file!.originalname, UPLOAD_USES[use].fallbackName), manager)
  }

  /** Stores bytes whose content the caller has already checked in its own way (e.g. a PKCS#12 file it opened). */
  async save(actor: AuthUser, bytes: Buffer, mediaType: string, originalName: string, manager: EntityManager = this.db.manager): Promise<StoredFile> {
    const sha256 = await this.storage.put(bytes)
    return manager.getRepository(StoredFileEntity).save({
      organizationId: actor.organizationId,
      sha256,
      byteSize: bytes.length,
      mediaType,
      originalName,
      uploadedBy: actor.id,
    })
  }

  /** The bytes of one stored file of the organisation (404 for another organisation's). */
  async read(organizationId: string, fileId: string): Promise<{ file: StoredFile; bytes: Buffer }> {
    const file = await findOwned(this.db.manager, StoredFileEntity, organizationId, fileId, 'File')
    try {
      return { file, bytes: await this.storage.get(file.sha256) }
    } catch (err) {
      if (err instanceof StoredFileMissing) throw notFound('Stored file content')
      throw err
    }
  }
}
