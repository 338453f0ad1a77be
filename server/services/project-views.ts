import type { EntityManager } from 'typeorm'
import type { Page } from '../../shared/schemas/paging'
import type { ProjectDto, ProjectListQuery } from '../../shared/schemas/project'
import { preparedQuery } from '../db/prepared'
import { containsPattern, sortOf } from './rows'

/**
 * Projects as the API shows them (names of the jurisdiction and the people, the design's state) in
 * one SQL statement: the list is the most read route, and TypeORM's entity loading plus a query
 * per lookup was most of its cost.
 */

const SORT_COLUMNS = {
  code: 'p.code',
  name: 'p.name',
  customerName: 'p.customer_name',
  status: 'p.status',
  targetSubmissionDate: 'p.target_submission_date',
  createdAt: 'p.created_at',
  updatedAt: 'p.updated_at',
}
const SEARCHED_COLUMNS = ['p.code', 'p.name', 'p.site_address', 'p.site_city', 'p.customer_name']

interface ProjectViewRow {
  id: string
  code: string
  name: string
  customer_name: string
  customer_email: string | null
  customer_phone: string | null
  site_address: string
  site_city: string
  jurisdiction_id: string | null
  jurisdiction_name: string | null
  utility: string | null
  system_kind: ProjectDto['systemKind']
  status: ProjectDto['status']
  designer_id: string | null
  designer_name: string | null
  reviewer_id: string | null
  reviewer_name: string | null
  coordinator_id: string | null
  coordinator_name: string | null
  target_submission_date: string | null
  design_version: number | null
  design_evaluation_status: NonNullable<ProjectDto['design']>['evaluationStatus']
  archived_at: Date | null
  created_at: Date
  updated_at: Date
  version: number
  /** Rows matching the filters before paging (bigint, so pg answers a string). */
  total: string
}

/**
 * `chosen` picks, filters, orders and pages `projects p` (and counts the matches); the joins then
 * run for the chosen rows only. The date goes out as text so pg does not turn it into a local Date.
 */
const viewSql = (chosen: string, order: string) => `
WITH chosen AS (${chosen})
SELECT p.id, p.code, p.name, p.customer_name, p.customer_email, p.customer_phone, p.site_address, p.site_city,
  p.jurisdiction_id, j.name AS jurisdiction_name, p.utility, p.system_kind, p.status,
  p.designer_id, designer.name AS designer_name, p.reviewer_id, reviewer.name AS reviewer_name,
  p.coordinator_id, coordinator.name AS coordinator_name, p.target_submission_date::text AS target_submission_date,
  d.version AS design_version,
  CASE WHEN d.evaluated_version = d.version THEN d.evaluation_status END AS design_evaluation_status,
  p.archived_at, p.created_at, p.updated_at, p.version, p.total
FROM chosen p
LEFT JOIN jurisdiction_profiles j ON j.id = p.jurisdiction_id
LEFT JOIN users designer ON designer.id = p.designer_id
LEFT JOIN users reviewer ON reviewer.id = p.reviewer_id
LEFT JOIN users coordinator ON coordinator.id = p.coordinator_id
LEFT JOIN designs d ON d.project_id = p.id
ORDER BY ${order}`

/** `{ id, name }` of a joined row, or null when there is none. */
const named = (id: string | null, name: string | null) => (id && name !== null ? { id, name } : null)

function toDto(r: ProjectViewRow): ProjectDto {
  return {
    id: r.id,
    code: r.code,
    name: r.name,
    customerName: r.customer_name,
    customerEmail: r.customer_email,
    customerPhone: r.customer_phone,
    siteAddress: r.site_address,
    siteCity: r.site_city,
    jurisdiction: named(r.jurisdiction_id, r.jurisdiction_name),
    utility: r.utility,
    systemKind: r.system_kind,
    status: r.status,
    designer: named(r.designer_id, r.designer_name),
    reviewer: named(r.reviewer_id, r.reviewer_name),
    coordinator: named(r.coordinator_id, r.coordinator_name),
    targetSubmissionDate: r.target_submission_date,
    // a stored evaluation of an older version says nothing about the design as it is now
    design: r.design_version === null ? null : { version: r.design_version, evaluationStatus: r.design_evaluation_status },
    archivedAt: r.archived_at?.toISOString() ?? null,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
    version: r.version,
  }
}

/** One project as the API shows it, or null when the organisation has no project with this id. */
export async function projectView(manager: EntityManager, organizationId: string, id: string): Promise<ProjectDto | null> {
  const chosen = 'SELECT p.*, 1 AS total FROM projects p WHERE p.organization_id = $1 AND p.id = $2'
  const rows = await preparedQuery<ProjectViewRow>(manager, viewSql(chosen, 'p.id'), [organizationId, id])
  return rows[0] ? toDto(rows[0]) : null
}

/** A page of the organisation's projects, filtered and sorted as the list query asks. */
export async function projectPage(manager: EntityManager, organizationId: string, query: ProjectListQuery): Promise<Page<ProjectDto>> {
  const params: unknown[] = [organizationId]
  const param = (value: unknown) => `$${params.push(value)}`
  const conditions = ['p.organization_id = $1', query.archived ? 'p.archived_at IS NOT NULL' : 'p.archived_at IS NULL']
  if (query.q) {
    const pattern = param(containsPattern(query.q))
    conditions.push(`(${SEARCHED_COLUMNS.map((column) => `${column} ILIKE ${pattern}`).join(' OR ')})`)
  }
  if (query.status) conditions.push(`p.status = ${param(query.status)}`)
  if (query.systemKind) conditions.push(`p.system_kind = ${param(query.systemKind)}`)
  if (query.jurisdictionId) conditions.push(`p.jurisdiction_id = ${param(query.jurisdictionId)}`)
  if (query.assigneeId) conditions.push(`${param(query.assigneeId)}::uuid IN (p.designer_id, p.reviewer_id, p.coordinator_id)`)
  const where = conditions.join(' AND ')
  const filterParams = [...params]
  const { column, descending } = sortOf(query.sort ?? '-updatedAt', SORT_COLUMNS)
  const order = `${column} ${descending ? 'DESC NULLS LAST' : 'ASC NULLS FIRST'}, p.id ASC`
  const chosen = `SELECT p.*, count(*) OVER () AS total FROM projects p WHERE ${where}
    ORDER BY ${order} LIMIT ${param(query.pageSize)} OFFSET ${param((query.page - 1) * query.pageSize)}`
  const rows = await preparedQuery<ProjectViewRow>(manager, viewSql(chosen, order), params)
  // past the last page no row carries the count
  const total = Number(rows[0]?.total ?? (await manager.query(`SELECT count(*) AS total FROM projects p WHERE ${where}`, filterParams))[0].total)
  return { items: rows.map(toDto), total, page: query.page, pageSize: query.pageSize }
}
