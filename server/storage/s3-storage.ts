import { GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3'
import { createHash } from 'node:crypto'
import { SHA256_PATTERN, StoredFileMissing, type FileStorage } from './file-storage'
import type { S3Settings } from './s3-config'

/** No such object: S3 answers NoSuchKey to GET and a bare 404 (NotFound) to HEAD. */
const isMissing = (err: unknown) =>
  err instanceof S3ServiceException && (err.name === 'NoSuchKey' || err.name === 'NotFound' || err.$metadata.httpStatusCode === 404)

/**
 * Files in an S3-compatible bucket under `files/<first two hex digits>/<sha256>`, the same layout
 * as the local disk. An object appears whole or not at all (S3 PUT is atomic), so no temporary name.
 */
export class S3Storage implements FileStorage {
  private readonly client: S3Client

  constructor(private readonly settings: S3Settings) {
    this.client = new S3Client({
      endpoint: settings.endpoint,
      region: settings.region,
      forcePathStyle: settings.forcePathStyle,
      credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
    })
  }

  /** The object key; checked so that no caller can address anything outside `files/`. */
  private keyOf(sha256: string): string {
    if (!SHA256_PATTERN.test(sha256)) throw new StoredFileMissing(`not a SHA-256: ${sha256}`)
    return `files/${sha256.slice(0, 2)}/${sha256}`
  }

  async put(bytes: Buffer): Promise<string> {
    const sha256 = createHash('sha256').update(bytes).digest('hex')
    const Key = this.keyOf(sha256)
    const present = await this.client.send(new HeadObjectCommand({ Bucket: this.settings.bucket, Key })).then(
      (head) => head.ContentLength === bytes.length,
      (err: unknown) => {
        if (isMissing(err)) return false
        throw err
      },
    )
    if (present) return sha256
    await this.client.send(new PutObjectCommand({
      Bucket: this.settings.bucket,
      Key,
      Body: bytes,
      ContentLength: bytes.length,
      ContentType: 'application/octet-stream',
      // the store checks the bytes it received against the hash we computed
      ChecksumSHA256: createHash('sha256').update(bytes).digest('base64'),
    }))
    return sha256
  }

  async get(sha256: string): Promise<Buffer> {
    try {
      const object = await this.client.send(new GetObjectCommand({ Bucket: this.settings.bucket, Key: this.keyOf(sha256) }))
      if (!object.Body) throw new StoredFileMissing(`no stored file ${sha256}`)
      return Buffer.from(await object.Body.transformToByteArray())
    } catch (err) {
      if (isMissing(err)) throw new StoredFileMissing(`no stored file ${sha256}`)
      throw err
    }
  }

  /** Closes the client's connections (tests, shutdown). */
  destroy(): void {
    this.client.destroy()
  }
}
