import { spawn, type ChildProcess } from 'node:child_process'
import { readdir } from 'node:fs/promises'
import path from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, expect, it } from 'vitest'
import { PackageJobEntity, PlanSetRevisionEntity } from '../../server/entities'
import { FAST_JOBS } from './support/harness'
import { startWorkspace, type Workspace } from './support/workspace'

let w: Workspace
const children: ChildProcess[] = []
beforeAll(async () => {
  w = await startWorkspace(FAST_JOBS)
}, 60_000)
afterAll(async () => {
  for (const child of children) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL')
  await w.h.close()
})

/** A worker process as deployed (server/worker.ts), on this test's database and data folder. */
function spawnWorker(extraEnv: Record<string, string> = {}): ChildProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/worker.ts'], {
    env: { ...process.env, ...FAST_JOBS, NODE_ENV: 'test', LOG_LEVEL: 'warn', DATABASE_URL: w.h.databaseUrl, DATA_DIR: w.h.config.dataDir, ...extraEnv },
    stdio: ['ignore', 'inherit', 'inherit'],
  })
  children.push(child)
  return child
}

async function jobUntil(jobId: string, done: (job: { state: string; step: string }) => boolean, what: string) {
  for (let i = 0; i < 200; i++) {
    const res = await request(w.h.app).get(`/api/projects/${w.projects['CH-0101']!.id}/package-jobs/${jobId}`).set(w.as('designer'))
    if (done(res.body.job)) return res.body.job
    await new Promise((r) => setTimeout(r, 250))
  }
  throw new Error(`job ${jobId} never ${what}`)
}

async function filesUnder(dir: string): Promise<string[]> {
  const entries = await readdir(dir, { withFileTypes: true, recursive: true })
  return entries.filter((e) => e.isFile()).map((e) => path.join(e.parentPath, e.name))
}

it('a worker killed mid-way publishes nothing; another worker retries the job to exactly one revision', async () => {
  const projectId = w.projects['CH-0101']!.id
  const first = spawnWorker({ STRINGLINE_FAULT_HANG_AT_STEP: 'packing' })
  const requested = await request(w.h.app).post(`/api/projects/${projectId}/revisions`).set(w.as('designer')).send({ description: 'Issued for permit' })
  expect(requested.status).toBe(202)
  const jobId = requested.body.job.id as string

  const hanging = await jobUntil(jobId, (j) => j.step === 'packing', 'reached packing')
  expect(hanging).toMatchObject({ state: 'running', progress: 75, attempts: 1 })
  const exited = new Promise((resolve) => first.once('exit', resolve))
  first.kill('SIGKILL')
  await exited
  expect(await w.h.db.getRepository(PlanSetRevisionEntity).countBy({ projectId })).toBe(0)
  expect(await w.h.db.getRepository(PackageJobEntity).findOneByOrFail({ id: jobId })).toMatchObject({ state: 'running', revisionId: null })

  spawnWorker()
  const done = await jobUntil(jobId, (j) => j.state === 'completed' || j.state === 'failed', 'finished')
  expect(done, done.error).toMatchObject({ state: 'completed', revisionNumber: 0, attempts: 2 })
  expect(await w.h.db.getRepository(PlanSetRevisionEntity).countBy({ projectId })).toBe(1)
  const files = await filesUnder(path.join(w.h.config.dataDir, 'files'))
  expect(files.filter((f) => f.endsWith('.part'))).toEqual([])
  const revision = await w.h.db.getRepository(PlanSetRevisionEntity).findOneByOrFail({ projectId })
  expect(files.map((f) => path.basename(f))).toContain(revision.packageSha256)
}, 90_000)
