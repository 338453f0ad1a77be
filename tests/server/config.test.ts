import { existsSync, mkdtempSync, readFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { describe, expect, it } from 'vitest'
import { ConfigError, loadConfig } from '../../server/config'

const tmp = () => mkdtempSync(path.join(os.tmpdir(), 'stringline-config-'))

describe('configuration', () => {
  it('refuses to start in production without JWT_SECRET', () => {
    expect(() => loadConfig({ NODE_ENV: 'production', DATA_DIR: tmp() })).toThrow(ConfigError)
  })

  it('outside production generates a secret once and keeps it in the data folder', () => {
    const dir = tmp()
    const first = loadConfig({ DATA_DIR: dir })
    expect(existsSync(path.join(dir, 'jwt-secret'))).toBe(true)
    expect(first.jwtSecret.length).toBeGreaterThanOrEqual(32)
    expect(loadConfig({ DATA_DIR: dir }).jwtSecret).toBe(first.jwtSecret)
    expect(readFileSync(path.join(dir, 'jwt-secret'), 'utf8').trim()).toBe(first.jwtSecret)
  })

  it('refuses access tokens longer than 15 minutes, weak secrets and a bcrypt cost below 12', () => {
    const secret = 'x'.repeat(40)
    expect(() => loadConfig({ JWT_SECRET: secret, ACCESS_TOKEN_TTL_SECONDS: '3600' })).toThrow(/at most 900/)
    expect(() => loadConfig({ JWT_SECRET: 'short' })).toThrow(/32 characters/)
    expect(() => loadConfig({ JWT_SECRET: secret, BCRYPT_COST: '10' })).toThrow(/at least 12/)
    expect(() => loadConfig({ JWT_SECRET: secret, PORT: 'eighty' })).toThrow(/PORT/)
  })

  it('defaults to the documented address and limits', () => {
    const config = loadConfig({ JWT_SECRET: 'y'.repeat(40) })
    expect(config).toMatchObject({ host: '127.0.0.1', port: 8080, bcryptCost: 12, accessTokenTtlSeconds: 600, apiProcesses: 1 })
  })

  it('runs the API as a number of processes, or one per core, and refuses anything else', () => {
    const secret = { JWT_SECRET: 'y'.repeat(40) }
    expect(loadConfig({ ...secret, API_PROCESSES: '3' }).apiProcesses).toBe(3)
    expect(loadConfig({ ...secret, API_PROCESSES: 'cores' }).apiProcesses).toBe(os.availableParallelism())
    for (const bad of ['0', '-2', '1.5', 'many', '65']) expect(() => loadConfig({ ...secret, API_PROCESSES: bad })).toThrow(/API_PROCESSES/)
  })

  it('takes object storage only with every S3 setting, and names what is missing', () => {
    const secret = { JWT_SECRET: 'z'.repeat(40) }
    expect(loadConfig(secret).s3).toBeNull()
    expect(() => loadConfig({ ...secret, S3_BUCKET: 'plans' })).toThrow(ConfigError)
    expect(() => loadConfig({ ...secret, S3_BUCKET: 'plans' })).toThrow(/S3_ENDPOINT.*S3_SECRET_ACCESS_KEY/)
  })
})
