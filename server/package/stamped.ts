/**
 * The stamped package of a revision: the published files with plan-set.pdf replaced by the signed
 * one and a manifest that records the stamp, zipped again in the same order under the same name.
 */
import type { PackageFileDto } from '../../shared/schemas/revision'
import { jsonFile, type BuiltFile, type PackageFileName } from './build'
import { sha256Hex, type ManifestStamp, type PackageManifest } from './manifest'
import { zipEntries } from './zip'

export interface StampedPackage {
  zip: Buffer
  files: BuiltFile[]
  manifest: PackageManifest
}

/**
 * `published` are the revision's files in packing order with their bytes (manifest.json last, as
 * generated); `readBytes` answers a file's bytes from storage.
 */
export async function stampedPackage(
  published: readonly PackageFileDto[],
  readBytes: (sha256: string) => Promise<Buffer>,
  signedPdf: Buffer,
  stamp: ManifestStamp,
): Promise<StampedPackage> {
  const manifestEntry = published.find((f) => f.name === 'manifest.json')
  if (!manifestEntry || !published.some((f) => f.name === 'plan-set.pdf')) throw new Error('the published package has no plan-set.pdf or manifest.json')
  const original = JSON.parse((await readBytes(manifestEntry.sha256)).toString('utf8')) as PackageManifest
  const files: BuiltFile[] = []
  for (const f of published.filter((p) => p.name !== 'manifest.json')) {
    const bytes = f.name === 'plan-set.pdf' ? signedPdf : await readBytes(f.sha256)
    files.push({ name: f.name as PackageFileName, bytes, sha256: sha256Hex(bytes), mediaType: f.mediaType })
  }
  const manifest: PackageManifest = {
    ...original,
    stampedBy: stamp,
    files: files.map((f) => ({ name: f.name, bytes: f.bytes.length, sha256: f.sha256, mediaType: f.mediaType })),
  }
  const manifestBytes = jsonFile(manifest)
  files.push({ name: 'manifest.json', bytes: manifestBytes, sha256: sha256Hex(manifestBytes), mediaType: manifestEntry.mediaType })
  return { zip: await zipEntries(files, new Date(stamp.stampedAt)), files, manifest }
}
