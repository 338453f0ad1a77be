import Papa from 'papaparse'
import { SAFETY_CAUTION } from '../../shared/electrical/caution'
import type { DataSource, EntityManager } from 'typeorm'
import { STATUS_LABELS } from '../../shared/workflow'
import {
  BOARD_STATUSES,
  DUE_SOON_DAYS,
  PAPERWORK_ACTIONS,
  SUBMISSION_METHOD_LABELS,
  SUBMISSION_STEP_DETAILS,
  type BoardRowDto,
  type DueItemDto,
  type DueItemKind,
  type PaperworkAction,
  type ProjectSubmissionDto,
  type RecordCorrectionsDetails,
  type RecordPermitDetails,
  type RecordResubmittalDetails,
  type RecordSubmissionDetails,
  type SubmissionBoardQuery,
  type SubmissionDto,
  type SubmissionFileDto,
  type UpdateSubmissionBody,
} from '../../shared/schemas/submission'
import type { Page } from '../../shared/schemas/paging'
import type { AuthUser } from '../auth/auth-user'
import { CorrectionLetterEntity, RevisionStampEntity, StoredFileEntity, SubmissionEntity, type CorrectionLetter, type StoredFile, type Submission } from '../entities'
import { conflict, notFound, unprocessable, versionConflict, type FieldError } from '../http/errors'
import { fieldErrors } from '../http/validation'
import type { AuditService } from './audit-service'
import type { ProjectService } from './project-service'
import { containsPattern, updateAtVersion } from './rows'
import type { IncomingFile, UploadService } from './upload-service'
import type { StepContext, WorkflowService } from './workflow-service'
import { utcDay } from '../calendar'

const WHAT = 'Submission'

/** `12345` cents as people read it: `123.45`, thousands grouped (`1,234.50`). */
const formatCents = (cents: number) => (cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 })
/** `1234.5` as typed → 123450 cents, without floating-point rounding. */
const toCents = (amount: string) => {
  const [whole, fraction = ''] = amount.split('.')
  return Number(whole) * 100 + Number(fraction.padEnd(2, '0'))
}

const daysAfter = (isoDate: string, days: number) => utcDay(new Date(Date.parse(`${isoDate}T00:00:00Z`) + days * 86_400_000))

/** Dates of things that already happened cannot lie ahead of today. */
function notAfterToday(today: string, dates: Record<string, string | undefined>): FieldError[] {
  return Object.entries(dates)
    .filter(([, value]) => value !== undefined && value > today)
    .map(([field, value]) => ({ field: `submission.${field}`, message: `${value} is after today (${today}); record it when it has happened` }))
}

interface DueRow { project_id: string; code: string; name: string; jurisdiction: string | null; kind: DueItemKind; due_on: string; open_items: number | null; fee_cents: number | null; permit_number: string | null }

function dueSummary(row: DueRow): string {
  switch (row.kind) {
    case 'corrections_response':
      return `Answer the AHJ’s corrections (${row.open_items ?? 0} open item${row.open_items === 1 ? '' : 's'}) and resubmit`
    case 'fee_payment':
      return `Pay the permit fee of ${formatCents(row.fee_cents ?? 0)}`
    case 'inspection':
      return `Inspection under permit ${row.permit_number ?? ''}`.trim()
    case 'permit_expiry':
      return `Permit ${row.permit_number ?? ''} expires`.replace('  ', ' ')
  }
}

const BOARD_SORT_COLUMNS: Record<string, string> = {
  code: 'p.code', name: 'p.name', status: 'p.status', nextDueOn: 'due.next_due', submittedOn: 'cur.submitted_on',
}

/** One board row as SQL answers it. */
interface BoardRow {
  id: string; code: string; name: string; status: BoardRowDto['project']['status']; jurisdiction_id: string | null; jurisdiction_name: string | null
  method: Submission['method'] | null; submitted_on: string | null; ahj_reference: string | null; permit_number: string | null
  open_items: number; next_due: string | null; total: string
}

export const BOARD_CSV_COLUMNS = ['Project code', 'Project', 'Status', 'Jurisdiction', 'Method', 'Submitted on', 'AHJ reference', 'Permit number', 'Open correction items', 'Next due', 'Overdue'] as const

