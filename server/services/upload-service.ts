import path from 'node:path'
import { fileTypeFromBuffer } from 'file-type'
import type { DataSource, EntityManager } from 'typeorm'
import type { AuthUser } from '../auth/auth-user'
import { StoredFileEntity, type StoredFile } from '../entities'
import { badRequest, notFound, unsupportedMediaType } from '../http/errors'
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

/** A PDF's file trailer ends with `%%EOF` (ISO 32000-1, 7.5.5); a few tools append bytes after it. */
const hasPdfTrailer = (bytes: Buffer) => bytes.subarray(Math.max(0, bytes.length - 2048)).includes('%%EOF')

/**
 * Uploaded files: what they are is decided by their content (file-type reads the magic bytes, then the
 * PDF trailer is checked),
 * never by the name or the declared type. Bytes go to storage by SHA-256; a row records who sent
 * what under which name.
 */
export class UploadService {
  constructor(
    private readonly db: DataSource,
    private readonly storage: FileStorage,
  ) {}

  /** Refuses an empty file (400) and anything whose content is not a PDF (415). */
  async storePdf(actor: AuthUser, file: IncomingFile | undefined, field: string, manager: EntityManager = this.db.manager): Promise<StoredFile> {
    if (!file || file.buffer.length === 0) throw badRequest('Attach a PDF file', [{ field, message: 'is required and must not be empty' }])
    const sniffed = await fileTypeFromBuffer(file.buffer)
    if (sniffed?.mime !== 'application/pdf') {
      throw unsupportedMediaType(`Only PDF files are accepted; this file's content is ${sniffed ? sniffed.mime : 'not a recognised binary format'}`, [
        { field, message: 'must be a PDF document' },
      ])
    }
    if (!hasPdfTrailer(file.buffer)) {
      throw unsupportedMediaType('The file starts like a PDF but has no PDF trailer; it is damaged or not a PDF', [{ field, message: 'must be a complete PDF document' }])
    }
    const sha256 = await this.storage.put(file.buffer)
    return manager.getRepository(StoredFileEntity).save({
      organizationId: actor.organizationId,
      sha256,
      byteSize: file.buffer.length,
      mediaType: sniffed.mime,
      originalName: displayName(file.originalname, 'datasheet.pdf'),
      uploadedBy: actor.id,
    })
  }

  /** The bytes of one stored file of the organisation. */
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
