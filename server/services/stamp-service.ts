import { createHash, randomBytes } from 'node:crypto'
import { PDFDocument } from 'pdf-lib'
import type { DataSource, EntityManager } from 'typeorm'
import {
  normalizeVerificationId,
  VERIFICATION_ID_PATTERN,
  type FileVerificationDto,
  type StampCredentialsDto,
  type VerifiedStampDto,
} from '../../shared/schemas/stamp'
import { licenceProblems } from '../../shared/workflow'
import type { AuthUser } from '../auth/auth-user'
import type { AppConfig } from '../config'
import { PlanSetRevisionEntity, ProjectEntity, RevisionStampEntity, StoredFileEntity, UserEntity, type PlanSetRevision, type RevisionStamp, type User } from '../entities'
import { badRequest, conflict, notFound, payloadTooLarge, unprocessable, unsupportedMediaType, type FieldError } from '../http/errors'
import type { ManifestStamp } from '../package/manifest'
import { stampedPackage } from '../package/stamped'
import { stampPlanSet } from '../render/stamp-overlay'
import { CertificateError, readCertificate, signPdf, verifyPdfSignature, type CertificateInfo } from '../signing'
import type { FileStorage } from '../storage'
import type { AuditService } from './audit-service'
import { rethrowUnique } from './rows'
import type { IncomingFile, UploadService } from './upload-service'
import type { StepContext, WorkflowService } from './workflow-service'
import { utcDay } from '../calendar'

/** A PKCS#12 file holds a key and a few certificates: a few kilobytes. Ours (common practice, no source). */
const CERTIFICATE_MAX_BYTES = 64 * 1024
/** A stamp image must stay legible when printed about 40 mm wide [px]. Ours (common practice, no source). */
const STAMP_IMAGE_PIXELS = { min: 150, max: 4000 }
const CROCKFORD = '0123456789ABCDEFGHJKMNPQRSTVWXYZ'

/** `XXXX-XXXX-XXXX` from 60 random bits. */
function newVerificationId(): string {
  const bytes = randomBytes(12)
  const chars = [...bytes].map((b) => CROCKFORD[b & 31]!)
  return `${chars.slice(0, 4).join('')}-${chars.slice(4, 8).join('')}-${chars.slice(8).join('')}`
}

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex')

/** Width and height of a PNG from its IHDR chunk (PNG specification, 11.2.2), which follows the 8-byte signature. */
function pngSize(bytes: Buffer): { width: number; height: number } {
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) }
}

/** What stamping prepares before its transaction: the files are in storage, the row is yet to be written. */
type PreparedStamp = Omit<RevisionStamp, 'id' | 'transitionId' | 'createdAt'>

/** A verification id anywhere in a text: the shared pattern without its anchors. */
const VERIFICATION_ID_IN_TEXT = new RegExp(VERIFICATION_ID_PATTERN.source.slice(1, -1))

/** The verification id a signed file names in its signature dictionary (we write it there when signing). */
function verificationIdIn(texts: (string | null)[]): string | null {
  for (const t of texts) {
    const found = t?.match(VERIFICATION_ID_IN_TEXT)
    if (found) return found[0]
  }
  return null
}

const publicFacts = (stamp: RevisionStamp, projectCode: string, revisionNumber: number): VerifiedStampDto => ({
  verificationId: stamp.verificationId,
  projectCode,
  revisionNumber,
  holderName: stamp.holderName,
  stampedAt: stamp.stampedAt.toISOString(),
})

/**
 * The licensed reviewer's stamp: the stamp image and signing certificate on the profile, stamping a
 * revision when it is approved (the image, holder, licence and verification id in every sheet's
 * stamp box, then a PKCS#7 signature over the plan-set PDF and a stamped package), and checking a
 * PDF or a verification id against the stamps on record.
 */
