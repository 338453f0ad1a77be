import { z } from 'zod'
import { createProjectBody } from '@shared/schemas/project'
import { api } from './client'
import type { CreateProjectBody, Page, ProjectDto, ProjectListFilter, UpdateProjectBody } from './types'

const at = (id: string) => `/projects/${encodeURIComponent(id)}`

export const projectsApi = {
  list: (query: ProjectListFilter) => api.get<Page<ProjectDto>>('/projects', { ...query }),
  get: (id: string) => api.get<{ project: ProjectDto }>(at(id)).then((answer) => answer.project),
  create: (body: CreateProjectBody) => api.post<{ project: ProjectDto }>('/projects', body).then((answer) => answer.project),
  update: (id: string, body: UpdateProjectBody) => api.patch<{ project: ProjectDto }>(at(id), body).then((answer) => answer.project),
  archive: (id: string, version: number) =>
    api.post<{ project: ProjectDto }>(`${at(id)}/archive`, { version }).then((answer) => answer.project),
  restore: (id: string, version: number) =>
    api.post<{ project: ProjectDto }>(`${at(id)}/restore`, { version }).then((answer) => answer.project),
}

/** Form fields left empty mean "not given": the API takes null for them. */
const OPTIONAL_FIELDS = ['customerEmail', 'customerPhone', 'jurisdictionId', 'utility', 'designerId', 'reviewerId', 'coordinatorId', 'targetSubmissionDate']

function blanksToNull(value: unknown): unknown {
  if (typeof value !== 'object' || value === null) return value
  return Object.fromEntries(Object.entries(value).map(([key, v]) => [key, OPTIONAL_FIELDS.includes(key) && (v === '' || v === undefined) ? null : v]))
}

/** The new-project form, checked as the user types with the API's own schema. */
export const createProjectForm = z.preprocess(blanksToNull, createProjectBody)
