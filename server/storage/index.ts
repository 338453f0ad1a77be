import path from 'node:path'
import type { AppConfig } from '../config'
import type { FileStorage } from './file-storage'
import { LocalDiskStorage } from './local-disk-storage'
import { S3Storage } from './s3-storage'

export { StoredFileMissing, type FileStorage } from './file-storage'
export { readS3Settings, S3SettingsError, type S3Settings } from './s3-config'

/** The storage of this process: the S3-compatible object store when configured, else local disk under the data folder. */
export function createFileStorage(config: Pick<AppConfig, 'dataDir' | 's3'>): FileStorage {
  if (config.s3) return new S3Storage(config.s3)
  return new LocalDiskStorage(path.join(config.dataDir, 'files'))
}
