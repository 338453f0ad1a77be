/**
 * Where uploaded bytes live, addressed by their SHA-256 (lower-case hex). Content addressing makes a
 * repeated upload free and a stored file tamper-evident. Local disk by default; an object store
 * implements the same interface.
 */
export interface FileStorage {
  /** Stores the bytes (once per content) and answers their SHA-256. */
  put(bytes: Buffer): Promise<string>
  /** The bytes stored under a SHA-256; throws `StoredFileMissing` when there are none. */
  get(sha256: string): Promise<Buffer>
}

export class StoredFileMissing extends Error {}

export const SHA256_PATTERN = /^[0-9a-f]{64}$/
