import { In, type DataSource, type EntityManager } from 'typeorm'
import { evaluateDocument } from '../../shared/electrical/evaluate'
import { diffRevisions } from '../../shared/revisions/diff'
import type { CreateRevisionBody, PackageJobDto, RevisionDiff, RevisionDto } from '../../shared/schemas/revision'
import type { AuthUser } from '../auth/auth-user'
import { DesignEntity, PackageJobEntity, PlanSetRevisionEntity, RevisionStampEntity, type PackageJob, type PlanSetRevision, type RevisionStamp } from '../entities'
import { conflict, HttpError, notFound, unprocessable } from '../http/errors'
import type { PackageQueue } from '../jobs/queue'
import { blockersMessage, generationBlockers } from '../jobs/readiness'
import type { PackageFileName } from '../package/build'
import { planSetContext, type SheetSizeName } from '../render'
import { revisionNarrativePdf } from '../render/narrative-pdf'
import { StoredFileMissing, type FileStorage } from '../storage'
import type { AuditService } from './audit-service'
import type { ProjectService } from './project-service'
import { findOwned, peopleById, violatedUniqueIndex } from './rows'

const ACTIVE_JOB_INDEX = 'package_jobs_one_active_key'

const stampDto = (stamp: RevisionStamp | undefined): RevisionDto['stamp'] =>
  stamp
    ? {
        verificationId: stamp.verificationId, stampedAt: stamp.stampedAt.toISOString(), holderName: stamp.holderName, licenceNumber: stamp.licenceNumber,
        licenceRegion: stamp.licenceRegion, signedPdfSha256: stamp.signedPdfSha256, demo: stamp.certificateDemo,
      }
    : null

