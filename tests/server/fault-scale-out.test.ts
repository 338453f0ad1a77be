import { spawn, type ChildProcess } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { readdir } from 'node:fs/promises'
import path from 'node:path'
import { performance } from 'node:perf_hooks'
import { createInterface } from 'node:readline'
import { afterAll, beforeAll, expect, it } from 'vitest'
import { freePort } from '../../scripts/lib/postgres-cluster'
import { call, signIn, waitFor } from './support/live-api'
import { demoEmail, FAST_JOBS, startHarness, type Harness } from './support/harness'

/**
 * Issue #7, faults: the scale-out layout. One database, two API processes (server/main.ts) and two
 * worker processes (server/worker.ts), as deployed; 50 plan-set generations asked for at once,
 * spread over both APIs, must each complete exactly once.
 */
const GENERATIONS = 50
/** Second requests for projects already asked for, sent in the same burst: the one-active-job rule must hold across processes. */
const REPEATS = 10

let h: Harness
const children: ChildProcess[] = []
/** Package-job ids each worker process said it took, by worker. */
const takenBy: Record<string, string[]> = { a: [], b: [] }

function spawnProcess(entry: string, env: Record<string, string>, onLogLine?: (entry: Record<string, unknown>) => void): ChildProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', entry], {
    env: { ...process.env, ...FAST_JOBS, NODE_ENV: 'test', LOG_LEVEL: 'warn', DATABASE_URL: h.databaseUrl, DATA_DIR: h.config.dataDir, ...env },
    stdio: ['ignore', onLogLine ? 'pipe' : 'inherit', 'inherit'],
  })
  if (onLogLine) {
    createInterface({ input: child.stdout! }).on('line', (line) => {
      try {
        onLogLine(JSON.parse(line) as Record<string, unknown>)
      } catch {
        process.stdout.write(`${line}\n`)
      }
    })
  }
  children.push(child)
  return child
}

async function untilHealthy(base: string) {
  await waitFor(async () => (await call(base, 'GET', '/api/health')).status === 200, `${base} to answer`, 60_000, 250)
}

let apis: string[]
beforeAll(async () => {
  h = await startHarness()
  const shared = {
    JWT_SECRET: randomBytes(32).toString('hex'),
    // a generation is never taken as lost here: the worker-killed case is package-jobs.test.ts
    JOB_EXPIRE_SECONDS: '300',
  }
  const ports = [await freePort(), await freePort()]
  apis = ports.map((port) => `http://127.0.0.1:${port}`)
  // the first API runs the migrations and loads the demo data before anything else starts
  spawnProcess('server/main.ts', { ...shared, PORT: String(ports[0]), LOAD_DEMO_DATA: 'true' })
  await untilHealthy(apis[0]!)
  spawnProcess('server/main.ts', { ...shared, PORT: String(ports[1]) })
  for (const name of ['a', 'b'] as const) {
    spawnProcess('server/worker.ts', { ...shared, LOG_LEVEL: 'info' }, (entry) => {
      if (entry.msg === 'generating a plan set') takenBy[name]!.push(entry.packageJobId as string)
    })
  }
  await untilHealthy(apis[1]!)
}, 90_000)

afterAll(async () => {
  await Promise.all(children.map(async (child) => {
    if (child.exitCode !== null || child.signalCode !== null) return
    const exited = new Promise((resolve) => child.once('exit', resolve))
    child.kill('SIGTERM')
    const killer = setTimeout(() => child.kill('SIGKILL'), 15_000)
    await exited
    clearTimeout(killer)
  }))
  await h?.close()
}, 30_000)

