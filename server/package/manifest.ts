/** `manifest.json`: our own description of a submission package, with a SHA-256 per file. */
import { createHash } from 'node:crypto'
import { SAFETY_CAUTION } from '../../shared/electrical'
import type { PackageFileDto } from '../../shared/schemas/revision'

export type PackageFile = PackageFileDto

export interface PackageManifest {
  product: 'Stringline'
  /** Version of the Stringline release that built the package (package.json). */
  version: string
  engineVersion: string
  project: { code: string; name: string }
  revision: number
  description: string
  /** ISO 8601, UTC. */
  created: string
  /** Filled when a licensed reviewer stamps the revision; a generated package is never stamped. */
  stampedBy: ManifestStamp | null
  caution: string
  /** Every file of the zip except manifest.json itself, in packing order. */
  files: PackageFile[]
}

/** Who stamped the package and with what, as the stamped package's manifest records it. */
export interface ManifestStamp {
  name: string
  licenceNumber: string
  licenceRegion: string
  /** ISO 8601, UTC. */
  stampedAt: string
  verificationId: string
  /** Where the stamp can be checked. */
  verifyUrl: string
  /** SHA-256 of the signing certificate (DER), lower-case hex. */
  certificateSha256: string
  /** Signed with a generated demo certificate: not for permit use. */
  demoCertificate: boolean
}

export const sha256Hex = (bytes: Uint8Array): string => createHash('sha256').update(bytes).digest('hex')

export interface ManifestInput {
  productVersion: string
  engineVersion: string
  project: { code: string; name: string }
  revision: number
  description: string
  created: Date
  files: readonly { name: string; bytes: Uint8Array; mediaType: string }[]
}

export function buildManifest(m: ManifestInput): PackageManifest {
  return {
    product: 'Stringline',
    version: m.productVersion,
    engineVersion: m.engineVersion,
    project: { code: m.project.code, name: m.project.name },
    revision: m.revision,
    description: m.description,
    created: m.created.toISOString(),
    stampedBy: null,
    caution: SAFETY_CAUTION,
    files: m.files.map((f) => ({ name: f.name, bytes: f.bytes.byteLength, sha256: sha256Hex(f.bytes), mediaType: f.mediaType })),
  }
}
