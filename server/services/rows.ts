import { In, type EntityManager, type EntityTarget, type ObjectLiteral, type SelectQueryBuilder } from 'typeorm'
import type { PersonRef } from '../../shared/schemas/project'
import { UserEntity } from '../entities'
import { conflict, notFound, versionConflict, type FieldError } from '../http/errors'

/** Helpers every organisation-owned table shares: id checks, paging and sorting, versioned updates. */

const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

/** Whether `id` can be looked up at all (PostgreSQL refuses a malformed uuid with an error). */
export const isUuid = (id: string) => UUID_PATTERN.test(id)

/** Loads one row of the caller's organisation; a foreign, unknown or malformed id is 404 alike. */
export async function findOwned<E extends ObjectLiteral>(
  manager: EntityManager,
  entity: EntityTarget<E>,
  organizationId: string,
  id: string,
  what: string,
): Promise<E> {
  if (!isUuid(id)) throw notFound(what)
  const row = await manager.getRepository(entity).findOneBy({ id, organizationId } as never)
  if (!row) throw notFound(what)
  return row
}

/** `q` as an ILIKE pattern that matches it literally anywhere. */
export const containsPattern = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`

export interface PageRequest<S extends string> {
  page: number
  pageSize: number
  sort?: S
}

/** The column a sort names (`name` ascending, `-name` descending) by the map of sortable columns. */
export function sortOf(sort: string, columns: Record<string, string>): { column: string; descending: boolean } {
  const descending = sort.startsWith('-')
  const column = columns[descending ? sort.slice(1) : sort]
  if (!column) throw new Error(`no column for sort ${sort}`)
  return { column, descending }
}

/**
 * Sorts (`name` ascending, `-name` descending, by the column the map names; the id breaks ties so
 * pages never overlap), pages and counts a query.
 */
export async function pageOf<E extends ObjectLiteral, S extends string>(
  qb: SelectQueryBuilder<E>,
  request: PageRequest<S>,
  columns: Record<string, string>,
  defaultSort: S,
): Promise<{ rows: E[]; total: number }> {
  const { column, descending } = sortOf(request.sort ?? defaultSort, columns)
  qb.orderBy(column, descending ? 'DESC' : 'ASC', descending ? 'NULLS LAST' : 'NULLS FIRST').addOrderBy(`${qb.alias}.id`, 'ASC')
  qb.skip((request.page - 1) * request.pageSize).take(request.pageSize)
  const [rows, total] = await qb.getManyAndCount()
  return { rows, total }
}

/**
 * Applies `changes` only if the row is still at `version`, in one statement
 * (`UPDATE … WHERE id AND organization_id AND version`); TypeORM adds `version = version + 1` and
 * the update time. When someone saved first, answers 409 with the current row as `toBody` shows it.
 */
export async function updateAtVersion<E extends ObjectLiteral & { version: number }>(
  manager: EntityManager,
  entity: EntityTarget<E>,
  key: { organizationId: string; id: string; version: number },
  changes: Partial<E>,
  what: string,
  toBody: (current: E) => Promise<Record<string, unknown>>,
): Promise<E> {
  if (Object.keys(changes).length === 0) {
    // nothing to change: the row stays as it is, but a stale version is still reported
    const current = await findOwned(manager, entity, key.organizationId, key.id, what)
    if (current.version !== key.version) throw versionConflict(what, current, await toBody(current))
    return current
  }
  const result = await manager
    .createQueryBuilder()
    .update(entity)
    .set(changes as never)
    .where('id = :id AND organization_id = :organizationId AND version = :version', key)
    .execute()
  const current = await findOwned(manager, entity, key.organizationId, key.id, what)
  if (result.affected !== 1) throw versionConflict(what, current, await toBody(current))
  return current
}

/** The unique index an error violated (PostgreSQL 23505), or null for any other error. */
export function violatedUniqueIndex(err: unknown): string | null {
  const e = err as { code?: string; constraint?: string; driverError?: { code?: string; constraint?: string } }
  return (e.driverError?.code ?? e.code) === '23505' ? (e.driverError?.constraint ?? e.constraint ?? null) : null
}

/** Turns a unique-index violation into 409 naming the field; any other error passes through. */
export function rethrowUnique(err: unknown, indexes: Record<string, FieldError>): never {
  const index = violatedUniqueIndex(err)
  const field = index ? indexes[index] : undefined
  if (field) throw conflict(`${field.message}`, [field])
  throw err
}

/** Names of the users among `ids` (one query), as a lookup answering null for none or an unknown id. */
export async function peopleById(manager: EntityManager, ids: readonly (string | null)[]): Promise<(id: string | null) => PersonRef | null> {
  const wanted = [...new Set(ids.filter((id) => id !== null))]
  const users = wanted.length ? await manager.getRepository(UserEntity).find({ select: { id: true, name: true }, where: { id: In(wanted) } }) : []
  return (id) => {
    const u = id ? users.find((x) => x.id === id) : undefined
    return u ? { id: u.id, name: u.name } : null
  }
}
