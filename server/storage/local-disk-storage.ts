import { createHash, randomBytes } from 'node:crypto'
import { mkdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises'
import path from 'node:path'
import { SHA256_PATTERN, StoredFileMissing, type FileStorage } from './file-storage'

/** Files under `<root>/<first two hex digits>/<sha256>`, written to a temporary name and renamed into place. */
export class LocalDiskStorage implements FileStorage {
  constructor(private readonly root: string) {}

  private pathOf(sha256: string): string {
    // the key is checked so that no caller can reach outside the root
    if (!SHA256_PATTERN.test(sha256)) throw new StoredFileMissing(`not a SHA-256: ${sha256}`)
    return path.join(this.root, sha256.slice(0, 2), sha256)
  }

  async put(bytes: Buffer): Promise<string> {
    const sha256 = createHash('sha256').update(bytes).digest('hex')
    const target = this.pathOf(sha256)
    const present = await stat(target).then((s) => s.size === bytes.length, () => false)
    if (present) return sha256
    await mkdir(path.dirname(target), { recursive: true })
    const temporary = `${target}.${randomBytes(6).toString('hex')}.part`
    try {
      await writeFile(temporary, bytes, { mode: 0o640 })
      await rename(temporary, target)
    } finally {
      await rm(temporary, { force: true })
    }
    return sha256
  }

  async get(sha256: string): Promise<Buffer> {
    try {
      return await readFile(this.pathOf(sha256))
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') throw new StoredFileMissing(`no stored file ${sha256}`)
      throw err
    }
  }
}
