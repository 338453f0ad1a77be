import type { Logger } from 'pino'
import { In, type DataSource } from 'typeorm'
import packageJson from '../../package.json'
import { evaluateDesign } from '../../shared/electrical/evaluate'
import { parseDesign, type DesignDocument } from '../../shared/schemas/design'
import type { PackageFileDto, PackageStep } from '../../shared/schemas/revision'
import type { AppConfig } from '../config'
import {
  DesignEntity,
  EquipmentItemEntity,
  JurisdictionProfileEntity,
  PackageJobEntity,
  PlanSetRevisionEntity,
  ProjectEntity,
  StoredFileEntity,
  UserEntity,
  type JurisdictionProfile,
  type PackageJob,
  type Project,
} from '../entities'
import { buildPackage } from '../package/build'
import type { AhjRequirements } from '../render'
import { profileNotes } from '../services/jurisdiction-service'
import type { FileStorage } from '../storage'
import { blockersMessage, generationBlockers } from './readiness'

/** Where the progress bar stands when each step begins [%]. */
const STEP_PROGRESS: Record<PackageStep, number> = {
  queued: 0,
  evaluating: 5,
  drawing: 15,
  attachments: 45,
  labels: 60,
  packing: 75,
  publishing: 90,
  done: 100,
}

/** The profile's notes filled in for this project, one a line, and the label sections it requires. */
function ahjRequirements(profile: JurisdictionProfile, project: Project): AhjRequirements {
  const notes = profileNotes(profile, project)
  return { notes: notes.split('\n').map((l) => l.trim()).filter((l) => l !== ''), requiredLabelSections: profile.requiredLabels }
}

/** A failure that another attempt cannot cure (the design itself is the problem): no retry. */
export class GenerationRefused extends Error {}

/** A retry of pg-boss, as the handler sees it. */
export interface Attempt {
  retryCount: number
  retryLimit: number
}

export interface GeneratorDeps {
  db: DataSource
  storage: FileStorage
  config: Pick<AppConfig, 'faultHangAtStep' | 'stepPauseMs'>
  logger: Logger
}

/** The designer reads this on the failed job: what happened, in words, without a stack trace. */
function reasonInWords(err: unknown): string {
  if (err instanceof GenerationRefused) return err.message
  const detail = err instanceof Error ? err.message : String(err)
  return `The plan set could not be generated (${detail.slice(0, 300)}). Try again; if it keeps failing, report it with this message.`
}

/**
 * One generation: evaluate the stored design, draw and pack the plan set, keep its files in
 * storage and publish the revision in one transaction. Running it again for a published job
 * does nothing more.
 */
export class PlanSetGenerator {
  constructor(private readonly deps: GeneratorDeps) {}

  async run(packageJobId: string, attempt: Attempt): Promise<void> {
    const { db, logger } = this.deps
    const jobs = db.getRepository(PackageJobEntity)
    const job = await jobs.findOneBy({ id: packageJobId })
    // gone, finished or given up: a late or repeated delivery changes nothing
    if (!job || job.state === 'completed' || job.state === 'failed') return
    await jobs
      .createQueryBuilder()
      .update()
      .set({ state: 'running', step: 'evaluating', progress: STEP_PROGRESS.evaluating, error: null, attempts: () => 'attempts + 1' })
      .where('id = :id', { id: job.id })
      .execute()
    try {
      await this.generate(job)
    } catch (err) {
      const final = err instanceof GenerationRefused || attempt.retryCount >= attempt.retryLimit
      logger.warn({ err, packageJobId, attempt: attempt.retryCount + 1, final }, 'plan-set generation failed')
      const reason = reasonInWords(err)
      await jobs.update({ id: job.id, state: 'running' }, final ? { state: 'failed', error: reason } : { state: 'queued', step: 'queued', progress: 0, error: reason })
      if (!final) throw err
    }
  }

  /** After pg-boss gave up on a job (every attempt failed or its worker died each time). */
  async markLost(packageJobId: string): Promise<void> {
    await this.deps.db.getRepository(PackageJobEntity).update(
      { id: packageJobId, state: In(['queued', 'running']) },
      { state: 'failed', error: 'The generation stopped without finishing on every attempt (its worker stopped responding). Try again.' },
    )
  }

  private async step(job: PackageJob, step: PackageStep): Promise<void> {
    await this.deps.db.getRepository(PackageJobEntity).update({ id: job.id, state: 'running' }, { step, progress: STEP_PROGRESS[step] })
    if (this.deps.config.stepPauseMs) await new Promise((resolve) => setTimeout(resolve, this.deps.config.stepPauseMs))
    if (this.deps.config.faultHangAtStep === step) {
      this.deps.logger.warn({ step }, 'fault hook: hanging here (tests only)')
      await new Promise(() => {})
    }
  }

