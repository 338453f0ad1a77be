import type { TimelineDto, TimelineEntryDto, TransitionBody, TransitionResultDto } from '@shared/schemas/workflow'
import { api } from './client'

const at = (projectId: string) => `/projects/${encodeURIComponent(projectId)}`

export const workflowApi = {
  /** One workflow step: 409 when it is not open to the caller now or the version is stale, 422 for an unmet precondition. */
  transition: (projectId: string, body: TransitionBody) => api.post<TransitionResultDto>(`${at(projectId)}/transitions`, body),
  timeline: (projectId: string): Promise<TimelineEntryDto[]> => api.get<TimelineDto>(`${at(projectId)}/timeline`).then((answer) => answer.items),
}
