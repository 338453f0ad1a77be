import type { Evaluation } from '@shared/electrical/evaluate'
import type { DesignDocument, SystemKind } from '@shared/schemas/design'
import type { USER_SORTS as SORTS, UserDto } from '@shared/schemas/auth'

export type { CreateUserBody, LoginBody, UpdateUserBody } from '@shared/schemas/auth'
export { USER_SORTS } from '@shared/schemas/auth'
export type { Page } from '@shared/schemas/paging'

/** A member of an installer organisation, as the API returns it. */
export type User = UserDto
export type UserSort = (typeof SORTS)[number]

/** Answer of sign-in and refresh: a short-lived access token and the signed-in user. */
export interface AuthSession {
  token: string
  user: User
}

export interface UserListQuery {
  page: number
  pageSize: number
  q?: string
  sort?: UserSort
}

export interface FieldError {
  field: string
  message: string
}

/** Shape of every error answer of the API. */
export interface ApiErrorBody {
  error: { code: string; message: string; fields?: FieldError[] }
}

export type { CreateProjectBody, ProjectDto, ProjectListQuery, ProjectStatus, UpdateProjectBody } from '@shared/schemas/project'
export { PROJECT_SORTS, PROJECT_STATUSES } from '@shared/schemas/project'
export type { CreateJurisdictionBody, JurisdictionDto, UpdateJurisdictionBody } from '@shared/schemas/jurisdiction'
export type { CsvImportReport, EquipmentItemBody, EquipmentItemDto, EquipmentKind, FieldWarning } from '@shared/schemas/equipment'
export { EQUIPMENT_KINDS } from '@shared/schemas/equipment'

/** What the projects table asks for; `archived` is left out for the working list. */
export interface ProjectListFilter {
  page: number
  pageSize: number
  q?: string
  sort?: string
  status?: string
  jurisdictionId?: string
  assigneeId?: string
  archived?: boolean
}

export interface JurisdictionListFilter {
  page: number
  pageSize: number
  q?: string
  sort?: string
}

export interface EquipmentListFilter {
  page: number
  pageSize: number
  q?: string
  sort?: string
  kind?: string
}

/** The working design of a project as the API returns it. */
export interface DesignDto {
  projectId: string
  document: DesignDocument
  systemKind: SystemKind
  necEdition: number
  moduleCount: number
  dcWattsStc: number
  lastEvaluation: { status: string; evaluatedAt: string; forVersion: number; current: boolean } | null
  createdAt: string
  updatedAt: string
  version: number
}

/** Answer of `POST /api/projects/:id/design/evaluate`. */
export interface ServerEvaluation {
  designVersion: number
  evaluation: Evaluation
}
