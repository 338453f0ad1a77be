import { createHash } from 'node:crypto'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoDesign } from '../../shared/demo/designs'
import { PACKAGE_FILE_NAMES } from '../../shared/schemas/revision'
import { DesignEntity, PackageJobEntity, PlanSetRevisionEntity } from '../../server/entities'
import { PackageQueue } from '../../server/jobs/queue'
import { startPackageWorker, type RunningWorker } from '../../server/jobs/worker'
import { fieldsOf, samplePdf, startWorkspace, type Workspace } from './support/workspace'
import { unzip } from '../support/unzip'
import { binary, finishedJob, generateRevision, pdfText, projectPath as projectPathOf } from './support/plan-sets'

let w: Workspace
let worker: RunningWorker
beforeAll(async () => {
  // the default expiry: a slow machine must not time a healthy generation out
  w = await startWorkspace({ JOB_POLL_SECONDS: '1', JOB_RETRY_DELAY_SECONDS: '1' })
  worker = await startPackageWorker({ db: w.h.db, config: w.h.config, logger: pino({ level: 'silent' }) })
}, 60_000)
afterAll(async () => {
  await worker.stop()
  await w.h.close()
})

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex')
const projectPath = (code: string) => projectPathOf(w, code)
const finished = (code: string, jobId: string, path = projectPath(code)) => finishedJob(w, path, jobId)
const generate = (code: string, description: string) => generateRevision(w, code, description)

