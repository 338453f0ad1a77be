import path from 'node:path'
import type { AppConfig } from '../config'
import type { FileStorage } from './file-storage'
import { LocalDiskStorage } from './local-disk-storage'

export { StoredFileMissing, type FileStorage } from './file-storage'

/** The storage of this process: local disk under the data folder. */
export function createFileStorage(config: AppConfig): FileStorage {
  return new LocalDiskStorage(path.join(config.dataDir, 'files'))
}
