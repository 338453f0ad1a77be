import { In, type DataSource, type EntityManager } from 'typeorm'
import {
  equipmentItemBody,
  type CsvImportAnswer,
  equipmentWarnings,
  type CsvImportReport,
  type EquipmentItemBody,
  type EquipmentItemDto,
  type EquipmentKind,
  type EquipmentListQuery,
  type UpdateEquipmentBody,
} from '../../shared/schemas/equipment'
import type { Page } from '../../shared/schemas/paging'
import type { AuthUser } from '../auth/auth-user'
import type { AppConfig } from '../config'
import { EquipmentItemEntity, StoredFileEntity, type EquipmentItem, type StoredFile } from '../entities'
import { badRequest, HttpError, notFound, payloadTooLarge, unprocessable, unsupportedMediaType, versionConflict } from '../http/errors'
import { fieldErrors } from '../http/validation'
import type { AuditService } from './audit-service'
import { csvColumns, parseCsv, recordToItem, toCsv } from './equipment-csv'
import { containsPattern, findOwned, pageOf, rethrowUnique, updateAtVersion } from './rows'
import type { IncomingFile, UploadService } from './upload-service'

const SORT_COLUMNS = { manufacturer: 'e.manufacturer', model: 'e.model', kind: 'e.kind', updatedAt: 'e.updated_at' }
const UNIQUE_MODEL = {
  equipment_items_org_kind_model_key: { field: 'model', message: 'The library already has this manufacturer and model for this kind' },
}
const WHAT = 'Equipment item'
const identity = (manufacturer: string, model: string) => `${manufacturer.toLowerCase()}\u0000${model.toLowerCase()}`

export type ImportMode = CsvImportReport['mode']

