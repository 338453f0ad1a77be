import { readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import type { EntityManager } from 'typeorm'
import { StoredFileEntity, UserEntity } from '../entities'
import { createDemoCertificate, readCertificate } from '../signing'
import type { FileStorage } from '../storage'

/** The invented demo stamp: a seal with the demo reviewer's name and "DEMO STAMP · NOT FOR PERMIT USE". */
const DEMO_STAMP_IMAGE = path.resolve(path.dirname(fileURLToPath(import.meta.url)), 'assets/demo-stamp.png')
/** How long the generated demo certificate stays valid [days]. */
const DEMO_CERTIFICATE_DAYS = 3 * 365

/**
 * Gives a demo reviewer without stamp credentials the invented stamp image and a freshly generated
 * self-signed demo certificate (its password is the demo password). Certificates are marked as demo
 * in their subject, and every stamp made with one says so. A reviewer who has credentials keeps them.
 */
export async function giveDemoStampCredentials(manager: EntityManager, storage: FileStorage, reviewerEmail: string, password: string): Promise<void> {
  const users = manager.getRepository(UserEntity)
  const reviewer = await users.findOneBy({ email: reviewerEmail })
  if (!reviewer || reviewer.stampImageFileId || reviewer.certificateFileId) return
  const files = manager.getRepository(StoredFileEntity)
  const store = async (bytes: Buffer, mediaType: string, originalName: string) =>
    files.save({ organizationId: reviewer.organizationId, sha256: await storage.put(bytes), byteSize: bytes.length, mediaType, originalName, uploadedBy: reviewer.id })
  const image = await store(readFileSync(DEMO_STAMP_IMAGE), 'image/png', 'demo-stamp.png')
  const p12 = createDemoCertificate({ holderName: reviewer.name, password, validFrom: new Date(Date.now() - 86_400_000), validDays: DEMO_CERTIFICATE_DAYS })
  const info = readCertificate(p12, password)
  const certificate = await store(p12, 'application/x-pkcs12', 'demo-signing-certificate.p12')
  await users.update(
    { id: reviewer.id },
    {
      stampImageFileId: image.id, certificateFileId: certificate.id, certificateCommonName: info.commonName, certificateNotAfter: info.notAfter,
      certificateFingerprint: info.fingerprintSha256, certificateDemo: info.demo,
    },
  )
}