describe('generating a revision', () => {
  let first: { number: number; packageSha256: string; packageBytes: number; packageName: string; files: { name: string; sha256: string; bytes: number }[] }

  it('queues, runs in the worker and publishes revision 0 with its files; the zip matches its recorded SHA-256', async () => {
    // a datasheet on the library item the design names is merged into the set
    const items = await request(w.h.app).get('/api/equipment?kind=inverter&pageSize=100').set(w.as('designer'))
    const doc = demoDesign('gridTied')
    const inverterName = doc.equipment.inverters[0]!.name
    const item = items.body.items.find((i: { manufacturer: string; model: string }) => `${i.manufacturer} ${i.model}` === inverterName)
    expect(item, `library item named ${inverterName}`).toBeDefined()
    const attached = await request(w.h.app)
      .post(`/api/equipment/${item.id}/datasheet`)
      .set(w.as('designer'))
      .field('version', String(item.version))
      .attach('file', await samplePdf('Datasheet of the demo string inverter'), 'inverter.pdf')
    expect(attached.status).toBe(200)

    const job = await generate('CH-0101', 'Issued for permit')
    expect(job, job.error).toMatchObject({ state: 'completed', step: 'done', progress: 100, revisionNumber: 0, attempts: 1, error: null })
    expect(job.requestedBy.name).toBe('Imani Okafor')

    const list = await request(w.h.app).get(`${projectPath('CH-0101')}/revisions`).set(w.as('reviewer'))
    expect(list.status).toBe(200)
    expect(list.body.activeJob).toBeNull()
    expect(list.body.items).toHaveLength(1)
    first = list.body.items[0]
    expect(first).toMatchObject({ number: 0, description: 'Issued for permit', designVersion: 1, necEdition: 2023, sheetSize: 'ANSI_B', packageName: 'CH-0101_rev00.zip' })
    expect(first.files.map((f) => f.name).sort()).toEqual([...PACKAGE_FILE_NAMES].sort())

    const zip = await binary(request(w.h.app).get(`${projectPath('CH-0101')}/revisions/0/package`).set(w.as('coordinator')))
    expect(zip.status).toBe(200)
    expect(zip.headers['content-type']).toBe('application/zip')
    expect(zip.headers['content-disposition']).toContain('CH-0101_rev00.zip')
    const bytes = zip.body as Buffer
    expect(bytes.length).toBe(first.packageBytes)
    expect(sha256(bytes)).toBe(first.packageSha256)
    const entries = await unzip(bytes)
    for (const f of first.files) {
      expect(entries.get(f.name), f.name).toBeDefined()
      expect(sha256(entries.get(f.name)!), f.name).toBe(f.sha256)
    }
    const manifest = JSON.parse(entries.get('manifest.json')!.toString('utf8'))
    expect(JSON.stringify(manifest)).toContain('CH-0101')
  })

  it('serves each file of the package with its media type; SVG with a strict policy', async () => {
    const pdf = await binary(request(w.h.app).get(`${projectPath('CH-0101')}/revisions/0/files/plan-set.pdf`).set(w.as('reviewer')))
    expect(pdf.status).toBe(200)
    expect(pdf.headers['content-type']).toBe('application/pdf')
    expect(pdf.headers['content-disposition']).toMatch(/^inline; filename=/)
    expect(sha256(pdf.body)).toBe(first.files.find((f) => f.name === 'plan-set.pdf')!.sha256)
    // the datasheet attached to the library item the design names is in the set
    const planSet = await pdfText(pdf.body)
    expect(planSet).toContain('Datasheet of the demo string inverter')
    // the demo jurisdiction profile's own notes and label sections are printed (G-001, E-603)
    expect(planSet).toContain('Call for rough and final electrical inspections')
    expect(planSet).toMatch(/Section 705\.10: see label #\d+ above\./)
    const svg = await binary(request(w.h.app).get(`${projectPath('CH-0101')}/revisions/0/files/single-line.svg`).set(w.as('reviewer')))
    expect(svg.status).toBe(200)
    expect(svg.headers['content-type']).toContain('image/svg+xml')
    expect(svg.headers['content-security-policy']).toBe("default-src 'none'; style-src 'unsafe-inline'")
    expect(svg.headers['x-content-type-options']).toBe('nosniff')
    expect(svg.headers['content-disposition']).toMatch(/^inline; filename=/)
    expect((svg.body as Buffer).toString('utf8')).toContain('<svg')
    const csv = await request(w.h.app).get(`${projectPath('CH-0101')}/revisions/0/files/calculations.csv`).set(w.as('reviewer'))
    expect(csv.headers['content-disposition']).toMatch(/^attachment; filename=/)
    const unknown = await request(w.h.app).get(`${projectPath('CH-0101')}/revisions/0/files/secrets.txt`).set(w.as('reviewer'))
    expect(unknown.status).toBe(400)
    expect(fieldsOf(unknown)).toEqual(['name'])
    expect((await request(w.h.app).get(`${projectPath('CH-0101')}/revisions/7/package`).set(w.as('reviewer'))).status).toBe(404)
  })

  it('numbers the next generation 1 after a design change; revision 0 keeps its bytes; compare and the narrative show the change', async () => {
    const design = (await request(w.h.app).get(`${projectPath('CH-0101')}/design`).set(w.as('designer'))).body.design
    const doc = structuredClone(design.document)
    doc.topology.runs[0].lengthFt += 40
    const saved = await request(w.h.app).put(`${projectPath('CH-0101')}/design`).set(w.as('designer')).send({ version: design.version, document: doc })
    expect(saved.status).toBe(200)

    const job = await generate('CH-0101', 'Longer home run per site visit')
    expect(job, job.error).toMatchObject({ state: 'completed', revisionNumber: 1 })
    const list = (await request(w.h.app).get(`${projectPath('CH-0101')}/revisions`).set(w.as('reviewer'))).body
    expect(list.items.map((r: { number: number }) => r.number)).toEqual([1, 0])
    expect(list.items[0]).toMatchObject({ designVersion: design.version + 1, packageName: 'CH-0101_rev01.zip' })
    expect(list.items[1]).toEqual(first)

    const again = await binary(request(w.h.app).get(`${projectPath('CH-0101')}/revisions/0/package`).set(w.as('designer')))
    expect(sha256(again.body)).toBe(first.packageSha256)

    const compare = await request(w.h.app).get(`${projectPath('CH-0101')}/revisions/compare?from=0&to=1`).set(w.as('coordinator'))
    expect(compare.status).toBe(200)
    expect(compare.body.diff).toMatchObject({ from: 0, to: 1 })
    const changes = compare.body.diff.groups.flatMap((g: { changes: unknown[] }) => g.changes)
    expect(changes.length).toBeGreaterThan(0)
    expect(JSON.stringify(changes)).toContain(String(doc.topology.runs[0].lengthFt))

    const narrative = await binary(request(w.h.app).get(`${projectPath('CH-0101')}/revisions/compare/narrative.pdf?from=0&to=1`).set(w.as('coordinator')))
    expect(narrative.status).toBe(200)
    expect(narrative.headers['content-type']).toBe('application/pdf')
    expect((narrative.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(await pdfText(narrative.body)).toContain('CH-0101')
    const bad = await request(w.h.app).get(`${projectPath('CH-0101')}/revisions/compare?from=0&to=x`).set(w.as('coordinator'))
    expect(bad.status).toBe(400)
    expect(fieldsOf(bad)).toEqual(['to'])
  })

  it('refuses, in the database, to change or delete a published revision', async () => {
    const id = (await w.h.db.getRepository(PlanSetRevisionEntity).findOneByOrFail({ projectId: w.projects['CH-0101']!.id, number: 0 })).id
    await expect(w.h.db.query(`UPDATE plan_set_revisions SET description = 'edited' WHERE id = $1`, [id])).rejects.toThrow(/immutable/)
    await expect(w.h.db.query(`UPDATE plan_set_revisions SET package_sha256 = repeat('0', 64) WHERE id = $1`, [id])).rejects.toThrow(/immutable/)
    await expect(w.h.db.query(`DELETE FROM plan_set_revisions WHERE id = $1`, [id])).rejects.toThrow(/immutable/)
    expect((await w.h.db.getRepository(PlanSetRevisionEntity).findOneByOrFail({ id })).description).toBe('Issued for permit')
  })
})

describe('one generation at a time, and retries', () => {
  it('answers 409 with the running job to a second request, and requeues a failed job on retry', async () => {
    const projectId = w.projects['CH-0103']!.id
    const design = await w.h.db.getRepository(DesignEntity).findOneByOrFail({ projectId })
    // a job the worker never got: it holds the project's one active slot
    const held = await w.h.db.getRepository(PackageJobEntity).save({
      organizationId: design.organizationId, projectId, requestedBy: null, designVersion: design.version, description: 'Held',
      state: 'running', step: 'drawing', progress: 15, error: null, attempts: 1, revisionId: null,
    })
    const second = await request(w.h.app).post(`${projectPath('CH-0103')}/revisions`).set(w.as('designer')).send({ description: 'Second' })
    expect(second.status).toBe(409)
    expect(second.body.job).toMatchObject({ id: held.id, state: 'running', step: 'drawing' })
    expect((await request(w.h.app).get(`${projectPath('CH-0103')}/revisions`).set(w.as('reviewer'))).body.activeJob.id).toBe(held.id)
    expect((await request(w.h.app).post(`${projectPath('CH-0103')}/package-jobs/${held.id}/retry`).set(w.as('designer'))).status).toBe(409)

    await w.h.db.getRepository(PackageJobEntity).update({ id: held.id }, { state: 'failed', error: 'Worker lost' })
    const retried = await request(w.h.app).post(`${projectPath('CH-0103')}/package-jobs/${held.id}/retry`).set(w.as('designer'))
    expect(retried.status).toBe(202)
    expect(retried.body.job).toMatchObject({ id: held.id, state: 'queued', error: null })
    const done = await finished('CH-0103', held.id)
    expect(done, done.error).toMatchObject({ state: 'completed', revisionNumber: 0, attempts: 2 })
  })
})

describe('what cannot be generated', () => {
  it('answers 422 for a project with no design and for a design with failing checks, naming them', async () => {
    const created = await request(w.h.app).post('/api/projects').set(w.as('designer')).send({
      code: 'CH-0990', name: 'Wrenfield garage roof', customerName: 'Odile Marchetti', siteAddress: '14 Tanager Lane', siteCity: 'Cedar Hollow', systemKind: 'grid_tied',
    })
    expect(created.status).toBe(201)
    const path = `/api/projects/${created.body.project.id}`
    const none = await request(w.h.app).post(`${path}/revisions`).set(w.as('designer')).send({ description: 'Issued for permit' })
    expect(none.status).toBe(422)
    expect(fieldsOf(none)).toEqual(['design'])

    const doc = structuredClone(demoDesign('gridTied'))
    // 16 in series: 16 × 37.1 V = 593.6 V at STC, above 600 V once corrected to the design low
    for (const string of doc.topology.strings) string.modulesInSeries = 16
    doc.topology.arrays[0]!.moduleCount = 32
    expect((await request(w.h.app).put(`${path}/design`).set(w.as('designer')).send({ version: null, document: doc })).status).toBe(201)
    const failing = await request(w.h.app).post(`${path}/revisions`).set(w.as('designer')).send({ description: 'Issued for permit' })
    expect(failing.status).toBe(422)
    // NEC 2023 690.7: at most 600 V DC on a one- or two-family dwelling (value from memory); the inverter's DC input limit as well
    expect(fieldsOf(failing)).toEqual(['string.S1.dwellingLimit', 'string.S1.inverterLimit', 'string.S2.dwellingLimit', 'string.S2.inverterLimit'])
    expect(await w.h.db.getRepository(PackageJobEntity).countBy({ projectId: created.body.project.id })).toBe(0)

    // a design that went bad after the request: the worker refuses it at once, in words, without retrying
    const late = await w.h.db.getRepository(PackageJobEntity).save({
      organizationId: (await w.h.db.getRepository(DesignEntity).findOneByOrFail({ projectId: created.body.project.id })).organizationId,
      projectId: created.body.project.id, requestedBy: null, designVersion: 1, description: 'Issued for permit',
      state: 'queued', step: 'queued', progress: 0, error: null, attempts: 0, revisionId: null,
    })
    const queue = new PackageQueue(w.h.databaseUrl, w.h.config.jobs, 'api')
    await queue.send({ packageJobId: late.id })
    await queue.stop()
    const refused = await finished('CH-0990', late.id, path)
    expect(refused).toMatchObject({ state: 'failed', attempts: 1, revisionId: null })
    expect(refused.error).toContain('string.S1.dwellingLimit')
    expect(await w.h.db.getRepository(PlanSetRevisionEntity).countBy({ projectId: created.body.project.id })).toBe(0)

    const empty = await request(w.h.app).post(`${path}/revisions`).set(w.as('designer')).send({ description: '  ' })
    expect(empty.status).toBe(400)
    expect(fieldsOf(empty)).toEqual(['description'])
  })

  it('lets only admins and designers generate or retry', async () => {
    for (const role of ['reviewer', 'coordinator'] as const) {
      const res = await request(w.h.app).post(`${projectPath('CH-0102')}/revisions`).set(w.as(role)).send({ description: 'Issued for permit' })
      expect(res.status, role).toBe(403)
    }
    expect(await w.h.db.getRepository(PackageJobEntity).countBy({ projectId: w.projects['CH-0102']!.id })).toBe(0)
  })

  it('answers 404 to another organisation on every route', async () => {
    const job = await w.h.db.getRepository(PackageJobEntity).findOneByOrFail({ projectId: w.projects['CH-0101']!.id, description: 'Issued for permit' })
    const p = projectPath('CH-0101')
    const reads = [
      `${p}/revisions`, `${p}/package-jobs/${job.id}`, `${p}/revisions/0/package`, `${p}/revisions/0/files/plan-set.pdf`,
      `${p}/revisions/compare?from=0&to=1`, `${p}/revisions/compare/narrative.pdf?from=0&to=1`,
    ]
    for (const url of reads) expect((await request(w.h.app).get(url).set(w.asForeign('admin'))).status, url).toBe(404)
    expect((await request(w.h.app).post(`${p}/revisions`).set(w.asForeign('designer')).send({ description: 'Mine now' })).status).toBe(404)
    expect((await request(w.h.app).post(`${p}/package-jobs/${job.id}/retry`).set(w.asForeign('designer'))).status).toBe(404)
    // a job id of this organisation under another of its projects is not found either
    expect((await request(w.h.app).get(`${projectPath('CH-0102')}/package-jobs/${job.id}`).set(w.as('admin'))).status).toBe(404)
  })
})