/** The organisation's equipment library: entry with plausibility warnings, CSV in and out, datasheets. */
export class EquipmentService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly uploads: UploadService,
    private readonly config: Pick<AppConfig, 'csvImportMaxRows'>,
  ) {}

  private body(row: EquipmentItem): EquipmentItemBody {
    return { kind: row.kind, manufacturer: row.manufacturer, model: row.model, notes: row.notes, spec: row.spec } as EquipmentItemBody
  }

  private async toDtos(rows: EquipmentItem[], manager: EntityManager = this.db.manager): Promise<EquipmentItemDto[]> {
    const fileIds = rows.map((r) => r.datasheetFileId).filter((v) => v !== null)
    const files: StoredFile[] = fileIds.length ? await manager.getRepository(StoredFileEntity).findBy({ id: In(fileIds) }) : []
    return rows.map((r) => {
      const file = files.find((f) => f.id === r.datasheetFileId)
      return {
        id: r.id,
        ...this.body(r),
        warnings: equipmentWarnings(this.body(r)),
        datasheet: file ? { fileName: file.originalName, byteSize: file.byteSize, sha256: file.sha256, uploadedAt: file.createdAt.toISOString() } : null,
        createdAt: r.createdAt.toISOString(),
        updatedAt: r.updatedAt.toISOString(),
        version: r.version,
      }
    })
  }

  private async toDto(row: EquipmentItem, manager?: EntityManager): Promise<EquipmentItemDto> {
    return (await this.toDtos([row], manager))[0]!
  }

  private getOwned(organizationId: string, id: string, manager: EntityManager = this.db.manager) {
    return findOwned(manager, EquipmentItemEntity, organizationId, id, WHAT)
  }

  async get(organizationId: string, id: string): Promise<EquipmentItemDto> {
    return this.toDto(await this.getOwned(organizationId, id))
  }

  async list(organizationId: string, query: EquipmentListQuery): Promise<Page<EquipmentItemDto>> {
    const qb = this.db.getRepository(EquipmentItemEntity).createQueryBuilder('e').where('e.organization_id = :organizationId', { organizationId })
    if (query.kind) qb.andWhere('e.kind = :kind', { kind: query.kind })
    if (query.q) qb.andWhere("(e.manufacturer || ' ' || e.model || ' ' || e.notes) ILIKE :pattern", { pattern: containsPattern(query.q) })
    const { rows, total } = await pageOf(qb, query, SORT_COLUMNS, 'manufacturer')
    return { items: await this.toDtos(rows), total, page: query.page, pageSize: query.pageSize }
  }

  async create(actor: AuthUser, body: EquipmentItemBody): Promise<EquipmentItemDto> {
    return this.db.transaction(async (manager) => {
      const row = await manager
        .getRepository(EquipmentItemEntity)
        .save({ organizationId: actor.organizationId, ...body, datasheetFileId: null })
        .catch((err: unknown) => rethrowUnique(err, UNIQUE_MODEL))
      await this.record(manager, actor, 'equipment.created', row.id, { kind: row.kind, model: row.model })
      return this.toDto(row, manager)
    })
  }

  /** Replaces an item's fields; its kind stays what it was (422 otherwise). */
  async update(actor: AuthUser, id: string, body: UpdateEquipmentBody): Promise<EquipmentItemDto> {
    const { version, kind, manufacturer, model, notes, spec } = body
    return this.db.transaction(async (manager) => {
      const before = await this.getOwned(actor.organizationId, id, manager)
      if (kind !== before.kind) throw unprocessable('An item cannot change its kind; add a new item instead', [{ field: 'kind', message: `must stay ${before.kind}` }])
      const row = await updateAtVersion(manager, EquipmentItemEntity, { organizationId: actor.organizationId, id, version }, { manufacturer, model, notes, spec }, WHAT, async (current) => ({
        current: await this.toDto(current, manager),
      })).catch((err: unknown) => rethrowUnique(err, UNIQUE_MODEL))
      await this.record(manager, actor, 'equipment.updated', id, { kind, model })
      return this.toDto(row, manager)
    })
  }

  /** Removes an item; designs keep their own copies of equipment, so none of them change. */
  async remove(actor: AuthUser, id: string, version: number): Promise<void> {
    await this.db.transaction(async (manager) => {
      const row = await this.getOwned(actor.organizationId, id, manager)
      const result = await manager.getRepository(EquipmentItemEntity).delete({ id, organizationId: actor.organizationId, version })
      if (result.affected !== 1) throw versionConflict(WHAT, row, { current: await this.toDto(row, manager) })
      await this.record(manager, actor, 'equipment.deleted', id, { kind: row.kind, model: row.model })
    })
  }

  /** Every item of one kind as CSV, in the format `importCsv` reads. */
  async exportCsv(organizationId: string, kind: EquipmentKind): Promise<string> {
    const rows = await this.db.getRepository(EquipmentItemEntity).find({ where: { organizationId, kind }, order: { manufacturer: 'ASC', model: 'ASC' } })
    return toCsv(kind, rows.map((r) => this.body(r)))
  }

  /**
   * Imports items of one kind from CSV. Every row is checked as a single entry would be, and
   * against the library and the file's other rows for repeats. `all_or_nothing` (the default)
   * imports nothing when any row is rejected (422 with the report); `valid_rows` imports the good
   * rows and reports the rejected ones.
   */
  async importCsv(actor: AuthUser, kind: EquipmentKind, file: IncomingFile | undefined, mode: ImportMode): Promise<CsvImportAnswer> {
    const parsed = parseCsv(this.csvText(file))
    const known = new Set(csvColumns(kind).map((c) => c.name))
    const unknown = parsed.headers.filter((h) => !known.has(h))
    if (unknown.length || !parsed.headers.length) {
      throw unprocessable(`The file's columns do not fit a ${kind} CSV`, [
        { field: 'file', message: unknown.length ? `unknown column(s) ${unknown.join(', ')}; expected ${[...known].join(', ')}` : 'has no header row' },
      ])
    }
    if (parsed.records.length > this.config.csvImportMaxRows) {
      throw payloadTooLarge(`The file has ${parsed.records.length} rows; import at most ${this.config.csvImportMaxRows} at a time`, [{ field: 'file', message: 'has too many rows' }])
    }
    const rejected: CsvImportReport['rejected'] = []
    // spreadsheet numbering: the header is row 1
    const rowNumber = (index: number) => index + 2
    for (const e of parsed.rowErrors) rejected.push({ row: rowNumber(e.index), field: '(row)', message: e.message })
    const badRows = new Set(parsed.rowErrors.map((e) => e.index))

    const existing = await this.db.getRepository(EquipmentItemEntity).find({ select: { manufacturer: true, model: true }, where: { organizationId: actor.organizationId, kind } })
    const taken = new Map(existing.map((e) => [identity(e.manufacturer, e.model), 'the library']))
    const accepted: EquipmentItemBody[] = []
    parsed.records.forEach((record, index) => {
      if (badRows.has(index)) return
      const result = equipmentItemBody.safeParse(recordToItem(kind, record))
      if (!result.success) {
        for (const f of fieldErrors(result.error)) rejected.push({ row: rowNumber(index), field: f.field.replace(/^spec\./, ''), message: f.message })
        return
      }
      const key = identity(result.data.manufacturer, result.data.model)
      const seen = taken.get(key)
      if (seen) {
        rejected.push({ row: rowNumber(index), field: 'model', message: `${result.data.manufacturer} ${result.data.model} is already in ${seen}` })
        return
      }
      taken.set(key, `row ${rowNumber(index)}`)
      accepted.push(result.data)
    })
    rejected.sort((a, b) => a.row - b.row)

    if (mode === 'all_or_nothing' && rejected.length) {
      throw new HttpError(422, 'import_rejected', `${rejected.length} problem(s) in the file; nothing was imported`, undefined, {
        report: { mode, imported: 0, rejected } satisfies CsvImportReport,
      })
    }
    return this.db.transaction(async (manager) => {
      const rows = accepted.length
        ? await manager
            .getRepository(EquipmentItemEntity)
            .save(accepted.map((a) => ({ organizationId: actor.organizationId, ...a, datasheetFileId: null })))
            .catch((err: unknown) => rethrowUnique(err, UNIQUE_MODEL))
        : []
      await this.record(manager, actor, 'equipment.imported', null, { kind, imported: rows.length, rejected: rejected.length, mode })
      return { report: { mode, imported: rows.length, rejected }, items: await this.toDtos(rows, manager) }
    })
  }

  /** The upload as UTF-8 text; a binary file or another encoding answers 415. */
  private csvText(file: IncomingFile | undefined): string {
    if (!file || file.buffer.length === 0) throw badRequest('Attach a CSV file', [{ field: 'file', message: 'is required and must not be empty' }])
    try {
      const text = new TextDecoder('utf-8', { fatal: true }).decode(file.buffer)
      // eslint-disable-next-line no-control-regex
      if (/[\u0000-\u0008\u000e-\u001f]/.test(text)) throw new Error('control characters')
      return text
    } catch {
      throw unsupportedMediaType('Only CSV text files (UTF-8) are accepted', [{ field: 'file', message: 'must be CSV text in UTF-8' }])
    }
  }

  /** Attaches a PDF datasheet (checked by content) to an item at the version read. */
  async attachDatasheet(actor: AuthUser, id: string, version: number, file: IncomingFile | undefined): Promise<EquipmentItemDto> {
    return this.db.transaction(async (manager) => {
      await this.getOwned(actor.organizationId, id, manager)
      const stored = await this.uploads.store(actor, file, 'file', 'datasheet', manager)
      const row = await updateAtVersion(manager, EquipmentItemEntity, { organizationId: actor.organizationId, id, version }, { datasheetFileId: stored.id }, WHAT, async (current) => ({
        current: await this.toDto(current, manager),
      }))
      await this.record(manager, actor, 'equipment.datasheet_attached', id, { sha256: stored.sha256, fileName: stored.originalName })
      return this.toDto(row, manager)
    })
  }

  async datasheet(organizationId: string, id: string): Promise<{ fileName: string; mediaType: string; bytes: Buffer }> {
    const item = await this.getOwned(organizationId, id)
    if (!item.datasheetFileId) throw notFound('Datasheet of this item')
    const { file, bytes } = await this.uploads.read(organizationId, item.datasheetFileId)
    return { fileName: file.originalName, mediaType: file.mediaType, bytes }
  }

  private record(manager: EntityManager, actor: AuthUser, action: string, entityId: string | null, data: Record<string, unknown>) {
    return this.audit.record({ organizationId: actor.organizationId, actorId: actor.id, action, entityType: 'equipment_item', entityId, data }, manager)
  }
}
