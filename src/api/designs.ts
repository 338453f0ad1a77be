import type { DesignDocument } from '@shared/schemas/design'
import { api } from './client'
import type { DesignDto, ServerEvaluation } from './types'

const at = (projectId: string) => `/projects/${encodeURIComponent(projectId)}/design`

export const designsApi = {
  get: (projectId: string) => api.get<{ design: DesignDto }>(at(projectId)).then((answer) => answer.design),
  /** `version: null` saves the project's first design. */
  save: (projectId: string, version: number | null, document: DesignDocument) =>
    api.request<{ design: DesignDto }>('PUT', at(projectId), { body: { version, document } }).then((answer) => answer.design),
  evaluate: (projectId: string) => api.post<ServerEvaluation>(`${at(projectId)}/evaluate`),
}
