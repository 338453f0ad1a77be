import type { DataSource, EntityManager } from 'typeorm'
import { AuditEventEntity, type AuditEvent } from '../entities'
import type { Page } from '../../shared/schemas/paging'

export interface AuditEntry {
  organizationId: string
  actorId: string | null
  action: string
  entityType: string
  entityId?: string | null
  fromState?: string | null
  toState?: string | null
  note?: string | null
  data?: Record<string, unknown>
}

/** Writes and reads the audit log. Writers pass their transaction's manager so both commit together. */
export class AuditService {
  constructor(private readonly db: DataSource) {}

  async record(entry: AuditEntry, manager: EntityManager = this.db.manager): Promise<void> {
    await manager.getRepository(AuditEventEntity).save({
      organizationId: entry.organizationId,
      actorId: entry.actorId,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId ?? null,
      fromState: entry.fromState ?? null,
      toState: entry.toState ?? null,
      note: entry.note ?? null,
      data: entry.data ?? {},
    })
  }

  async list(organizationId: string, page: number, pageSize: number): Promise<Page<AuditEvent>> {
    const [items, total] = await this.db.getRepository(AuditEventEntity).findAndCount({
      where: { organizationId },
      order: { createdAt: 'DESC' },
      skip: (page - 1) * pageSize,
      take: pageSize,
    })
    return { items, total, page, pageSize }
  }
}
