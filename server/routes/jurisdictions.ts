import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import { createJurisdictionBody, jurisdictionDto, jurisdictionListQuery, updateJurisdictionBody } from '../../shared/schemas/jurisdiction'
import { pageResponse, Reply, route } from '../http/route'
import { JURISDICTION_EDITORS } from './access'

const idParams = z.object({ id: z.string() })
const oneJurisdiction = z.object({ jurisdiction: jurisdictionDto })

export const jurisdictionRoutes = [
  route({
    method: 'get',
    path: '/api/jurisdictions',
    access: ANY_ROLE,
    summary: 'Jurisdiction profiles of the organisation, paged, searchable by name, filtered by NEC edition',
    query: jurisdictionListQuery,
    response: pageResponse(jurisdictionDto),
    handler: ({ user, query, services }) => services.jurisdictions.list(user!.organizationId, query),
  }),
  route({
    method: 'post',
    path: '/api/jurisdictions',
    access: JURISDICTION_EDITORS,
    summary: 'Create a jurisdiction profile',
    body: createJurisdictionBody,
    response: oneJurisdiction,
    handler: async ({ user, body, services }) => new Reply(201, { jurisdiction: await services.jurisdictions.create(user!, body) }),
  }),
  route({
    method: 'get',
    path: '/api/jurisdictions/:id',
    access: ANY_ROLE,
    summary: 'One jurisdiction profile',
    params: idParams,
    response: oneJurisdiction,
    handler: async ({ user, params, services }) => ({ jurisdiction: await services.jurisdictions.get(user!.organizationId, params.id) }),
  }),
  route({
    method: 'patch',
    path: '/api/jurisdictions/:id',
    access: JURISDICTION_EDITORS,
    summary: 'Change a jurisdiction profile at the version read (409 with the current profile if it moved on)',
    params: idParams,
    body: updateJurisdictionBody,
    response: oneJurisdiction,
    handler: async ({ user, params, body, services }) => ({ jurisdiction: await services.jurisdictions.update(user!, params.id, body) }),
  }),
  route({
    method: 'delete',
    path: '/api/jurisdictions/:id',
    access: JURISDICTION_EDITORS,
    summary: 'Delete a jurisdiction profile no project uses, at the version read',
    params: idParams,
    query: z.object({ version: z.coerce.number().int().min(1) }),
    handler: ({ user, params, query, services }) => services.jurisdictions.remove(user!, params.id, query.version),
  }),
]
