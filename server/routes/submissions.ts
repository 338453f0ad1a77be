import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import {
  boardRowDto, dueItemDto, projectSubmissionDto, submissionBoardQuery, updateSubmissionBody, uploadedFileDto,
} from '../../shared/schemas/submission'
import { Download, pageResponse, Reply, route } from '../http/route'
import { utcDay } from '../calendar'

const projectParams = z.object({ id: z.string() })
/** People who run the paperwork (the architecture guide's coordinator, with the administrator standing in). */
const PAPERWORK = ['coordinator', 'admin'] as const

/** The documents a submission keeps; what each may be is the upload service's `UPLOAD_USES`. */
const SUBMISSION_UPLOADS = [
  { path: 'letters', use: 'correctionLetter', description: 'The correction letter as PDF', summary: 'Upload an AHJ correction letter (PDF, sniffed by content); name the answer’s file id in the record_corrections step' },
  { path: 'receipt', use: 'feeReceipt', description: 'The receipt as PDF, PNG or JPEG', summary: 'Upload a fee receipt (PDF, PNG or JPEG, sniffed by content); name its file id in the submission' },
] as const

export const submissionRoutes = [
  route({
    method: 'get',
    path: '/api/submissions',
    access: PAPERWORK,
    summary: 'The submission board: projects from stamped on, filterable by status, jurisdiction, due date and text, paged',
    query: submissionBoardQuery,
    response: pageResponse(boardRowDto),
    handler: ({ user, query, services }) => services.submissions.board(user!.organizationId, query),
  }),
  route({
    method: 'get',
    path: '/api/submissions.csv',
    access: PAPERWORK,
    summary: 'The filtered submission board as CSV (every row, not one page)',
    query: submissionBoardQuery,
    handler: async ({ user, query, services }) =>
      new Download(await services.submissions.boardCsv(user!.organizationId, query), 'text/csv; charset=utf-8', `submissions-${utcDay()}.csv`),
  }),
  route({
    method: 'get',
    path: '/api/submissions/due',
    access: PAPERWORK,
    summary: 'Due and overdue items for the caller: a coordinator’s own and unassigned projects, all for an administrator',
    response: z.object({ items: z.array(dueItemDto), horizonDays: z.number().int() }),
    handler: ({ user, services }) => services.submissions.myDueItems(user!),
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/submission',
    access: ANY_ROLE,
    summary: 'The project’s submission to the AHJ: method, dates, references, fees, correction letters, permit, and what is due',
    params: projectParams,
    response: projectSubmissionDto,
    handler: ({ user, params, services }) => services.submissions.ofProject(user!.organizationId, params.id),
  }),
  route({
    method: 'patch',
    path: '/api/projects/:id/submission',
    access: PAPERWORK,
    summary: 'Paperwork between workflow steps at the version read: fee, paid date and receipt, permit expiry, inspection date, correction items done',
    params: projectParams,
    body: updateSubmissionBody,
    response: projectSubmissionDto,
    handler: ({ user, params, body, services }) => services.submissions.update(user!, params.id, body),
  }),
  ...SUBMISSION_UPLOADS.map((u) =>
    route({
      method: 'post',
      path: `/api/projects/:id/submission/${u.path}`,
      access: PAPERWORK,
      summary: u.summary,
      params: projectParams,
      upload: { field: 'file', description: u.description },
      response: uploadedFileDto,
      handler: async ({ user, params, file, services }) => new Reply(201, await services.submissions.upload(user!, params.id, u.use, file)),
    }),
  ),
  route({
    method: 'get',
    path: '/api/projects/:id/submission/files/:fileId',
    access: ANY_ROLE,
    summary: 'A correction letter or fee receipt of the project’s submissions',
    params: z.object({ id: z.string(), fileId: z.string() }),
    handler: async ({ user, params, services, res }) => {
      const { file, bytes } = await services.submissions.file(user!.organizationId, params.id, params.fileId)
      res.setHeader('X-Content-Type-Options', 'nosniff')
      return new Download(bytes, file.mediaType, file.originalName)
    },
  }),
]
