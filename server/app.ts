import 'reflect-metadata'
import { existsSync } from 'node:fs'
import path from 'node:path'
import cookieParser from 'cookie-parser'
import express, { type Express } from 'express'
import helmet from 'helmet'
import { pino, type Logger } from 'pino'
import { pinoHttp } from 'pino-http'
import type { DataSource } from 'typeorm'
import { createAuthenticator } from './auth/guard'
import type { SignedInUsers } from './auth/signed-in-users'
import type { PackageQueue } from './jobs/queue'
import type { AppConfig } from './config'
import { apiNotFound, errorHandler } from './http/error-handler'
import { mountRoutes } from './http/mount'
import { buildRoutes } from './routes'
import { createServices } from './services'

export interface AppDeps {
  db: DataSource
  config: AppConfig
  logger?: Logger
  /** Where generations are sent; made over `db` (started on first use) when not given. The caller stops it. */
  queue?: PackageQueue
  /** Keeps the users of bearer tokens between requests; the caller starts and stops it. */
  signedIn?: SignedInUsers
}

/** The Express app, separate from `listen` so tests drive it with supertest. */
export function createApp({ db, config, logger = pino({ level: config.logLevel }), queue, signedIn }: AppDeps): Express {
  const services = createServices(db, config, queue, signedIn)
  const requireRoles = createAuthenticator(config, services.auth)
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', config.trustProxy)
  app.use(
    helmet({
      contentSecurityPolicy: {
        // blob: for the plan-set previews the client builds from authenticated downloads (PDF in a frame)
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'frame-src': ["'self'", 'blob:'],
          'object-src': ["'self'", 'blob:'],
        },
      },
    }),
  )
  app.use(
    pinoHttp({
      logger,
      redact: ['req.headers.authorization', 'req.headers.cookie', 'res.headers["set-cookie"]'],
      autoLogging: { ignore: (req) => req.url === '/api/health' },
    }),
  )
  // only the session routes read a cookie (the refresh token)
  app.use('/api/auth', cookieParser())
  // each route parses its own body: JSON, or multipart where it declares an upload
  app.use(mountRoutes(buildRoutes(config), services, requireRoles, config))
  app.use('/api', apiNotFound)

  const indexHtml = path.join(config.clientDir, 'index.html')
  if (existsSync(indexHtml)) {
    app.use(express.static(config.clientDir, { index: false, maxAge: '1h' }))
    // the client routes in the browser: every other GET answers the app page
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(indexHtml))
  }
  app.use(errorHandler(logger))
  return app
}
