/** Settings of the S3-compatible object store, from the environment: all of them or none. */

export interface S3Settings {
  /** e.g. https://s3.example.internal or http://127.0.0.1:9000 */
  endpoint: string
  region: string
  bucket: string
  accessKeyId: string
  secretAccessKey: string
  /** Path-style addressing (`endpoint/bucket/key`), which most self-hosted stores need. */
  forcePathStyle: boolean
}

export class S3SettingsError extends Error {}

const VARIABLES = ['S3_ENDPOINT', 'S3_REGION', 'S3_BUCKET', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY', 'S3_FORCE_PATH_STYLE'] as const

/**
 * The object-store settings, or null when none of the S3_* variables is set (files stay on local
 * disk). A partial set is a mistake that would silently keep files on one machine, so it throws.
 */
export function readS3Settings(env: NodeJS.ProcessEnv): S3Settings | null {
  const value = (name: (typeof VARIABLES)[number]) => env[name]?.trim() ?? ''
  const missing = VARIABLES.filter((name) => value(name) === '')
  if (missing.length === VARIABLES.length) return null
  if (missing.length > 0) {
    throw new S3SettingsError(`${missing.join(', ')} must be set: object storage needs all of ${VARIABLES.join(', ')} (or none, for local disk)`)
  }
  let endpoint: URL
  try {
    endpoint = new URL(value('S3_ENDPOINT'))
  } catch {
    throw new S3SettingsError('S3_ENDPOINT must be a URL, e.g. https://s3.example.internal')
  }
  if (endpoint.protocol !== 'http:' && endpoint.protocol !== 'https:') throw new S3SettingsError('S3_ENDPOINT must be an http: or https: URL')
  const pathStyle = value('S3_FORCE_PATH_STYLE').toLowerCase()
  if (pathStyle !== 'true' && pathStyle !== 'false') throw new S3SettingsError('S3_FORCE_PATH_STYLE must be true or false')
  return {
    endpoint: endpoint.toString().replace(/\/$/, ''),
    region: value('S3_REGION'),
    bucket: value('S3_BUCKET'),
    accessKeyId: value('S3_ACCESS_KEY_ID'),
    secretAccessKey: value('S3_SECRET_ACCESS_KEY'),
    forcePathStyle: pathStyle === 'true',
  }
}
