import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import { designDto, designEvaluationDto, saveDesignBody } from '../../shared/schemas/project'
import { Reply, route } from '../http/route'
import { PROJECT_EDITORS } from './access'

const projectParams = z.object({ id: z.string() })
const oneDesign = z.object({ design: designDto })

export const designRoutes = [
  route({
    method: 'get',
    path: '/api/projects/:id/design',
    access: ANY_ROLE,
    summary: 'The working design of a project (404 before one is saved)',
    params: projectParams,
    response: oneDesign,
    handler: async ({ user, params, services }) => ({ design: await services.designs.get(user!.organizationId, params.id) }),
  }),
  route({
    method: 'put',
    path: '/api/projects/:id/design',
    access: PROJECT_EDITORS,
    summary: 'Save the working design at the version read (201 for the first); 422 names every bad document field',
    params: projectParams,
    body: saveDesignBody,
    response: oneDesign,
    handler: async ({ user, params, body, services }) => {
      const { design, created } = await services.designs.save(user!, params.id, body)
      return new Reply(created ? 201 : 200, { design })
    },
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/design/evaluate',
    access: ANY_ROLE,
    summary: 'Run the calculation engine over the stored design and keep the result',
    params: projectParams,
    response: designEvaluationDto,
    handler: ({ user, params, services }) => services.designs.evaluate(user!.organizationId, params.id),
  }),
]
