import type { CookieOptions, Response } from 'express'
import { loginBody } from '../../shared/schemas/auth'
import { ANY_ROLE } from '../../shared/auth/roles'
import type { AppConfig } from '../config'
import { loginRateLimits } from '../http/rate-limits'
import { Reply, route } from '../http/route'
import type { Session } from '../services/auth-service'

export const REFRESH_COOKIE = 'sl_refresh'

function cookieOptions(config: AppConfig): CookieOptions {
  return { httpOnly: true, sameSite: 'strict', secure: config.nodeEnv === 'production', path: '/api/auth' }
}

function sendSession(res: Response, config: AppConfig, session: Session) {
  res.cookie(REFRESH_COOKIE, session.refreshToken, { ...cookieOptions(config), maxAge: config.refreshTokenTtlSeconds * 1000 })
  return { token: session.token, user: session.user }
}

function refreshCookie(cookies: unknown): string | undefined {
  const value = (cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE]
  return typeof value === 'string' ? value : undefined
}

export function authRoutes(config: AppConfig) {
  return [
    route({
      method: 'post',
      path: '/api/auth/login',
      access: 'public',
      summary: 'Sign in with e-mail and password; sets the refresh cookie',
      before: loginRateLimits(config),
      body: loginBody,
      handler: async ({ body, services, res }) => sendSession(res, config, await services.auth.login(body)),
    }),
    route({
      method: 'post',
      path: '/api/auth/refresh',
      access: 'public',
      summary: 'Rotate the refresh cookie and issue a new access token',
      handler: async ({ req, res, services }) => {
        try {
          return sendSession(res, config, await services.auth.refresh(refreshCookie(req.cookies)))
        } catch (err) {
          res.clearCookie(REFRESH_COOKIE, cookieOptions(config))
          throw err
        }
      },
    }),
    route({
      method: 'post',
      path: '/api/auth/logout',
      access: 'public',
      summary: 'Revoke the refresh token and clear its cookie',
      handler: async ({ req, res, services }) => {
        await services.auth.logout(refreshCookie(req.cookies))
        res.clearCookie(REFRESH_COOKIE, cookieOptions(config))
        return new Reply(204)
      },
    }),
    route({
      method: 'get',
      path: '/api/auth/me',
      access: ANY_ROLE,
      summary: 'The signed-in user',
      handler: async ({ user, services }) => ({ user: await services.auth.me(user!) }),
    }),
  ]
}
