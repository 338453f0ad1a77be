import type { Page } from '@shared/schemas/paging'
import type {
  BOARD_SORTS,
  BOARD_STATUSES,
  BoardRowDto,
  DueItemDto,
  ProjectSubmissionDto,
  SubmissionFileDto,
  UpdateSubmissionBody,
} from '@shared/schemas/submission'
import { todayIso } from '@/format/dates'
import { api } from './client'
import { downloadFile, uploadFile, type ProgressListener } from './transfer'

/** A change to the paperwork between steps; the version read goes with it. */
export type SubmissionChange = Omit<UpdateSubmissionBody, 'version'>
export type BoardStatus = (typeof BOARD_STATUSES)[number]
export type BoardSort = (typeof BOARD_SORTS)[number]

/** What the submission board (and its CSV) is asked for; empty values are left out. */
export interface BoardFilter {
  page?: number
  pageSize?: number
  sort?: BoardSort
  q?: string
  status?: readonly BoardStatus[]
  jurisdictionId?: string
  dueBefore?: string
}

/** The board's query string: `status` repeats once per status, which the shared client's single-valued query cannot do. */
function boardSearch(filter: BoardFilter): string {
  const params = new URLSearchParams()
  const single = { page: filter.page, pageSize: filter.pageSize, sort: filter.sort, q: filter.q }
  for (const [key, value] of Object.entries(single)) if (value !== undefined && value !== '') params.set(key, String(value))
  for (const status of filter.status ?? []) params.append('status', status)
  if (filter.jurisdictionId) params.set('jurisdictionId', filter.jurisdictionId)
  if (filter.dueBefore) params.set('dueBefore', filter.dueBefore)
  const search = params.toString()
  return search ? `?${search}` : ''
}

const at = (projectId: string) => `/projects/${encodeURIComponent(projectId)}/submission`

export const submissionsApi = {
  board: (filter: BoardFilter) => api.get<Page<BoardRowDto>>(`/submissions${boardSearch(filter)}`),
  /** Every row of the filtered board (not one page) as a CSV file. */
  downloadBoardCsv: (filter: Omit<BoardFilter, 'page' | 'pageSize'>) =>
    downloadFile(`/submissions.csv${boardSearch(filter)}`, `submissions-${todayIso()}.csv`),
  /** What the caller has to act on soon or is late with. */
  due: () => api.get<{ items: DueItemDto[]; horizonDays: number }>('/submissions/due'),
  ofProject: (projectId: string) => api.get<ProjectSubmissionDto>(at(projectId)),
  /** Paperwork between steps at the version read: 409 when someone changed the submission meanwhile. */
  update: (projectId: string, body: UpdateSubmissionBody) => api.patch<ProjectSubmissionDto>(at(projectId), body),
  /** The AHJ's correction letter (PDF); the record_corrections step names the answer's id. */
  uploadLetter: (projectId: string, file: File, onProgress: ProgressListener) =>
    uploadFile<{ file: SubmissionFileDto }>(`${at(projectId)}/letters`, file, {}, onProgress).then((answer) => answer.file),
  /** A fee receipt (PDF, PNG or JPEG); the submission names it by id. */
  uploadReceipt: (projectId: string, file: File, onProgress: ProgressListener) =>
    uploadFile<{ file: SubmissionFileDto }>(`${at(projectId)}/receipt`, file, {}, onProgress).then((answer) => answer.file),
  downloadFile: (projectId: string, file: SubmissionFileDto) =>
    downloadFile(`${at(projectId)}/files/${encodeURIComponent(file.id)}`, file.name),
}
