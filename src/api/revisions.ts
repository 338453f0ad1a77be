import type { z } from 'zod'
import type { PackageJobDto, RevisionDiff, RevisionDto, revisionListDto } from '@shared/schemas/revision'
import { api } from './client'
import { downloadFile, fetchBlob } from './transfer'

export type RevisionList = z.infer<typeof revisionListDto>

const at = (projectId: string) => `/projects/${encodeURIComponent(projectId)}`
const revisionAt = (projectId: string, number: number) => `${at(projectId)}/revisions/${number}`

export const revisionsApi = {
  list: (projectId: string) => api.get<RevisionList>(`${at(projectId)}/revisions`),
  /** Queues a generation; 409 while another runs, 422 when the design cannot be issued. */
  generate: (projectId: string, description: string) =>
    api.post<{ job: PackageJobDto }>(`${at(projectId)}/revisions`, { description }).then((answer) => answer.job),
  job: (projectId: string, jobId: string) =>
    api.get<{ job: PackageJobDto }>(`${at(projectId)}/package-jobs/${encodeURIComponent(jobId)}`).then((answer) => answer.job),
  retry: (projectId: string, jobId: string) =>
    api.post<{ job: PackageJobDto }>(`${at(projectId)}/package-jobs/${encodeURIComponent(jobId)}/retry`).then((answer) => answer.job),
  compare: (projectId: string, from: number, to: number) =>
    api.get<{ diff: RevisionDiff }>(`${at(projectId)}/revisions/compare`, { from, to }).then((answer) => answer.diff),
  fileBlob: (projectId: string, number: number, name: string, mediaType: string) =>
    fetchBlob(`${revisionAt(projectId, number)}/files/${encodeURIComponent(name)}`, mediaType),
  downloadPackage: (projectId: string, revision: RevisionDto) =>
    downloadFile(`${revisionAt(projectId, revision.number)}/package`, revision.packageName),
  downloadFile: (projectId: string, number: number, name: string) =>
    downloadFile(`${revisionAt(projectId, number)}/files/${encodeURIComponent(name)}`, name),
  downloadNarrative: (projectId: string, from: number, to: number, fileName: string) =>
    downloadFile(`${at(projectId)}/revisions/compare/narrative.pdf?from=${from}&to=${to}`, fileName),
}
