import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import { createUserBody, memberDto, updateUserBody, USER_SORTS } from '../../shared/schemas/auth'
import { pageQuery } from '../../shared/schemas/paging'
import { Reply, route } from '../http/route'

const idParams = z.object({ id: z.string() })

export const userRoutes = [
  route({
    method: 'get',
    path: '/api/members',
    access: ANY_ROLE,
    summary: 'Active members of the organisation (id, name, role), for assignments and filters',
    response: z.object({ items: z.array(memberDto) }),
    handler: async ({ user, services }) => ({ items: await services.users.members(user!.organizationId) }),
  }),
  route({
    method: 'get',
    path: '/api/users',
    access: ['admin'],
    summary: 'Users of the organisation, paged, searchable by name and e-mail',
    query: pageQuery(USER_SORTS),
    handler: ({ user, query, services }) => services.users.list(user!.organizationId, query),
  }),
  route({
    method: 'get',
    path: '/api/users/:id',
    access: ['admin'],
    summary: 'One user of the organisation',
    params: idParams,
    handler: async ({ user, params, services }) => ({
      user: await services.users.toDto(await services.users.getInOrganization(user!.organizationId, params.id)),
    }),
  }),
  route({
    method: 'post',
    path: '/api/users',
    access: ['admin'],
    summary: 'Create a user in the organisation',
    body: createUserBody,
    handler: async ({ user, body, services }) => new Reply(201, { user: await services.users.create(user!, body) }),
  }),
  route({
    method: 'patch',
    path: '/api/users/:id',
    access: ['admin'],
    summary: 'Change name, role, active flag or licence of a user',
    params: idParams,
    body: updateUserBody,
    handler: async ({ user, params, body, services }) => ({ user: await services.users.update(user!, params.id, body) }),
  }),
]
