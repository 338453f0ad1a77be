import cluster from 'node:cluster'
import { ClusterMemoryStoreWorker } from '@express-rate-limit/cluster-memory-store'
import type { RequestHandler } from 'express'
import { rateLimit, type Store } from 'express-rate-limit'
import type { AppConfig } from '../config'
import { HttpError } from './errors'

const WINDOW_MS = 15 * 60 * 1000

const tooMany = (message: string): RequestHandler => (_req, _res, next) => next(new HttpError(429, 'rate_limited', message))

/**
 * Where a limiter counts: in this process, or, when the API runs as a cluster of processes
 * (API_PROCESSES > 1, server/api-cluster.ts), in the cluster's primary so that every process
 * shares one count. `name` keeps the limiters' counts apart.
 */
function counter(name: string): { store?: Store } {
  return cluster.isWorker ? { store: new ClusterMemoryStoreWorker({ prefix: `${name}:` }) } : {}
}

/**
 * Sign-in limits: every attempt counts per client address, failed attempts count per account.
 * Separate API machines (not one machine's cluster) each keep their own count.
 */
export function loginRateLimits(config: AppConfig): RequestHandler[] {
  const perIp = rateLimit({
    ...counter('login-address'),
    windowMs: WINDOW_MS,
    limit: config.loginLimitPerIp,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany('Too many sign-in attempts from this address; wait 15 minutes and try again'),
  })
  const perAccount = rateLimit({
    ...counter('login-account'),
    windowMs: WINDOW_MS,
    limit: config.loginLimitPerAccount,
    standardHeaders: false,
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    keyGenerator: (req) => `account:${String((req.body as { email?: unknown } | undefined)?.email ?? '').trim().toLowerCase()}`,
    handler: tooMany('Too many failed sign-in attempts for this account; wait 15 minutes and try again'),
  })
  return [perIp, perAccount]
}

/** Public look-ups (stamp verification): per client address, so nobody can walk the verification ids or flood the checker. */
export function publicLookupRateLimit(name: string, limit = 120): RequestHandler {
  return rateLimit({
    ...counter(name),
    windowMs: WINDOW_MS,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany('Too many verification requests from this address; wait 15 minutes and try again'),
  })
}