  private async generate(job: PackageJob): Promise<void> {
    const { db, storage } = this.deps
    const project = await db.getRepository(ProjectEntity).findOneByOrFail({ id: job.projectId, organizationId: job.organizationId })
    const design = await db.getRepository(DesignEntity).findOneBy({ projectId: project.id })
    if (!design) throw new GenerationRefused('The project no longer has a design; save one and generate again.')
    const parsed = parseDesign(design.document)
    if (!parsed.ok) throw new GenerationRefused(`The stored design has ${parsed.issues.length} input problem(s), e.g. ${parsed.issues[0]!.field}: ${parsed.issues[0]!.message}`)
    const doc = parsed.value
    const evaluation = evaluateDesign(doc)
    const blockers = generationBlockers(evaluation)
    if (blockers.length) {
      throw new GenerationRefused(`${blockersMessage(blockers)}: ${blockers.slice(0, 3).map((b) => `${b.field} (${b.message})`).join('; ')}`)
    }

    const earlier = await db.getRepository(PlanSetRevisionEntity).find({
      select: { number: true, createdAt: true, description: true },
      where: { projectId: project.id },
      order: { number: 'ASC' },
    })
    const number = earlier.length ? earlier[earlier.length - 1]!.number + 1 : 0
    const created = new Date()
    const isoDate = (d: Date) => d.toISOString().slice(0, 10)
    const revisions = [...earlier.map((r) => ({ number: r.number, date: isoDate(r.createdAt), description: r.description })), { number, date: isoDate(created), description: job.description }]
    const profile = project.jurisdictionId ? await db.getRepository(JurisdictionProfileEntity).findOneBy({ id: project.jurisdictionId }) : null
    const requester = job.requestedBy ? await db.getRepository(UserEntity).findOneBy({ id: job.requestedBy }) : null

    // the builder reports steps as it goes without waiting: the writes run in order behind it
    let reported = Promise.resolve()
    const built = await buildPackage(
      {
        doc,
        evaluation,
        size: profile?.sheetSize ?? 'ANSI_B',
        revisions,
        preparedBy: requester?.name ?? doc.project.installer,
        attachments: await this.datasheets(job.organizationId, doc),
        ahj: profile ? ahjRequirements(profile, project) : undefined,
        revision: number,
        description: job.description,
        created,
        productVersion: packageJson.version,
      },
      (step) => {
        reported = reported.then(() => this.step(job, step))
      },
    )
    await reported
    await this.step(job, 'publishing')
    // content-addressed, written under a temporary name and renamed: a crash here leaves no half file
    const packageSha256 = await storage.put(built.zip)
    const files: PackageFileDto[] = []
    for (const f of built.files) {
      await storage.put(f.bytes)
      files.push({ name: f.name, bytes: f.bytes.length, sha256: f.sha256, mediaType: f.mediaType })
    }

    await db.transaction(async (manager) => {
      await manager.query('SELECT id FROM projects WHERE id = $1 FOR UPDATE', [project.id])
      const current = await manager.getRepository(PackageJobEntity).findOneByOrFail({ id: job.id })
      if (current.revisionId) return
      const rows: { next: number }[] = await manager.query('SELECT COALESCE(MAX(number), -1) + 1 AS next FROM plan_set_revisions WHERE project_id = $1', [project.id])
      // the number is printed on every sheet: a set drawn for another number is drawn again
      if (rows[0]!.next !== number) throw new Error(`revision ${number} was published by another generation meanwhile`)
      const revision = await manager.getRepository(PlanSetRevisionEntity).save({
        organizationId: job.organizationId,
        projectId: project.id,
        number,
        description: job.description,
        designSnapshot: doc,
        designVersion: design.version,
        engineVersion: evaluation.engineVersion,
        necEdition: doc.codeBasis.necEdition,
        evaluation,
        evaluationStatus: evaluation.status,
        sheetSize: profile?.sheetSize ?? 'ANSI_B',
        packageName: built.fileName,
        packageSha256,
        packageBytes: built.zip.length,
        files,
        sheetCount: built.sheetCount,
        stampBoxes: built.stampBoxes,
        createdBy: job.requestedBy,
        createdAt: created,
      })
      await manager.getRepository(PackageJobEntity).update({ id: job.id }, { state: 'completed', step: 'done', progress: 100, error: null, revisionId: revision.id })
    })
  }

  /** Datasheets of library items whose "manufacturer model" is the name of an equipment entry of the design. */
  private async datasheets(organizationId: string, doc: DesignDocument) {
    const names = new Set(Object.values(doc.equipment).flatMap((entries: object[]) => entries.map((e) => ('name' in e ? String(e.name) : ''))))
    const items = await this.deps.db
      .getRepository(EquipmentItemEntity)
      .createQueryBuilder('e')
      .where('e.organization_id = :organizationId AND e.datasheet_file_id IS NOT NULL', { organizationId })
      .orderBy('e.manufacturer')
      .addOrderBy('e.model')
      .getMany()
    const matching = items.filter((i) => names.has(`${i.manufacturer} ${i.model}`))
    if (!matching.length) return []
    const files = await this.deps.db.getRepository(StoredFileEntity).findBy({ id: In(matching.map((i) => i.datasheetFileId!)), organizationId })
    const attachments = []
    for (const item of matching) {
      const file = files.find((f) => f.id === item.datasheetFileId)
      if (file) attachments.push({ equipmentName: `${item.manufacturer} ${item.model}`, fileName: file.originalName, bytes: await this.deps.storage.get(file.sha256) })
    }
    return attachments
  }
}
