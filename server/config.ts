import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { availableParallelism } from 'node:os'
import path from 'node:path'
import { readS3Settings, S3SettingsError, type S3Settings } from './storage/s3-config'

/** Runtime settings, all from the environment (see .env.example). */
export interface AppConfig {
  nodeEnv: 'production' | 'development' | 'test'
  port: number
  host: string
  /** API processes sharing the port on this machine (server/api-cluster.ts); 1 runs the API in the started process. */
  apiProcesses: number
  /** Git-ignored folder for the local cluster, generated secrets and stored files. */
  dataDir: string
  jwtSecret: string
  /** Access-token lifetime [s]; at most 15 minutes. */
  accessTokenTtlSeconds: number
  /** Refresh-token lifetime [s]. */
  refreshTokenTtlSeconds: number
  /** bcrypt cost factor; never below 12. */
  bcryptCost: number
  /** Folder of the built client; served when it holds an index.html. */
  clientDir: string
  /** Largest JSON body accepted. */
  jsonBodyLimit: string
  /** Largest uploaded file (datasheet PDF, CSV import) [bytes]. */
  uploadMaxBytes: number
  /** Most data rows one CSV import may hold. */
  csvImportMaxRows: number
  logLevel: string
  /** Sign-in attempts per client address per 15 minutes. */
  loginLimitPerIp: number
  /** Failed sign-in attempts per account per 15 minutes. */
  loginLimitPerAccount: number
  /** Express `trust proxy` setting, for the client address behind a reverse proxy. */
  trustProxy: string | false
  /** Plan-set generation queue (pg-boss, own schema in the same database). */
  jobs: {
    /** A running generation not finished in this time is taken as lost (its worker died) and retried [s]. */
    expireSeconds: number
    /** Further attempts after the first one fails. */
    retryLimit: number
    /** Wait before a retry [s]. */
    retryDelaySeconds: number
    /** How often a worker looks for expired jobs [s]. */
    maintenanceSeconds: number
    /** How often an idle worker asks for new jobs [s]. */
    pollSeconds: number
  }
  /** Tests only (NODE_ENV=test): the worker stops without finishing when it reaches this step. */
  faultHangAtStep: string | null
  /**
   * Outside production: a pause after each generation step is reported [ms], so that a person (or
   * the browser journey) can watch the progress bar move on a machine that draws a set in a blink.
   */
  stepPauseMs: number
  /** S3-compatible object storage; null: files on local disk under DATA_DIR/files. */
  s3: S3Settings | null
  /** Public address of the app, without a trailing slash: links in mails and the verification address printed on stamps. */
  appUrl: string
  mail: MailConfig
}

/** Outgoing mail (SMTP through nodemailer) and the development mail catcher. */
export interface MailConfig {
  /** null: no SMTP server, mail is logged and dropped. */
  smtpHost: string | null
  smtpPort: number
  /** TLS from the first byte (port 465); otherwise STARTTLS when the server offers it. */
  smtpSecure: boolean
  smtpUser: string | null
  smtpPass: string | null
  from: string
  /** Folder the development mail catcher stores into; null: no mailbox page. */
  mailboxDir: string | null
  /** pg-boss cron (UTC) of the daily digest. */
  digestCron: string
}

export class ConfigError extends Error {}

const MAX_ACCESS_TTL_SECONDS = 15 * 60
const MIN_BCRYPT_COST = 12

function readNodeEnv(value: string | undefined): AppConfig['nodeEnv'] {
  if (value === 'production' || value === 'test') return value
  return 'development'
}

/**
 * The signing secret: from JWT_SECRET, or outside production a generated one kept in the data
 * folder so that sign-ins survive a restart. Production refuses to start without one.
 */
function resolveJwtSecret(env: NodeJS.ProcessEnv, nodeEnv: AppConfig['nodeEnv'], dataDir: string): string {
  const fromEnv = env.JWT_SECRET
  if (fromEnv) {
    if (fromEnv.length < 32) throw new ConfigError('JWT_SECRET must be at least 32 characters')
    return fromEnv
  }
  if (nodeEnv === 'production') throw new ConfigError('JWT_SECRET must be set in production')
  const file = path.join(dataDir, 'jwt-secret')
  if (existsSync(file)) return readFileSync(file, 'utf8').trim()
  mkdirSync(dataDir, { recursive: true })
  const secret = randomBytes(48).toString('base64url')
  writeFileSync(file, secret, { mode: 0o600 })
  return secret
}

function positiveInt(env: NodeJS.ProcessEnv, name: string, fallback: number): number {
  const raw = env[name]
  if (raw === undefined || raw === '') return fallback
  const value = Number(raw)
  if (!Number.isInteger(value) || value <= 0) throw new ConfigError(`${name} must be a positive whole number`)
  return value
}

function wholeNumber(env: NodeJS.ProcessEnv, name: string, fallback: number): number {
  const raw = env[name]
  if (raw === undefined || raw === '') return fallback
  const value = Number(raw)
  if (!Number.isInteger(value) || value < 0) throw new ConfigError(`${name} must be a whole number, 0 or more`)
  return value
}

