import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import { caughtMailDto, caughtMailSummaryDto, notificationSettingsBody, notificationSettingsDto } from '../../shared/schemas/notifications'
import { route } from '../http/route'

export const notificationRoutes = [
  route({
    method: 'get',
    path: '/api/profile/notifications',
    access: ANY_ROLE,
    summary: 'The e-mail categories of the signed-in user, each with who receives it and whether it is on',
    response: notificationSettingsDto,
    handler: ({ user, services }) => services.notifications.settings(user!),
  }),
  route({
    method: 'put',
    path: '/api/profile/notifications',
    access: ANY_ROLE,
    summary: 'Replace the categories the signed-in user has switched off',
    body: notificationSettingsBody,
    response: notificationSettingsDto,
    handler: ({ user, body, services }) => services.notifications.updateSettings(user!, body),
  }),
  route({
    method: 'get',
    path: '/api/dev/mailbox',
    access: ['admin'],
    summary: 'Development mail catcher: the messages it holds, newest first (404 in production or without MAILBOX_DIR)',
    response: z.object({ items: z.array(caughtMailSummaryDto) }),
    handler: ({ services }) => services.notifications.caughtMails(),
  }),
  route({
    method: 'get',
    path: '/api/dev/mailbox/:messageId',
    access: ['admin'],
    summary: 'Development mail catcher: one message with its text and HTML bodies',
    params: z.object({ messageId: z.string() }),
    response: caughtMailDto,
    handler: ({ params, services }) => services.notifications.caughtMail(params.messageId),
  }),
]
