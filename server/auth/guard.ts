import type { RequestHandler } from 'express'
import { Passport } from 'passport'
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt'
import type { Role } from '../../shared/auth/roles'
import type { AppConfig } from '../config'
import { forbidden, unauthorized } from '../http/errors'
import type { AuthService } from '../services/auth-service'
import type { AuthUser } from './auth-user'
import { JWT_ALGORITHM, JWT_AUDIENCE, JWT_ISSUER, jwtKey } from './tokens'

interface JwtPayload {
  sub?: string
  org?: string
}

/**
 * Bearer-token authentication with passport-jwt: the algorithm, issuer and audience are pinned,
 * and the user is loaded on every request so that deactivation and role changes apply at once.
 */
export function createAuthenticator(config: AppConfig, auth: AuthService) {
  const passport = new Passport()
  passport.use(
    new JwtStrategy(
      {
        jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
        // passport-jwt hands the key to jsonwebtoken unchanged; its types predate KeyObject
        secretOrKey: jwtKey(config.jwtSecret) as unknown as Buffer,
        algorithms: [JWT_ALGORITHM],
        issuer: JWT_ISSUER,
        audience: JWT_AUDIENCE,
      },
      (payload: JwtPayload, done: (err: unknown, user?: AuthUser | false) => void) => {
        if (!payload.sub || !payload.org) return done(null, false)
        auth.userForToken(payload.sub, payload.org).then((user) => done(null, user ?? false), done)
      },
    ),
  )

  /** Requires a signed-in user whose current role is one of `roles`. */
  return function requireRoles(roles: readonly Role[]): RequestHandler {
    return (req, res, next) => {
      passport.authenticate('jwt', { session: false }, (err: unknown, user: AuthUser | false) => {
        if (err) return next(err)
        if (!user) return next(unauthorized())
        if (!roles.includes(user.role)) return next(forbidden())
        req.user = user
        next()
      })(req, res, next)
    }
  }
}