/** Object storage settings, with a partial set reported like any other bad setting. */
function objectStorage(env: NodeJS.ProcessEnv): S3Settings | null {
  try {
    return readS3Settings(env)
  } catch (err) {
    if (err instanceof S3SettingsError) throw new ConfigError(err.message)
    throw err
  }
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const nodeEnv = readNodeEnv(env.NODE_ENV)
  const dataDir = path.resolve(env.DATA_DIR ?? '.data')
  const accessTokenTtlSeconds = positiveInt(env, 'ACCESS_TOKEN_TTL_SECONDS', 10 * 60)
  if (accessTokenTtlSeconds > MAX_ACCESS_TTL_SECONDS) {
    throw new ConfigError(`ACCESS_TOKEN_TTL_SECONDS must be at most ${MAX_ACCESS_TTL_SECONDS}`)
  }
  const bcryptCost = positiveInt(env, 'BCRYPT_COST', MIN_BCRYPT_COST)
  if (bcryptCost < MIN_BCRYPT_COST) throw new ConfigError(`BCRYPT_COST must be at least ${MIN_BCRYPT_COST}`)
  return {
    nodeEnv,
    port: positiveInt(env, 'PORT', 8080),
    host: env.HOST ?? '127.0.0.1',
    apiProcesses: apiProcesses(env),
    dataDir,
    jwtSecret: resolveJwtSecret(env, nodeEnv, dataDir),
    accessTokenTtlSeconds,
    refreshTokenTtlSeconds: positiveInt(env, 'REFRESH_TOKEN_TTL_SECONDS', 14 * 24 * 3600),
    bcryptCost,
    clientDir: path.resolve(env.CLIENT_DIR ?? 'dist/client'),
    jsonBodyLimit: env.JSON_BODY_LIMIT ?? '1mb',
    uploadMaxBytes: positiveInt(env, 'UPLOAD_MAX_BYTES', 20 * 1024 * 1024),
    csvImportMaxRows: positiveInt(env, 'CSV_IMPORT_MAX_ROWS', 2000),
    logLevel: env.LOG_LEVEL ?? (nodeEnv === 'test' ? 'silent' : 'info'),
    loginLimitPerIp: positiveInt(env, 'LOGIN_LIMIT_PER_IP', 30),
    loginLimitPerAccount: positiveInt(env, 'LOGIN_LIMIT_PER_ACCOUNT', 5),
    trustProxy: env.TRUST_PROXY || false,
    jobs: {
      expireSeconds: positiveInt(env, 'JOB_EXPIRE_SECONDS', 15 * 60),
      retryLimit: wholeNumber(env, 'JOB_RETRY_LIMIT', 2),
      retryDelaySeconds: wholeNumber(env, 'JOB_RETRY_DELAY_SECONDS', 20),
      maintenanceSeconds: positiveInt(env, 'JOB_MAINTENANCE_SECONDS', 30),
      pollSeconds: positiveInt(env, 'JOB_POLL_SECONDS', 2),
    },
    // a fault hook must never reach a real deployment
    faultHangAtStep: nodeEnv === 'test' ? env.STRINGLINE_FAULT_HANG_AT_STEP || null : null,
    stepPauseMs: nodeEnv === 'production' ? 0 : wholeNumber(env, 'JOB_STEP_PAUSE_MS', 0),
    s3: objectStorage(env),
    appUrl: appUrl(env),
    mail: mailSettings(env),
  }
}

const MAX_API_PROCESSES = 64

/** API_PROCESSES: a number, or `cores` for one per CPU core. */
function apiProcesses(env: NodeJS.ProcessEnv): number {
  if (env.API_PROCESSES === 'cores') return availableParallelism()
  const count = positiveInt(env, 'API_PROCESSES', 1)
  if (count > MAX_API_PROCESSES) throw new ConfigError(`API_PROCESSES must be at most ${MAX_API_PROCESSES}, or "cores"`)
  return count
}

function appUrl(env: NodeJS.ProcessEnv): string {
  const url = (env.APP_URL || `http://${env.HOST ?? '127.0.0.1'}:${env.PORT || 8080}`).replace(/\/+$/, '')
  if (!URL.canParse(url) || !/^https?:/.test(url)) throw new ConfigError('APP_URL must be an absolute http(s) URL, e.g. https://stringline.example')
  return url
}

function mailSettings(env: NodeJS.ProcessEnv): MailConfig {
  const secure = env.SMTP_SECURE ?? ''
  if (!['', 'true', 'false'].includes(secure)) throw new ConfigError('SMTP_SECURE must be true or false')
  const digestCron = env.DIGEST_CRON || '0 7 * * *'
  if (digestCron.trim().split(/\s+/).length !== 5) throw new ConfigError('DIGEST_CRON must be a cron line of five fields, e.g. "0 7 * * *"')
  return {
    smtpHost: env.SMTP_HOST || null,
    smtpPort: positiveInt(env, 'SMTP_PORT', secure === 'true' ? 465 : 587),
    smtpSecure: secure === 'true',
    smtpUser: env.SMTP_USER || null,
    smtpPass: env.SMTP_PASS || null,
    from: env.MAIL_FROM || 'Stringline <no-reply@stringline.example>',
    mailboxDir: env.MAILBOX_DIR ? path.resolve(env.MAILBOX_DIR) : null,
    digestCron,
  }
}