export class StampService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly uploads: UploadService,
    private readonly storage: FileStorage,
    private readonly config: Pick<AppConfig, 'appUrl'>,
    workflow: WorkflowService,
    private readonly today: () => string = utcDay,
  ) {
    workflow.onGuard('approve_and_stamp', (manager, step) => this.checkReady(manager, step))
    workflow.onStep<PreparedStamp>('approve_and_stamp', {
      prepare: (step) => this.prepare(step),
      apply: (manager, step) => this.record(manager, step.prepared, step.transitionId),
    })
  }

  private verifyUrl(verificationId: string): string {
    return `${this.config.appUrl}/verify/${verificationId}`
  }

  private async user(actor: AuthUser, manager: EntityManager = this.db.manager): Promise<User> {
    return manager.getRepository(UserEntity).findOneByOrFail({ id: actor.id, organizationId: actor.organizationId })
  }

  /** What stops `user` from stamping today, each named by the profile field that fixes it. */
  private problems(user: User): FieldError[] {
    const problems: FieldError[] = licenceProblems(user, this.today())
    if (!user.stampImageFileId) problems.push({ field: 'stampImage', message: 'is missing from your profile; upload the PNG image of your stamp' })
    if (!user.certificateFileId || !user.certificateNotAfter) {
      problems.push({ field: 'certificate', message: 'is missing from your profile; upload your signing certificate (PKCS#12)' })
    } else if (utcDay(user.certificateNotAfter) < this.today()) {
      problems.push({ field: 'certificate', message: `your signing certificate expired on ${utcDay(user.certificateNotAfter)}; upload a current one` })
    }
    return problems
  }

  async credentials(actor: AuthUser): Promise<StampCredentialsDto> {
    const user = await this.user(actor)
    const image = user.stampImageFileId ? await this.db.getRepository(StoredFileEntity).findOneBy({ id: user.stampImageFileId }) : null
    return {
      stampImage: image ? { uploadedAt: image.createdAt.toISOString(), fileName: image.originalName, bytes: image.byteSize } : null,
      certificate:
        user.certificateFileId && user.certificateCommonName && user.certificateNotAfter && user.certificateFingerprint
          ? { commonName: user.certificateCommonName, notAfter: user.certificateNotAfter.toISOString(), fingerprintSha256: user.certificateFingerprint, demo: user.certificateDemo ?? false }
          : null,
      licence: { number: user.licenceNumber, region: user.licenceRegion, expiry: user.licenceExpiry },
      problems: this.problems(user),
    }
  }

  /** The stamp image on the caller's profile (404 when none). */
  async stampImage(actor: AuthUser): Promise<Buffer> {
    const user = await this.user(actor)
    if (!user.stampImageFileId) throw notFound('Stamp image')
    return (await this.uploads.read(actor.organizationId, user.stampImageFileId)).bytes
  }

  /** A PNG of the stamp, sniffed by content, legible in size. */
  async uploadStampImage(actor: AuthUser, file: IncomingFile | undefined): Promise<StampCredentialsDto> {
    await this.uploads.check(file, 'file', 'stampImage')
    const { width, height } = pngSize(file!.buffer)
    const { min, max } = STAMP_IMAGE_PIXELS
    // the stamp is drawn into PDFs: a PNG the PDF library cannot embed is refused now, not at stamping
    const embeddable = await (await PDFDocument.create()).embedPng(file!.buffer).then(() => true, () => false)
    if (!embeddable) throw unprocessable('This PNG cannot be read (damaged or an unusual variant); export it again as a plain PNG', [{ field: 'file', message: 'must be a readable PNG' }])
    if (Math.min(width, height) < min || Math.max(width, height) > max) {
      throw unprocessable(`A stamp image must be ${min} to ${max} pixels on each side; this one is ${width} × ${height}`, [{ field: 'file', message: `must be ${min}–${max} px on each side` }])
    }
    await this.db.transaction(async (manager) => {
      const stored = await this.uploads.store(actor, file, 'file', 'stampImage', manager)
      await manager.getRepository(UserEntity).update({ id: actor.id, organizationId: actor.organizationId }, { stampImageFileId: stored.id })
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: 'stamp.image_uploaded', entityType: 'user', entityId: actor.id, data: { fileId: stored.id, sha256: stored.sha256 } }, manager)
    })
    return this.credentials(actor)
  }

  /** A PKCS#12 signing certificate, opened with its password to prove it holds the key; the password is not kept. */
  async uploadCertificate(actor: AuthUser, file: IncomingFile | undefined, password: string): Promise<StampCredentialsDto> {
    if (!file || file.buffer.length === 0) throw badRequest('Attach the signing certificate (PKCS#12, .p12 or .pfx)', [{ field: 'file', message: 'is required and must not be empty' }])
    if (file.buffer.length > CERTIFICATE_MAX_BYTES) {
      throw payloadTooLarge(`A signing certificate file may be at most ${CERTIFICATE_MAX_BYTES / 1024} KB`, [{ field: 'file', message: `must be at most ${CERTIFICATE_MAX_BYTES} bytes` }])
    }
    const info = this.openCertificate(file.buffer, password, 'password')
    if (utcDay(info.notAfter) < this.today()) {
      throw unprocessable(`This certificate expired on ${utcDay(info.notAfter)}`, [{ field: 'file', message: 'has expired' }])
    }
    await this.db.transaction(async (manager) => {
      const stored = await this.uploads.save(actor, file.buffer, 'application/x-pkcs12', file.originalname ? file.originalname.slice(-200) : 'certificate.p12', manager)
      await manager.getRepository(UserEntity).update(
        { id: actor.id, organizationId: actor.organizationId },
        { certificateFileId: stored.id, certificateCommonName: info.commonName, certificateNotAfter: info.notAfter, certificateFingerprint: info.fingerprintSha256, certificateDemo: info.demo },
      )
      await this.audit.record(
        { organizationId: actor.organizationId, actorId: actor.id, action: 'stamp.certificate_uploaded', entityType: 'user', entityId: actor.id, data: { fingerprint: info.fingerprintSha256, commonName: info.commonName, notAfter: info.notAfter.toISOString() } },
        manager,
      )
    })
    return this.credentials(actor)
  }

  /** Opens a PKCS#12 file; its problems become 415 (not a certificate file) or 422 naming `passwordField`. */
  private openCertificate(p12: Buffer, password: string, passwordField: string): CertificateInfo {
    try {
      return readCertificate(p12, password)
    } catch (err) {
      if (!(err instanceof CertificateError)) throw err
      if (err.problem === 'not_pkcs12') throw unsupportedMediaType(err.message, [{ field: 'file', message: 'must be a PKCS#12 file (.p12 or .pfx)' }])
      if (err.problem === 'wrong_password') throw unprocessable(err.message, [{ field: passwordField, message: 'does not open the signing certificate' }])
      throw unprocessable(err.message, [{ field: 'file', message: 'must hold one signing certificate with its private key' }])
    }
  }

  /** Before any slow work and again in the transaction: everything stamping needs is there. */
  private async checkReady(manager: EntityManager, step: StepContext): Promise<void> {
    const user = await this.user(step.actor, manager)
    const problems = this.problems(user).filter((p) => p.field === 'stampImage' || p.field === 'certificate')
    if (problems.length) throw unprocessable('Your profile lacks what a stamp needs', problems)
    if (!step.body.stamp?.certificatePassword) {
      throw unprocessable('Approving signs the plan set: give the password of your signing certificate', [{ field: 'stamp.certificatePassword', message: 'is required to sign the plan set' }])
    }
    const revision = step.revision
    if (revision && revision.stampBoxes.length === 0) {
      throw unprocessable(`Revision ${revision.number} was published before stamp boxes were recorded; publish a new revision and ask for review again`, [
        { field: 'revisionNumber', message: `revision ${revision.number} cannot take a stamp` },
      ])
    }
    if (revision && (await manager.getRepository(RevisionStampEntity).existsBy({ revisionId: revision.id }))) {
      throw conflict(`Revision ${revision.number} is already stamped`)
    }
  }

  /** The slow part, before the transaction: stamp every sheet, sign, repack; files go to content-addressed storage. */
  private async prepare({ actor, project, revision, body }: StepContext): Promise<PreparedStamp> {
    if (!revision) throw new Error('approve_and_stamp reached the stamp without a revision under review')
    const user = await this.user(actor)
    const password = body.stamp!.certificatePassword
    const p12 = (await this.uploads.read(actor.organizationId, user.certificateFileId!)).bytes
    const certificate = this.openCertificate(p12, password, 'stamp.certificatePassword')
    const image = (await this.uploads.read(actor.organizationId, user.stampImageFileId!)).bytes
    const planSet = revision.files.find((f) => f.name === 'plan-set.pdf')
    if (!planSet) throw new Error(`revision ${revision.id} has no plan-set.pdf`)

    const stampedAt = new Date()
    const verificationId = newVerificationId()
    const holder = { name: user.name, licenceNumber: user.licenceNumber!, licenceRegion: user.licenceRegion! }
    const verifyUrl = this.verifyUrl(verificationId)
    const unsigned = await stampPlanSet(await this.storage.get(planSet.sha256), revision.stampBoxes, {
      image, holderName: holder.name, licenceNumber: holder.licenceNumber, licenceRegion: holder.licenceRegion,
      stampedOn: utcDay(stampedAt), verificationId, verifyUrl, demo: certificate.demo,
    })
    const signed = await signPdf(unsigned, p12, password, {
      reason: `Plan set ${project.code} revision ${revision.number} reviewed and stamped; verification ${verificationId}`,
      name: holder.name,
      location: holder.licenceRegion,
      contactInfo: `Verify at ${verifyUrl}`,
      signingTime: stampedAt,
    })
    const stamp: ManifestStamp = {
      ...holder, stampedAt: stampedAt.toISOString(), verificationId, verifyUrl, certificateSha256: certificate.fingerprintSha256, demoCertificate: certificate.demo,
    }
    const pkg = await stampedPackage(revision.files, (sha) => this.storage.get(sha), signed, stamp)
    for (const f of pkg.files) await this.storage.put(f.bytes)
    const packageSha256 = await this.storage.put(pkg.zip)
    return {
      organizationId: actor.organizationId,
      projectId: project.id,
      revisionId: revision.id,
      verificationId,
      stampedBy: actor.id,
      holderName: holder.name,
      licenceNumber: holder.licenceNumber,
      licenceRegion: holder.licenceRegion,
      licenceExpiry: user.licenceExpiry!,
      certificateCommonName: certificate.commonName,
      certificateFingerprint: certificate.fingerprintSha256,
      certificateDemo: certificate.demo,
      stampedAt,
      signedPdfSha256: sha256(signed),
      signedPdfBytes: signed.length,
      packageName: revision.packageName,
      packageSha256,
      packageBytes: pkg.zip.length,
      files: pkg.files.map((f) => ({ name: f.name, bytes: f.bytes.length, sha256: f.sha256, mediaType: f.mediaType })),
    }
  }

  private async record(manager: EntityManager, prepared: PreparedStamp, transitionId: string): Promise<void> {
    try {
      await manager.getRepository(RevisionStampEntity).insert({ ...prepared, transitionId })
    } catch (err) {
      rethrowUnique(err, { revision_stamps_revision_key: { field: 'revisionNumber', message: 'This revision was stamped meanwhile' } })
    }
  }

  private async factsOf(stamp: RevisionStamp): Promise<VerifiedStampDto> {
    const project = await this.db.getRepository(ProjectEntity).findOneOrFail({ select: { code: true }, where: { id: stamp.projectId } })
    const revision: Pick<PlanSetRevision, 'number'> = await this.db.getRepository(PlanSetRevisionEntity).findOneOrFail({ select: { number: true }, where: { id: stamp.revisionId } })
    return publicFacts(stamp, project.code, revision.number)
  }

  /** Public: a verification id as printed on a stamped sheet. */
  async verifyCode(typed: string): Promise<VerifiedStampDto> {
    const id = normalizeVerificationId(typed)
    if (!id) throw badRequest('A verification id has 12 characters, e.g. 7K2M-9QXR-4T1H', [{ field: 'code', message: 'is not a verification id' }])
    const stamp = await this.db.getRepository(RevisionStampEntity).findOneBy({ verificationId: id })
    if (!stamp) throw notFound('Stamp with this verification id')
    return this.factsOf(stamp)
  }

  /** Public: any PDF, checked for a signature and against the stamps on record. Stores nothing. */
  async verifyFile(file: IncomingFile | undefined): Promise<FileVerificationDto> {
    await this.uploads.check(file, 'file', 'verification')
    const bytes = file!.buffer
    const check = verifyPdfSignature(bytes)
    const stamps = this.db.getRepository(RevisionStampEntity)
    const exact = await stamps.findOneBy({ signedPdfSha256: sha256(bytes) })
    const namedId = verificationIdIn([check.dictionary.reason, check.dictionary.contactInfo])
    const stamp = exact ?? (namedId ? await stamps.findOneBy({ verificationId: namedId }) : null)
    const facts = stamp ? await this.factsOf(stamp) : null
    const who = facts ? `${facts.projectCode} revision ${facts.revisionNumber}, stamped by ${facts.holderName} on ${facts.stampedAt.slice(0, 10)}` : ''
    if (exact) {
      return { signature: check.state, match: 'exact', stamp: facts, reason: check.state === 'valid' ? `The signature is intact: this is ${who}.` : `This is the file of ${who}, but its signature does not check: ${check.reason}` }
    }
    if (stamp) {
      const otherKey = check.signer && check.signer.fingerprintSha256 !== stamp.certificateFingerprint
      return {
        signature: otherKey ? 'invalid' : check.state === 'valid' ? 'altered' : check.state,
        match: 'altered_copy',
        stamp: facts,
        reason: otherKey
          ? `The file names the stamp of ${who}, but it was signed with another certificate.`
          : `The file claims to be ${who}, but it is not the file that was signed: it was changed after signing.`,
      }
    }
    const unknown = check.state === 'unsigned' ? 'The file carries no digital signature, and it is not a plan set stamped in Stringline.' : `${check.reason} The file is not a plan set stamped in Stringline.`
    return { signature: check.state, match: 'unknown', stamp: null, reason: unknown }
  }
}
