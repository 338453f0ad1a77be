import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import { timelineDto, transitionBody, transitionResultDto } from '../../shared/schemas/workflow'
import { route } from '../http/route'

const idParams = z.object({ id: z.string() })

export const workflowRoutes = [
  route({
    method: 'post',
    path: '/api/projects/:id/transitions',
    // every role: the state machine decides who may take which step, and answers 409 with the reason
    access: ANY_ROLE,
    summary: 'Move the project one workflow step (409 with the reason when the step is not open to you now or the version is stale; 422 for an unmet precondition)',
    params: idParams,
    body: transitionBody,
    response: transitionResultDto,
    handler: ({ user, params, body, services }) => services.workflow.transition(user!, params.id, body),
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/timeline',
    access: ANY_ROLE,
    summary: 'The workflow steps of the project, newest first: who, when, from, to, note, revision',
    params: idParams,
    response: timelineDto,
    handler: ({ user, params, services }) => services.workflow.timeline(user!.organizationId, params.id),
  }),
]