it('two APIs and two workers on one database complete 50 generations asked for at once, each exactly once', async () => {
  // tokens are stateless: one signed in at the first API is good at the second
  const token = await signIn(apis[0]!, demoEmail('designer'))
  const apiFor = (i: number) => apis[i % 2]!
  const list = await call(apis[1]!, 'GET', '/api/projects?pageSize=10', { token })
  expect(list.status).toBe(200)
  const residential = (list.body.items as { id: string; code: string }[]).find((p) => p.code === 'CH-0101')!
  const source = await call(apis[1]!, 'GET', `/api/projects/${residential.id}/design`, { token })
  const { document, systemKind } = source.body.design as { document: Record<string, unknown>; systemKind: string }

  // 50 projects, each with a copy of the small residential demo design, made through both APIs
  const projectIds: string[] = []
  for (let batch = 0; batch < GENERATIONS; batch += 10) {
    const made = await Promise.all(Array.from({ length: 10 }, async (_, k) => {
      const i = batch + k
      const code = `SCL-${String(i).padStart(2, '0')}`
      const created = await call(apiFor(i), 'POST', '/api/projects', {
        token,
        body: { code, name: `Scale-out drill ${code}`, customerName: 'Drill customer', siteAddress: `${i + 1} Drill Lane`, siteCity: 'Cedar Hollow', systemKind },
      })
      expect(created.status, JSON.stringify(created.body)).toBe(201)
      const id = (created.body.project as { id: string }).id
      const saved = await call(apiFor(i + 1), 'PUT', `/api/projects/${id}/design`, { token, body: { version: null, document } })
      expect(saved.status, JSON.stringify(saved.body)).toBe(201)
      return id
    }))
    projectIds.push(...made)
  }

  // all at once: one request per project plus repeats of the first few, each repeat to the other API
  const requests = [
    ...projectIds.map((id, i) => ({ id, api: apiFor(i) })),
    ...projectIds.slice(0, REPEATS).map((id, i) => ({ id, api: apiFor(i + 1) })),
  ]
  const startedAt = performance.now()
  const answers = await Promise.all(requests.map(({ id, api }) => call(api, 'POST', `/api/projects/${id}/revisions`, { token, body: { description: 'Issued for permit' } })))
  expect(answers.filter((a) => a.status !== 202 && a.status !== 409).map((a) => `${a.status} ${JSON.stringify(a.body)}`)).toEqual([])
  const accepted = answers.filter((a) => a.status === 202).map((a) => a.body.job as { id: string; projectId: string })
  // every project got one; a repeat is refused while its first is under way (it could only be taken if the first had already finished)
  expect(new Set(accepted.map((j) => j.projectId)).size).toBe(GENERATIONS)
  for (const refused of answers.filter((a) => a.status === 409)) {
    const running = refused.body.job as { id: string; projectId: string }
    expect(accepted.map((j) => j.id)).toContain(running.id)
  }

  const states = async () => (await h.db.query<{ state: string; n: string }[]>(
    'SELECT state, count(*) AS n FROM package_jobs WHERE id = ANY($1::uuid[]) GROUP BY state',
    [accepted.map((j) => j.id)],
  )).reduce<Record<string, number>>((acc, row) => ({ ...acc, [row.state]: Number(row.n) }), {})
  await waitFor(async () => {
    const byState = await states()
    return (byState.completed ?? 0) + (byState.failed ?? 0) === accepted.length
  }, 'every generation to finish', 110_000, 500)
  const elapsedS = (performance.now() - startedAt) / 1000
  expect(await states()).toEqual({ completed: accepted.length })

  const jobs = await h.db.query<{ id: string; project_id: string; revision_id: string; attempts: number }[]>(
    'SELECT id, project_id, revision_id, attempts FROM package_jobs WHERE id = ANY($1::uuid[])',
    [accepted.map((j) => j.id)],
  )
  const revisions = await h.db.query<{ id: string; project_id: string; number: number; package_sha256: string }[]>(
    'SELECT id, project_id, number, package_sha256 FROM plan_set_revisions WHERE project_id = ANY($1::uuid[])',
    [projectIds],
  )
  // exactly once: one attempt per job, one revision per job and none besides, no job taken by both workers
  expect(jobs.map((j) => j.attempts)).toEqual(jobs.map(() => 1))
  expect(revisions).toHaveLength(accepted.length)
  expect(new Set(jobs.map((j) => j.revision_id)).size).toBe(accepted.length)
  const revisionById = new Map(revisions.map((r) => [r.id, r]))
  for (const job of jobs) expect(revisionById.get(job.revision_id)?.project_id, job.id).toBe(job.project_id)
  expect(new Set(revisions.map((r) => `${r.project_id}#${r.number}`)).size).toBe(revisions.length)
  const storedNames = (await readdir(path.join(h.config.dataDir, 'files'), { recursive: true })).map((f) => path.basename(f))
  for (const r of revisions) expect(storedNames, r.id).toContain(r.package_sha256)
  const taken = [...takenBy.a!, ...takenBy.b!]
  expect(taken.sort()).toEqual(accepted.map((j) => j.id).sort())
  expect(takenBy.a!.length).toBeGreaterThan(0)
  expect(takenBy.b!.length).toBeGreaterThan(0)

  // a package made by a worker downloads through the API that did not ask for it
  const first = await fetch(`${apiFor(1)}/api/projects/${projectIds[0]}/revisions/0/package`, { headers: { Authorization: `Bearer ${token}` } })
  expect(first.status).toBe(200)
  expect(Buffer.from(await first.arrayBuffer()).subarray(0, 2).toString()).toBe('PK')

  console.info(
    `[fault-scale-out] ${accepted.length} generations (${answers.length - accepted.length} repeats refused) in ${elapsedS.toFixed(1)} s: ` +
      `${(accepted.length / elapsedS).toFixed(2)} per second; worker a took ${takenBy.a!.length}, worker b ${takenBy.b!.length}`,
  )
}, 180_000)
