import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import { compareQuery, createRevisionBody, PACKAGE_FILE_NAMES, packageJobDto, revisionDiffDto, revisionListDto } from '../../shared/schemas/revision'
import { Download, Reply, route } from '../http/route'
import { PROJECT_EDITORS } from './access'

const projectParams = z.object({ id: z.string() })
const jobParams = z.object({ id: z.string(), jobId: z.string() })
const revisionParams = z.object({ id: z.string(), number: z.coerce.number().int('must be a revision number').min(0, 'must be a revision number') })
const fileParams = revisionParams.extend({ name: z.enum(PACKAGE_FILE_NAMES, { message: `must be one of ${PACKAGE_FILE_NAMES.join(', ')}` }) })
const oneJob = z.object({ job: packageJobDto })
/** Drawings served for preview run no script and load nothing: styles inside them only. */
const SVG_PREVIEW_POLICY = "default-src 'none'; style-src 'unsafe-inline'"

export const revisionRoutes = [
  route({
    method: 'post',
    path: '/api/projects/:id/revisions',
    access: PROJECT_EDITORS,
    summary: 'Generate the next plan-set revision in the background (202 with the job); 422 names what stops the design, 409 while one runs',
    params: projectParams,
    body: createRevisionBody,
    response: oneJob,
    handler: async ({ user, params, body, services }) => new Reply(202, { job: await services.revisions.request(user!, params.id, body) }),
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/revisions',
    access: ANY_ROLE,
    summary: 'Published revisions of a project, newest first, and the generation under way',
    params: projectParams,
    response: revisionListDto,
    handler: ({ user, params, services }) => services.revisions.list(user!.organizationId, params.id),
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/package-jobs/:jobId',
    access: ANY_ROLE,
    summary: 'One plan-set generation: state, step and progress',
    params: jobParams,
    response: oneJob,
    handler: async ({ user, params, services }) => ({ job: await services.revisions.getJob(user!.organizationId, params.id, params.jobId) }),
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/package-jobs/:jobId/retry',
    access: PROJECT_EDITORS,
    summary: 'Queue a failed generation again (409 unless it failed)',
    params: jobParams,
    response: oneJob,
    handler: async ({ user, params, services }) => new Reply(202, { job: await services.revisions.retry(user!, params.id, params.jobId) }),
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/revisions/compare',
    access: ANY_ROLE,
    summary: 'What changed between two revisions, grouped by area',
    params: projectParams,
    query: compareQuery,
    response: z.object({ diff: revisionDiffDto }),
    handler: async ({ user, params, query, services }) => ({ diff: await services.revisions.compare(user!.organizationId, params.id, query.from, query.to) }),
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/revisions/compare/narrative.pdf',
    access: ANY_ROLE,
    summary: 'The changes between two revisions as a PDF for a resubmittal',
    params: projectParams,
    query: compareQuery,
    handler: async ({ user, params, query, services }) => {
      const pdf = await services.revisions.narrativePdf(user!.organizationId, params.id, query.from, query.to)
      return new Download(pdf.bytes, 'application/pdf', pdf.fileName)
    },
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/revisions/:number/package',
    access: ANY_ROLE,
    summary: 'The submission zip of a revision',
    params: revisionParams,
    handler: async ({ user, params, services }) => {
      const pkg = await services.revisions.packageOf(user!.organizationId, params.id, params.number)
      return new Download(pkg.bytes, 'application/zip', pkg.fileName)
    },
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/revisions/:number/files/:name',
    access: ANY_ROLE,
    summary: 'One file of a revision’s package (PDF and SVG open in the browser for preview)',
    params: fileParams,
    handler: async ({ user, params, services, res }) => {
      const file = await services.revisions.fileOf(user!.organizationId, params.id, params.number, params.name)
      if (file.mediaType === 'image/svg+xml') res.setHeader('Content-Security-Policy', SVG_PREVIEW_POLICY)
      res.setHeader('X-Content-Type-Options', 'nosniff')
      const preview = file.mediaType === 'application/pdf' || file.mediaType === 'image/svg+xml'
      return new Download(file.bytes, file.mediaType, file.fileName, preview ? 'inline' : 'attachment')
    },
  }),
]
