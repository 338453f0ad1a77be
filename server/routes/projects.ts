import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import { createProjectBody, generalNotesDto, projectDto, projectListQuery, updateProjectBody, versionBody } from '../../shared/schemas/project'
import { pageResponse, Reply, route } from '../http/route'
import { PROJECT_EDITORS } from './access'

const idParams = z.object({ id: z.string() })
const oneProject = z.object({ project: projectDto })

export const projectRoutes = [
  route({
    method: 'get',
    path: '/api/projects',
    access: ANY_ROLE,
    summary: 'Projects of the organisation, paged; search by code, name, address or customer; filter by status, system kind, jurisdiction, assignee',
    query: projectListQuery,
    response: pageResponse(projectDto),
    handler: ({ user, query, services }) => services.projects.list(user!.organizationId, query),
  }),
  route({
    method: 'post',
    path: '/api/projects',
    access: PROJECT_EDITORS,
    summary: 'Create a project (status draft)',
    body: createProjectBody,
    response: oneProject,
    handler: async ({ user, body, services }) => new Reply(201, { project: await services.projects.create(user!, body) }),
  }),
  route({
    method: 'get',
    path: '/api/projects/:id',
    access: ANY_ROLE,
    summary: 'One project',
    params: idParams,
    response: oneProject,
    handler: async ({ user, params, services }) => ({ project: await services.projects.get(user!.organizationId, params.id) }),
  }),
  route({
    method: 'patch',
    path: '/api/projects/:id',
    access: PROJECT_EDITORS,
    summary: 'Change project fields at the version read (409 with the current project if it moved on)',
    params: idParams,
    body: updateProjectBody,
    response: oneProject,
    handler: async ({ user, params, body, services }) => ({ project: await services.projects.update(user!, params.id, body) }),
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/archive',
    access: PROJECT_EDITORS,
    summary: 'Archive a project: hidden from working lists and read-only until restored',
    params: idParams,
    body: versionBody,
    response: oneProject,
    handler: async ({ user, params, body, services }) => ({ project: await services.projects.setArchived(user!, params.id, body.version, true) }),
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/restore',
    access: PROJECT_EDITORS,
    summary: 'Restore an archived project',
    params: idParams,
    body: versionBody,
    response: oneProject,
    handler: async ({ user, params, body, services }) => ({ project: await services.projects.setArchived(user!, params.id, body.version, false) }),
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/general-notes',
    access: ANY_ROLE,
    summary: 'The general notes of the project\u2019s jurisdiction profile, filled in with the project',
    params: idParams,
    response: generalNotesDto,
    handler: ({ user, params, services }) => services.projects.generalNotes(user!.organizationId, params.id),
  }),
]