/**
 * The submission to the AHJ: the paperwork steps of the workflow record how and when the set went
 * in, the AHJ's correction letters and their items, resubmittals and the permit; between steps the
 * coordinator keeps fees, receipts and dates. The board, its CSV, the home page's reminders and the
 * daily digest read what is due from one database view (submission_due_items).
 */
export class SubmissionService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly projects: ProjectService,
    private readonly uploads: UploadService,
    workflow: WorkflowService,
    private readonly today: () => string = utcDay,
  ) {
    for (const action of PAPERWORK_ACTIONS) {
      workflow.onGuard(action, async (_manager, step) => void this.details(action, step))
      workflow.onStep(action, { apply: (manager, step) => this.applyStep(manager, action, step, step.transitionId) })
    }
  }

  /** The step's details checked for its action: 422 naming `submission.<field>`. */
  private details(action: PaperworkAction, step: StepContext) {
    if (step.body.submission === undefined) {
      const wanted = Object.keys(SUBMISSION_STEP_DETAILS[action].shape).join(', ')
      throw unprocessable(`This step records its details: ${wanted}`, [{ field: 'submission', message: `is required for ${action}` }])
    }
    const parsed = SUBMISSION_STEP_DETAILS[action].safeParse(step.body.submission)
    if (!parsed.success) {
      const fields = fieldErrors(parsed.error).map((f) => ({ field: `submission.${f.field}`, message: f.message }))
      throw unprocessable('The submission details are incomplete or wrong', fields)
    }
    const d = parsed.data as Partial<RecordSubmissionDetails & RecordCorrectionsDetails & RecordResubmittalDetails & RecordPermitDetails>
    const problems = notAfterToday(this.today(), { submittedOn: d.submittedOn, receivedOn: d.receivedOn, resubmittedOn: d.resubmittedOn, issuedOn: d.issuedOn })
    if (d.receivedOn && d.responseDueOn && d.responseDueOn < d.receivedOn) problems.push({ field: 'submission.responseDueOn', message: 'must not be before the letter was received' })
    if (d.issuedOn && d.expiresOn && d.expiresOn <= d.issuedOn) problems.push({ field: 'submission.expiresOn', message: 'must be after the permit was issued' })
    if (problems.length) throw unprocessable('Some dates of the step do not add up', problems)
    return parsed.data
  }

  /** The submission the project is on now: its newest. */
  private current(manager: EntityManager, projectId: string): Promise<Submission | null> {
    return manager.getRepository(SubmissionEntity).findOne({ where: { projectId }, order: { createdAt: 'DESC', id: 'ASC' } })
  }

  private async applyStep(manager: EntityManager, action: PaperworkAction, step: StepContext, transitionId: string): Promise<void> {
    const { actor, project, revision } = step
    const details = this.details(action, step)
    if (action === 'record_submission') {
      const d = details as RecordSubmissionDetails
      if (!revision || !(await manager.getRepository(RevisionStampEntity).existsBy({ revisionId: revision.id }))) {
        throw conflict('The revision in the workflow carries no stamp; only a stamped plan set goes to the AHJ')
      }
      if (await manager.getRepository(SubmissionEntity).existsBy({ projectId: project.id, revisionId: revision.id })) {
        throw conflict(`Revision ${revision.number} has already been submitted`)
      }
      await manager.getRepository(SubmissionEntity).insert({
        organizationId: actor.organizationId, projectId: project.id, revisionId: revision.id, method: d.method, submittedOn: d.submittedOn,
        ahjReference: d.ahjReference ?? null, feeCents: d.feeAmount ? toCents(d.feeAmount) : null, feeDueOn: d.feeDueOn ?? null,
        feePaidOn: null, feeReceiptFileId: null, permitNumber: null, permitIssuedOn: null, permitExpiresOn: null, inspectionOn: null, submittedTransitionId: transitionId,
      })
      return
    }
    const submission = await this.current(manager, project.id)
    if (!submission) throw conflict('No submission to the AHJ is recorded for this project; record the submission first')
    const letters = manager.getRepository(CorrectionLetterEntity)
    const open = await letters.findOne({ where: { submissionId: submission.id }, order: { round: 'DESC' } })
    if (action === 'record_corrections') {
      const d = details as RecordCorrectionsDetails
      await this.letterFile(manager, actor.organizationId, d.letterFileId)
      await letters.insert({
        organizationId: actor.organizationId, submissionId: submission.id, round: (open?.round ?? 0) + 1, receivedOn: d.receivedOn, responseDueOn: d.responseDueOn,
        letterFileId: d.letterFileId, items: d.items.map((text) => ({ text, done: false })), resubmittedOn: null, transitionId,
      })
    } else if (action === 'record_resubmittal') {
      const d = details as RecordResubmittalDetails
      if (!open || open.resubmittedOn) throw conflict('No correction letter is waiting for a resubmittal')
      if (d.resubmittedOn < open.receivedOn) throw unprocessable('The resubmittal cannot come before the letter it answers', [{ field: 'submission.resubmittedOn', message: `must be on or after ${open.receivedOn}` }])
      await letters.update({ id: open.id }, { resubmittedOn: d.resubmittedOn })
    } else {
      const d = details as RecordPermitDetails
      if (d.issuedOn < submission.submittedOn) throw unprocessable('A permit cannot be issued before the set was submitted', [{ field: 'submission.issuedOn', message: `must be on or after ${submission.submittedOn}` }])
      await manager.getRepository(SubmissionEntity).update(
        { id: submission.id },
        { permitNumber: d.permitNumber, permitIssuedOn: d.issuedOn, permitExpiresOn: d.expiresOn ?? null, inspectionOn: d.inspectionOn ?? null },
      )
    }
  }

  /** An uploaded correction letter of the organisation (422 naming the field otherwise). */
  private async letterFile(manager: EntityManager, organizationId: string, fileId: string): Promise<StoredFile> {
    const file = await manager.getRepository(StoredFileEntity).findOneBy({ id: fileId, organizationId })
    if (!file || file.mediaType !== 'application/pdf') {
      throw unprocessable('Upload the correction letter first and name the file it answers', [{ field: 'submission.letterFileId', message: 'is not an uploaded PDF of this organisation' }])
    }
    return file
  }

  /** Stores a correction letter (PDF) or a fee receipt (PDF, PNG, JPEG) for the project's submission. */
  async upload(actor: AuthUser, projectId: string, use: 'correctionLetter' | 'feeReceipt', file: IncomingFile | undefined): Promise<{ file: SubmissionFileDto }> {
    await this.projects.getOwned(actor.organizationId, projectId)
    const stored = await this.uploads.store(actor, file, 'file', use)
    await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: `submission.${use}_uploaded`, entityType: 'project', entityId: projectId, data: { fileId: stored.id, sha256: stored.sha256 } })
    return { file: this.fileDto(stored) }
  }

  private fileDto(f: StoredFile): SubmissionFileDto {
    return { id: f.id, name: f.originalName, mediaType: f.mediaType, byteSize: f.byteSize }
  }

  private async dtos(manager: EntityManager, rows: Submission[]): Promise<SubmissionDto[]> {
    if (!rows.length) return []
    const letters = await manager.getRepository(CorrectionLetterEntity).createQueryBuilder('l').where('l.submission_id IN (:...ids)', { ids: rows.map((r) => r.id) }).orderBy('l.round', 'ASC').getMany()
    const fileIds = [...rows.map((r) => r.feeReceiptFileId), ...letters.map((l) => l.letterFileId)].filter((id): id is string => id !== null)
    const files = fileIds.length ? await manager.getRepository(StoredFileEntity).createQueryBuilder('f').where('f.id IN (:...ids)', { ids: fileIds }).getMany() : []
    const file = (id: string) => this.fileDto(files.find((f) => f.id === id)!)
    const revisions: { id: string; number: number }[] = await manager.query(`SELECT id, number FROM plan_set_revisions WHERE id = ANY($1)`, [rows.map((r) => r.revisionId)])
    return rows.map((s) => ({
      id: s.id,
      projectId: s.projectId,
      revision: revisions.find((r) => r.id === s.revisionId)!,
      method: s.method,
      submittedOn: s.submittedOn,
      ahjReference: s.ahjReference,
      feeCents: s.feeCents,
      feeAmount: s.feeCents === null ? null : formatCents(s.feeCents),
      feeDueOn: s.feeDueOn,
      feePaidOn: s.feePaidOn,
      feeReceipt: s.feeReceiptFileId ? file(s.feeReceiptFileId) : null,
      letters: letters.filter((l) => l.submissionId === s.id).map((l: CorrectionLetter) => ({
        id: l.id, round: l.round, receivedOn: l.receivedOn, responseDueOn: l.responseDueOn, letter: file(l.letterFileId), items: l.items, resubmittedOn: l.resubmittedOn,
      })),
      permitNumber: s.permitNumber,
      permitIssuedOn: s.permitIssuedOn,
      permitExpiresOn: s.permitExpiresOn,
      inspectionOn: s.inspectionOn,
      createdAt: s.createdAt.toISOString(),
      updatedAt: s.updatedAt.toISOString(),
      version: s.version,
    }))
  }

  /** The project's current submission, the earlier ones (of revisions stamped before), and what is due on it. */
  async ofProject(organizationId: string, projectId: string): Promise<ProjectSubmissionDto> {
    await this.projects.getOwned(organizationId, projectId)
    const rows = await this.db.getRepository(SubmissionEntity).find({ where: { projectId, organizationId }, order: { createdAt: 'DESC', id: 'ASC' } })
    const [current, ...earlier] = await this.dtos(this.db.manager, rows)
    // every date still ahead on this project, however far
    const due = (await this.dueItems(organizationId, this.today(), 3650)).filter((d) => d.projectId === projectId)
    return { submission: current ?? null, earlier, due }
  }

  /** Paperwork between steps, at the version read: fees, receipt, expiry, inspection, ticked correction items. */
  async update(actor: AuthUser, projectId: string, body: UpdateSubmissionBody): Promise<ProjectSubmissionDto> {
    await this.db.transaction(async (manager) => {
      const project = await this.projects.getOwned(actor.organizationId, projectId, manager)
      const submission = await this.current(manager, project.id)
      if (!submission) throw conflict('No submission to the AHJ is recorded for this project yet')
      if (submission.version !== body.version) throw versionConflict(WHAT, submission, { current: (await this.dtos(manager, [submission]))[0] })
      const { version: _version, correctionItems, feeAmount, feeReceiptFileId, ...dates } = body
      const next = { ...submission, ...dates, ...(feeAmount !== undefined ? { feeCents: feeAmount === null ? null : toCents(feeAmount) } : {}) }
      const problems: FieldError[] = []
      if (next.feePaidOn && next.feePaidOn > this.today()) problems.push({ field: 'feePaidOn', message: `is after today (${this.today()})` })
      if (next.feePaidOn && next.feeCents === null) problems.push({ field: 'feePaidOn', message: 'needs a fee amount' })
      if (next.permitExpiresOn && !next.permitIssuedOn) problems.push({ field: 'permitExpiresOn', message: 'needs the permit recorded first' })
      if (next.permitExpiresOn && next.permitIssuedOn && next.permitExpiresOn <= next.permitIssuedOn) problems.push({ field: 'permitExpiresOn', message: `must be after the issue date ${next.permitIssuedOn}` })
      if (feeReceiptFileId) {
        const receipt = await manager.getRepository(StoredFileEntity).findOneBy({ id: feeReceiptFileId, organizationId: actor.organizationId })
        if (!receipt) problems.push({ field: 'feeReceiptFileId', message: 'is not an uploaded file of this organisation' })
      }
      if (problems.length) throw unprocessable('Some submission details do not add up', problems)

      const letters = manager.getRepository(CorrectionLetterEntity)
      for (const tick of correctionItems ?? []) {
        const letter = await letters.findOneBy({ id: tick.letterId, submissionId: submission.id })
        if (!letter || !letter.items[tick.index]) throw unprocessable('No such correction item on this submission', [{ field: 'correctionItems', message: `letter ${tick.letterId} has no item ${tick.index}` }])
        letter.items[tick.index]!.done = tick.done
        await letters.update({ id: letter.id }, { items: letter.items })
      }
      const changes: Partial<Submission> = {
        ahjReference: next.ahjReference, feeCents: next.feeCents, feeDueOn: next.feeDueOn, feePaidOn: next.feePaidOn, permitExpiresOn: next.permitExpiresOn,
        inspectionOn: next.inspectionOn, ...(feeReceiptFileId !== undefined ? { feeReceiptFileId } : {}),
      }
      await updateAtVersion(manager, SubmissionEntity, { organizationId: actor.organizationId, id: submission.id, version: body.version }, changes, WHAT, async (current) => ({
        current: (await this.dtos(manager, [current]))[0],
      }))
      await this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action: 'submission.updated', entityType: 'project', entityId: projectId, data: { submissionId: submission.id, changes: { ...changes, correctionItems } } }, manager)
    })
    return this.ofProject(actor.organizationId, projectId)
  }

  /** A file of the project's submissions (letter or receipt), for download; anything else is 404. */
  async file(organizationId: string, projectId: string, fileId: string): Promise<{ bytes: Buffer; file: StoredFile }> {
    await this.projects.getOwned(organizationId, projectId)
    const used: { n: number }[] = await this.db.query(
      `SELECT count(*)::int AS n FROM submissions s LEFT JOIN correction_letters l ON l.submission_id = s.id
        WHERE s.project_id = $1 AND s.organization_id = $2 AND (s.fee_receipt_file_id::text = $3 OR l.letter_file_id::text = $3)`,
      [projectId, organizationId, fileId],
    )
    if (!used[0]?.n) throw notFound('File of this submission')
    const { file, bytes } = await this.uploads.read(organizationId, fileId)
    return { file, bytes }
  }

  /** What is due on or before `today + horizonDays` (overdue included), soonest first. */
  async dueItems(organizationId: string, today: string, horizonDays: number = DUE_SOON_DAYS, coordinatorId?: string): Promise<DueItemDto[]> {
    const rows: DueRow[] = await this.db.query(
      `SELECT d.project_id, p.code, p.name, j.name AS jurisdiction, d.kind, d.due_on::text AS due_on, d.open_items, d.fee_cents, d.permit_number
         FROM submission_due_items d JOIN projects p ON p.id = d.project_id LEFT JOIN jurisdiction_profiles j ON j.id = p.jurisdiction_id
        WHERE d.organization_id = $1 AND d.due_on <= $2::date AND ($3::uuid IS NULL OR p.coordinator_id = $3::uuid OR p.coordinator_id IS NULL)
        ORDER BY d.due_on, p.code, d.kind`,
      [organizationId, daysAfter(today, horizonDays), coordinatorId ?? null],
    )
    return rows.map((r) => ({
      projectId: r.project_id, projectCode: r.code, projectName: r.name, jurisdiction: r.jurisdiction, kind: r.kind, summary: dueSummary(r), dueOn: r.due_on, overdue: r.due_on < today,
    }))
  }

  /** The caller's reminders for the home page: a coordinator's own projects and unassigned ones; an administrator's all. */
  async myDueItems(actor: AuthUser): Promise<{ items: DueItemDto[]; horizonDays: number }> {
    return { items: await this.dueItems(actor.organizationId, this.today(), DUE_SOON_DAYS, actor.role === 'coordinator' ? actor.id : undefined), horizonDays: DUE_SOON_DAYS }
  }

  private async boardRows(organizationId: string, query: SubmissionBoardQuery, paged: boolean): Promise<{ rows: BoardRow[]; total: number }> {
    const params: unknown[] = [organizationId, query.status ?? [...BOARD_STATUSES]]
    const where = ['p.organization_id = $1', 'p.archived_at IS NULL', 'p.status = ANY($2)']
    if (query.jurisdictionId) where.push(`p.jurisdiction_id = $${params.push(query.jurisdictionId)}`)
    if (query.dueBefore) where.push(`due.next_due <= $${params.push(query.dueBefore)}::date`)
    if (query.q) {
      const n = params.push(containsPattern(query.q))
      where.push(`(p.code ILIKE $${n} OR p.name ILIKE $${n} OR cur.ahj_reference ILIKE $${n} OR cur.permit_number ILIKE $${n})`)
    }
    const sort = query.sort ?? 'nextDueOn'
    const descending = sort.startsWith('-')
    const column = BOARD_SORT_COLUMNS[descending ? sort.slice(1) : sort]!
    const limit = paged ? `LIMIT $${params.push(query.pageSize)} OFFSET $${params.push((query.page - 1) * query.pageSize)}` : ''
    const rows: BoardRow[] = await this.db.query(
      `WITH cur AS (SELECT DISTINCT ON (project_id) * FROM submissions WHERE organization_id = $1 ORDER BY project_id, created_at DESC, id),
            due AS (SELECT project_id, min(due_on) AS next_due FROM submission_due_items WHERE organization_id = $1 GROUP BY project_id)
       SELECT p.id, p.code, p.name, p.status, j.id AS jurisdiction_id, j.name AS jurisdiction_name,
              cur.method, cur.submitted_on::text AS submitted_on, cur.ahj_reference, cur.permit_number,
              (SELECT count(*)::int FROM correction_letters l, jsonb_array_elements(l.items) i
                WHERE l.submission_id = cur.id AND l.resubmitted_on IS NULL AND NOT (i ->> 'done')::boolean) AS open_items,
              due.next_due::text AS next_due, count(*) OVER () AS total
         FROM projects p
         LEFT JOIN jurisdiction_profiles j ON j.id = p.jurisdiction_id
         LEFT JOIN cur ON cur.project_id = p.id
         LEFT JOIN due ON due.project_id = p.id
        WHERE ${where.join(' AND ')}
        ORDER BY ${column} ${descending ? 'DESC NULLS LAST' : 'ASC NULLS LAST'}, p.code, p.id
        ${limit}`,
      params,
    )
    return { rows, total: rows.length ? Number(rows[0]!.total) : 0 }
  }

  private boardDto(r: BoardRow): BoardRowDto {
    return {
      project: { id: r.id, code: r.code, name: r.name, status: r.status, jurisdiction: r.jurisdiction_id ? { id: r.jurisdiction_id, name: r.jurisdiction_name! } : null },
      submission: r.method && r.submitted_on
        ? { method: r.method, submittedOn: r.submitted_on, ahjReference: r.ahj_reference, permitNumber: r.permit_number, openCorrectionItems: r.open_items }
        : null,
      nextDueOn: r.next_due,
      overdue: r.next_due !== null && r.next_due < this.today(),
    }
  }

  /** Projects from stamped on, paged, filterable by status, jurisdiction, due date and text. */
  async board(organizationId: string, query: SubmissionBoardQuery): Promise<Page<BoardRowDto>> {
    const { rows, total } = await this.boardRows(organizationId, query, true)
    return { items: rows.map((r) => this.boardDto(r)), total, page: query.page, pageSize: query.pageSize }
  }

  /** The whole filtered board as CSV after a caution row (formula-looking cells escaped, as every CSV we write). */
  async boardCsv(organizationId: string, query: SubmissionBoardQuery): Promise<string> {
    const { rows } = await this.boardRows(organizationId, query, false)
    const data = rows.map((r) => this.boardDto(r)).map((b) => [
      b.project.code, b.project.name, STATUS_LABELS[b.project.status], b.project.jurisdiction?.name ?? '', b.submission ? SUBMISSION_METHOD_LABELS[b.submission.method] : '',
      b.submission?.submittedOn ?? '', b.submission?.ahjReference ?? '', b.submission?.permitNumber ?? '', b.submission?.openCorrectionItems ?? 0, b.nextDueOn ?? '', b.overdue ? 'yes' : 'no',
    ])
    // the caution leads, as in every export (the calculations CSV puts it in its first row too)
    const caution = ['Caution', SAFETY_CAUTION, ...BOARD_CSV_COLUMNS.slice(2).map(() => '')]
    return Papa.unparse({ fields: [...BOARD_CSV_COLUMNS], data: [caution, ...data] }, { escapeFormulae: true, newline: '\r\n' })
  }
}