/** Published plan sets of a project, and the background jobs that make them. */
export class RevisionService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly projects: ProjectService,
    private readonly storage: FileStorage,
    private readonly queue: PackageQueue,
  ) {}

  private async jobDto(job: PackageJob, manager: EntityManager = this.db.manager): Promise<PackageJobDto> {
    const person = await peopleById(manager, [job.requestedBy])
    const revision = job.revisionId ? await manager.getRepository(PlanSetRevisionEntity).findOne({ select: { number: true }, where: { id: job.revisionId } }) : null
    return {
      id: job.id,
      projectId: job.projectId,
      state: job.state,
      step: job.step,
      progress: job.progress,
      error: job.error,
      attempts: job.attempts,
      description: job.description,
      designVersion: job.designVersion,
      revisionId: job.revisionId,
      revisionNumber: revision?.number ?? null,
      requestedBy: person(job.requestedBy),
      createdAt: job.createdAt.toISOString(),
      updatedAt: job.updatedAt.toISOString(),
    }
  }

  private async revisionDtos(rows: PlanSetRevision[]): Promise<RevisionDto[]> {
    const person = await peopleById(this.db.manager, rows.map((r) => r.createdBy))
    const stamps = rows.length ? await this.db.getRepository(RevisionStampEntity).findBy({ revisionId: In(rows.map((r) => r.id)) }) : []
    return rows.map((r) => {
      const stamp = stamps.find((st) => st.revisionId === r.id)
      // what downloads serve: the stamped package once there is one
      const issued = stamp ?? r
      return {
        id: r.id,
        projectId: r.projectId,
        number: r.number,
        description: r.description,
        createdAt: r.createdAt.toISOString(),
        createdBy: person(r.createdBy),
        designVersion: r.designVersion,
        engineVersion: r.engineVersion,
        necEdition: r.necEdition,
        evaluationStatus: r.evaluationStatus,
        sheetSize: r.sheetSize,
        packageName: issued.packageName,
        packageBytes: issued.packageBytes,
        packageSha256: issued.packageSha256,
        files: issued.files,
        sheetCount: r.sheetCount,
        stamp: stampDto(stamp),
      }
    })
  }

  private activeJob(projectId: string, manager: EntityManager = this.db.manager) {
    return manager.getRepository(PackageJobEntity).findOneBy({ projectId, state: In(['queued', 'running']) })
  }

  /** 409 with the generation already under way, so the client can follow it instead. */
  private async busy(projectId: string): Promise<HttpError> {
    const current = await this.activeJob(projectId)
    return new HttpError(409, 'conflict', 'A plan set of this project is being generated; wait for it to finish', undefined, current ? { job: await this.jobDto(current) } : undefined)
  }

  /**
   * Queues a generation of the stored design. 422 when there is no design or it has input errors
   * or failing checks (each named); 409 while another generation of the project is under way.
   */
  async request(actor: AuthUser, projectId: string, body: CreateRevisionBody): Promise<PackageJobDto> {
    const project = await this.projects.getOwned(actor.organizationId, projectId)
    if (project.archivedAt) throw conflict('This project is archived; restore it before generating a plan set')
    const design = await this.db.getRepository(DesignEntity).findOneBy({ projectId, organizationId: actor.organizationId })
    if (!design) throw unprocessable('The project has no design yet; save one before generating a plan set', [{ field: 'design', message: 'is required' }])
    const blockers = generationBlockers(evaluateDocument(design.document))
    if (blockers.length) throw unprocessable(blockersMessage(blockers), blockers)
    try {
      return await this.db.transaction(async (manager) => {
        const job = await manager.getRepository(PackageJobEntity).save({
          organizationId: actor.organizationId,
          projectId,
          requestedBy: actor.id,
          designVersion: design.version,
          description: body.description,
          state: 'queued',
          step: 'queued',
          progress: 0,
          error: null,
          attempts: 0,
          revisionId: null,
        })
        await this.queue.send({ packageJobId: job.id }, manager)
        await this.audit.record(
          { organizationId: actor.organizationId, actorId: actor.id, action: 'plan_set.requested', entityType: 'project', entityId: projectId, data: { jobId: job.id, designVersion: design.version } },
          manager,
        )
        return this.jobDto(job, manager)
      })
    } catch (err) {
      if (violatedUniqueIndex(err) === ACTIVE_JOB_INDEX) throw await this.busy(projectId)
      throw err
    }
  }

  private async ownedJob(organizationId: string, projectId: string, jobId: string): Promise<PackageJob> {
    await this.projects.getOwned(organizationId, projectId)
    const job = await findOwned(this.db.manager, PackageJobEntity, organizationId, jobId, 'Package job')
    if (job.projectId !== projectId) throw notFound('Package job')
    return job
  }

  async getJob(organizationId: string, projectId: string, jobId: string): Promise<PackageJobDto> {
    return this.jobDto(await this.ownedJob(organizationId, projectId, jobId))
  }

  /** Queues a failed generation again (409 for any other state, or while another one runs). */
  async retry(actor: AuthUser, projectId: string, jobId: string): Promise<PackageJobDto> {
    const job = await this.ownedJob(actor.organizationId, projectId, jobId)
    if (job.state !== 'failed') throw conflict(`Only a failed generation can be retried; this one is ${job.state}`)
    try {
      return await this.db.transaction(async (manager) => {
        const result = await manager.getRepository(PackageJobEntity).update({ id: job.id, state: 'failed' }, { state: 'queued', step: 'queued', progress: 0, error: null })
        if (result.affected !== 1) throw conflict('Someone retried this generation first')
        await this.queue.send({ packageJobId: job.id }, manager)
        await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: 'plan_set.retried', entityType: 'project', entityId: projectId, data: { jobId } }, manager)
        return this.jobDto(await manager.getRepository(PackageJobEntity).findOneByOrFail({ id: job.id }), manager)
      })
    } catch (err) {
      if (violatedUniqueIndex(err) === ACTIVE_JOB_INDEX) throw await this.busy(projectId)
      throw err
    }
  }

  /** Every revision, newest first, with the generation under way (or null). */
  async list(organizationId: string, projectId: string): Promise<{ items: RevisionDto[]; activeJob: PackageJobDto | null }> {
    await this.projects.getOwned(organizationId, projectId)
    const rows = await this.db.getRepository(PlanSetRevisionEntity).find({ where: { projectId, organizationId }, order: { number: 'DESC' } })
    const active = await this.activeJob(projectId)
    return { items: await this.revisionDtos(rows), activeJob: active ? await this.jobDto(active) : null }
  }

  private async revision(organizationId: string, projectId: string, number: number): Promise<PlanSetRevision> {
    await this.projects.getOwned(organizationId, projectId)
    const row = Number.isInteger(number) && number >= 0 ? await this.db.getRepository(PlanSetRevisionEntity).findOneBy({ projectId, organizationId, number }) : null
    if (!row) throw notFound(`Revision ${number} of this project`)
    return row
  }

  private async stored(sha256: string): Promise<Buffer> {
    try {
      return await this.storage.get(sha256)
    } catch (err) {
      if (err instanceof StoredFileMissing) throw notFound('Stored package content')
      throw err
    }
  }

  /** The package as it stands: the stamped one (signed plan set, manifest naming the stamp) once stamped. */
  private async issued(organizationId: string, projectId: string, number: number): Promise<Pick<PlanSetRevision, 'packageSha256' | 'packageName' | 'files'>> {
    const row = await this.revision(organizationId, projectId, number)
    return (await this.db.getRepository(RevisionStampEntity).findOneBy({ revisionId: row.id })) ?? row
  }

  async packageOf(organizationId: string, projectId: string, number: number): Promise<{ bytes: Buffer; fileName: string }> {
    const row = await this.issued(organizationId, projectId, number)
    return { bytes: await this.stored(row.packageSha256), fileName: row.packageName }
  }

  async fileOf(organizationId: string, projectId: string, number: number, name: PackageFileName): Promise<{ bytes: Buffer; fileName: string; mediaType: string }> {
    const row = await this.issued(organizationId, projectId, number)
    const file = row.files.find((f) => f.name === name)
    if (!file) throw notFound(`File ${name} of revision ${number}`)
    return { bytes: await this.stored(file.sha256), fileName: file.name, mediaType: file.mediaType }
  }

  private async pair(organizationId: string, projectId: string, from: number, to: number) {
    if (from === to) throw unprocessable('Compare two different revisions', [{ field: 'to', message: 'must differ from from' }])
    const [a, b] = [await this.revision(organizationId, projectId, from), await this.revision(organizationId, projectId, to)]
    const side = (r: PlanSetRevision) => ({ number: r.number, doc: r.designSnapshot, evaluation: r.evaluation })
    return { a, b, diff: diffRevisions(side(a), side(b)) }
  }

  async compare(organizationId: string, projectId: string, from: number, to: number): Promise<RevisionDiff> {
    return (await this.pair(organizationId, projectId, from, to)).diff
  }

  /** The difference report as a one-sheet PDF in the frame of the later revision. */
  async narrativePdf(organizationId: string, projectId: string, from: number, to: number): Promise<{ bytes: Buffer; fileName: string }> {
    const { a, b, diff } = await this.pair(organizationId, projectId, from, to)
    const later = a.number > b.number ? a : b
    const earlier = await this.db.getRepository(PlanSetRevisionEntity).find({ where: { projectId, organizationId }, order: { number: 'ASC' } })
    const person = await peopleById(this.db.manager, [later.createdBy])
    const ctx = planSetContext(later.designSnapshot, {
      size: later.sheetSize as SheetSizeName,
      revisions: earlier.filter((r) => r.number <= later.number).map((r) => ({ number: r.number, date: r.createdAt.toISOString().slice(0, 10), description: r.description })),
      preparedBy: person(later.createdBy)?.name ?? later.designSnapshot.project.installer,
    })
    const bytes = await revisionNarrativePdf(ctx, diff)
    return { bytes: Buffer.from(bytes), fileName: `${later.designSnapshot.project.code}_changes_rev${String(a.number).padStart(2, '0')}-rev${String(b.number).padStart(2, '0')}.pdf` }
  }
}
