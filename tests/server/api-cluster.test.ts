import { spawn, type ChildProcess } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { readdirSync, readFileSync } from 'node:fs'
import { request } from 'node:http'
import { afterAll, beforeAll, expect, it } from 'vitest'
import { freePort } from '../../scripts/lib/postgres-cluster'
import { DEMO_PASSWORD } from '../../server/demo/seed'
import { waitFor } from './support/live-api'
import { demoEmail, startHarness, type Harness } from './support/harness'

/**
 * The API as several processes on one port (API_PROCESSES, server/api-cluster.ts): the primary
 * prepares the database once, every process answers, the sign-in limits count across processes,
 * a process that dies is replaced, and SIGTERM stops them all.
 */
const ACCOUNT_LIMIT = 3

let h: Harness
let primary: ChildProcess
let base: string

/** One request on a connection of its own, so the cluster hands it to its processes in turn. */
function freshCall(method: string, path: string, body?: unknown): Promise<{ status: number; body: Record<string, unknown> }> {
  const payload = body === undefined ? undefined : JSON.stringify(body)
  return new Promise((resolve, reject) => {
    const req = request(`${base}${path}`, { method, agent: false, headers: payload ? { 'Content-Type': 'application/json' } : {} }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: JSON.parse(Buffer.concat(chunks).toString('utf8') || '{}') as Record<string, unknown> }))
    })
    req.on('error', reject)
    // a connection handed to a process in the instant it is killed is lost: give up on it and ask again
    req.setTimeout(2000, () => req.destroy(new Error('no answer within 2 s')))
    req.end(payload)
  })
}

/** API processes of the cluster whose primary is `pid`: its children running server/main.ts (from /proc). */
function apiProcessesOf(pid: number): number[] {
  return readdirSync('/proc')
    .filter((entry) => /^\d+$/.test(entry))
    .filter((entry) => {
      try {
        // the command name in field 2 may hold spaces; the parent id follows its closing parenthesis
        const parent = Number(readFileSync(`/proc/${entry}/stat`, 'utf8').split(') ')[1]!.split(' ')[1])
        return parent === pid && readFileSync(`/proc/${entry}/cmdline`, 'utf8').includes('server/main.ts')
      } catch {
        return false
      }
    })
    .map(Number)
}

const processCount = async () =>
  (await freshCall('GET', '/api/health').catch(() => ({ status: 0, body: {} as Record<string, unknown> }))).body.apiProcesses as { listening: number; configured: number } | undefined

beforeAll(async () => {
  h = await startHarness()
  const port = await freePort()
  base = `http://127.0.0.1:${port}`
  primary = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    stdio: ['ignore', 'inherit', 'inherit'],
    env: {
      ...process.env,
      NODE_ENV: 'test',
      LOG_LEVEL: 'warn',
      DATABASE_URL: h.databaseUrl,
      DATA_DIR: h.config.dataDir,
      JWT_SECRET: randomBytes(32).toString('hex'),
      PORT: String(port),
      API_PROCESSES: '2',
      LOAD_DEMO_DATA: 'true',
      LOGIN_LIMIT_PER_ACCOUNT: String(ACCOUNT_LIMIT),
    },
  })
  await waitFor(async () => (await processCount())?.listening === 2, 'both API processes to listen', 90_000, 250)
}, 120_000)

afterAll(async () => {
  if (primary && primary.exitCode === null && primary.signalCode === null) {
    const exited = new Promise((resolve) => primary.once('exit', resolve))
    primary.kill('SIGTERM')
    const killer = setTimeout(() => primary.kill('SIGKILL'), 15_000)
    await exited
    clearTimeout(killer)
  }
  await h?.close()
}, 30_000)

it('prepares the database once in the primary and answers from every process, which all report the cluster', async () => {
  // the harness only migrated: the demo users are there because the primary loaded them
  const signedIn = await freshCall('POST', '/api/auth/login', { email: demoEmail('designer'), password: DEMO_PASSWORD })
  expect(signedIn.status).toBe(200)
  for (let i = 0; i < 6; i++) {
    const health = await freshCall('GET', '/api/health')
    expect(health.status).toBe(200)
    expect(health.body).toEqual({ status: 'ok', db: 'up', apiProcesses: { listening: 2, configured: 2 } })
  }
  expect(apiProcessesOf(primary.pid!)).toHaveLength(2)
})

it('counts failed sign-ins for an account across the processes (429 after the limit, whichever process answers)', async () => {
  const email = demoEmail('reviewer')
  const answers: number[] = []
  for (let i = 0; i < ACCOUNT_LIMIT + 3; i++) answers.push((await freshCall('POST', '/api/auth/login', { email, password: `not-the-password-${i}` })).status)
  // each process alone would have seen only half of the attempts and let more through
  expect(answers).toEqual([...Array(ACCOUNT_LIMIT).fill(401), 429, 429, 429])
})

it('starts another API process when one dies, and SIGTERM stops them all', async () => {
  const [victim] = apiProcessesOf(primary.pid!)
  process.kill(victim!, 'SIGKILL')
  await waitFor(() => !apiProcessesOf(primary.pid!).includes(victim!), 'the killed process to be gone', 10_000, 50)
  await waitFor(async () => apiProcessesOf(primary.pid!).length === 2 && (await processCount())?.listening === 2, 'a replacement to listen', 60_000, 250)
  // the survivor kept answering meanwhile, and the replacement answers too
  for (let i = 0; i < 4; i++) expect((await freshCall('GET', '/api/health')).status).toBe(200)

  const workers = apiProcessesOf(primary.pid!)
  const exited = new Promise<number | null>((resolve) => primary.once('exit', (code) => resolve(code)))
  primary.kill('SIGTERM')
  expect(await exited).toBe(0)
  for (const pid of workers) expect(() => process.kill(pid, 0)).toThrow()
}, 90_000)
