import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_DESIGN_INPUTS } from '../../shared/demo/designs'
import { SAFETY_CAUTION } from '../../shared/electrical/caution'
import { toDesignEquipment, type EquipmentItemDto } from '../../shared/schemas/equipment'
import { seedDemo } from '../../server/demo/seed'
import { DEMO_PROJECT_DESIGNS } from '../../server/demo/workspace'
import { AuditEventEntity, DesignEntity, EquipmentItemEntity, JurisdictionProfileEntity, ProjectEntity } from '../../server/entities'
import { fieldsOf, startWorkspace, type Workspace } from './support/workspace'

let w: Workspace
beforeAll(async () => {
  w = await startWorkspace()
})
afterAll(() => w.h.close())

const designPath = (code: string) => `/api/projects/${w.projects[code]!.id}/design`

describe('the demo workspace', () => {
  it('loads once: a second run changes nothing', async () => {
    const counts = () => Promise.all([ProjectEntity, DesignEntity, EquipmentItemEntity, JurisdictionProfileEntity].map((e) => w.h.db.getRepository(e).count()))
    const before = await counts()
    expect(before[0]).toBe(DEMO_PROJECT_DESIGNS.length)
    expect(await seedDemo(w.h.db, w.h.config.bcryptCost)).toBe('present')
    expect(await counts()).toEqual(before)
  })

  it('has one project per system kind, and every demo design evaluates without errors', async () => {
    const kinds = new Set<string>()
    for (const code of Object.keys(w.projects)) {
      const res = await request(w.h.app).post(`${designPath(code)}/evaluate`).set(w.as('reviewer'))
      expect(res.status, code).toBe(200)
      expect(res.body.evaluation.valid, code).toBe(true)
      expect(res.body.evaluation.caution).toBe(SAFETY_CAUTION)
      expect(res.body.evaluation.status, code).not.toBe('fail')
      expect(res.body.evaluation.issues.filter((i: { severity: string }) => i.severity === 'error'), code).toEqual([])
      expect(res.body.designVersion).toBe(1)
      const design = await request(w.h.app).get(designPath(code)).set(w.as('reviewer'))
      kinds.add(design.body.design.systemKind)
      expect(design.body.design.lastEvaluation).toMatchObject({ forVersion: 1, current: true, status: res.body.evaluation.status })
    }
    expect([...kinds].sort()).toEqual(['grid_tied', 'grid_tied_storage', 'ground_mount_farm', 'off_grid'])
  })
})

describe('designs', () => {
  it('reads a design with its indexed figures: 20 × 400 W = 8 kW STC', async () => {
    const res = await request(w.h.app).get(designPath('CH-0101')).set(w.as('coordinator'))
    expect(res.status).toBe(200)
    expect(res.body.design).toMatchObject({ systemKind: 'grid_tied', necEdition: 2023, moduleCount: 20, dcWattsStc: 8000, version: 1 })
    expect(res.body.design.document.topology.strings).toHaveLength(2)
  })

  it('saves at the version read; a stale version answers 409 with the current design; the old evaluation is marked out of date', async () => {
    const current = (await request(w.h.app).get(designPath('CH-0102')).set(w.as('designer'))).body.design
    await request(w.h.app).post(`${designPath('CH-0102')}/evaluate`).set(w.as('designer'))
    const doc = structuredClone(current.document)
    doc.topology.runs[0].lengthFt = 95
    const saved = await request(w.h.app).put(designPath('CH-0102')).set(w.as('designer')).send({ version: current.version, document: doc })
    expect(saved.status).toBe(200)
    expect(saved.body.design).toMatchObject({ version: current.version + 1, lastEvaluation: { current: false } })
    expect(saved.body.design.document.topology.runs[0].lengthFt).toBe(95)

    const stale = await request(w.h.app).put(designPath('CH-0102')).set(w.as('admin')).send({ version: current.version, document: current.document })
    expect(stale.status).toBe(409)
    expect(stale.body.currentVersion).toBe(current.version + 1)
    expect(stale.body.current.document.topology.runs[0].lengthFt).toBe(95)

    const evaluated = await request(w.h.app).post(`${designPath('CH-0102')}/evaluate`).set(w.as('designer'))
    expect(evaluated.body.designVersion).toBe(current.version + 1)
    const run = evaluated.body.evaluation.runs.find((r: { id: string }) => r.id === doc.topology.runs[0].id)
    expect(run.lengthFt).toBe(95)
    const audit = await w.h.db.getRepository(AuditEventEntity).findBy({ action: 'design.saved', entityId: w.projects['CH-0102']!.id })
    expect(audit).toHaveLength(1)
    expect(audit[0]!.data).toMatchObject({ version: current.version + 1 })
  })

  it('answers 422 naming every bad document field, 400 for a malformed body', async () => {
    const current = (await request(w.h.app).get(designPath('CH-0101')).set(w.as('designer'))).body.design
    const doc = structuredClone(current.document)
    doc.topology.arrays[0].moduleCount = 21
    doc.topology.runs[2].from = 'NOWHERE'
    const bad = await request(w.h.app).put(designPath('CH-0101')).set(w.as('designer')).send({ version: current.version, document: doc })
    expect(bad.status).toBe(422)
    expect(fieldsOf(bad)).toEqual(['document.topology.arrays[0].moduleCount', 'document.topology.runs[2].from'])

    const otherKind = await request(w.h.app).put(designPath('CH-0101')).set(w.as('designer')).send({ version: current.version, document: DEMO_DESIGN_INPUTS.offGrid })
    expect(otherKind.status).toBe(422)
    expect(fieldsOf(otherKind)).toEqual(['document.systemKind'])

    const malformed = await request(w.h.app).put(designPath('CH-0101')).set(w.as('designer')).send({ document: 'not an object', extra: 1 })
    expect(malformed.status).toBe(400)
    expect(fieldsOf(malformed)).toEqual(['(root)', 'document', 'version'])
    expect((await request(w.h.app).get(designPath('CH-0101')).set(w.as('designer'))).body.design.version).toBe(current.version)
  })

  it('checks role and organisation: reviewers read and evaluate but do not save; a foreign project is 404', async () => {
    const current = (await request(w.h.app).get(designPath('CH-0103')).set(w.as('reviewer'))).body.design
    expect((await request(w.h.app).put(designPath('CH-0103')).set(w.as('reviewer')).send({ version: current.version, document: current.document })).status).toBe(403)
    expect((await request(w.h.app).put(designPath('CH-0103')).set(w.as('coordinator')).send({ version: current.version, document: current.document })).status).toBe(403)
    expect((await request(w.h.app).get(designPath('CH-0103')).set(w.asForeign('admin'))).status).toBe(404)
    expect((await request(w.h.app).put(designPath('CH-0103')).set(w.asForeign('designer')).send({ version: current.version, document: current.document })).status).toBe(404)
    expect((await request(w.h.app).post(`${designPath('CH-0103')}/evaluate`).set(w.asForeign('reviewer'))).status).toBe(404)
  })

  it('designs a new project from the library end to end: first save with version null (201), then evaluate', async () => {
    const jurisdiction = (await request(w.h.app).get('/api/jurisdictions').set(w.as('designer'))).body.items[0]
    const project = await request(w.h.app)
      .post('/api/projects')
      .set(w.as('designer'))
      .send({ code: 'CH-0400', name: 'Wrenfield residence PV', customerName: 'Oskar Wrenfield', siteAddress: '9 Lantern Row', siteCity: 'Cedar Hollow', systemKind: 'grid_tied', jurisdictionId: jurisdiction.id })
    const id = project.body.project.id
    expect((await request(w.h.app).get(`/api/projects/${id}/design`).set(w.as('designer'))).status).toBe(404)

    const library: EquipmentItemDto[] = (await request(w.h.app).get('/api/equipment?pageSize=100').set(w.as('designer'))).body.items
    const pick = (model: string) => library.find((i) => i.model === model)!
    const equipment = {
      modules: [toDesignEquipment(pick('400 W mono module'), 'MOD400').entry],
      inverters: [toDesignEquipment(pick('7.6 kW string inverter'), 'INV1').entry],
      disconnects: [toDesignEquipment(pick('AC disconnect, non-fused'), 'ACD').entry],
      panels: DEMO_DESIGN_INPUTS.gridTied.equipment.panels,
    }
    const document = {
      ...DEMO_DESIGN_INPUTS.gridTied,
      project: { ...DEMO_DESIGN_INPUTS.gridTied.project, code: 'CH-0400', name: 'Wrenfield residence PV', owner: 'Oskar Wrenfield', siteAddress: '9 Lantern Row' },
      codeBasis: { necEdition: jurisdiction.necEdition, designLowC: jurisdiction.designLowC, designHighC: jurisdiction.designHighC },
      equipment,
    }
    const first = await request(w.h.app).put(`/api/projects/${id}/design`).set(w.as('designer')).send({ version: null, document })
    expect(first.status).toBe(201)
    expect(first.body.design).toMatchObject({ version: 1, moduleCount: 20, dcWattsStc: 8000, lastEvaluation: null })
    const twice = await request(w.h.app).put(`/api/projects/${id}/design`).set(w.as('designer')).send({ version: null, document })
    expect(twice.status).toBe(409)
    expect(twice.body.currentVersion).toBe(1)
    const stillFirst = await request(w.h.app).put(`/api/projects/${id}/design`).set(w.as('designer')).send({ version: 1, document })
    expect(stillFirst.body.design.version).toBe(2)

    const evaluated = await request(w.h.app).post(`/api/projects/${id}/design/evaluate`).set(w.as('designer'))
    expect(evaluated.body.evaluation.valid).toBe(true)
    expect(evaluated.body.evaluation.issues.filter((i: { severity: string }) => i.severity === 'error')).toEqual([])
    const listed = await request(w.h.app).get('/api/projects?q=CH-0400').set(w.as('designer'))
    expect(listed.body.items[0].design).toEqual({ version: 2, evaluationStatus: evaluated.body.evaluation.status })
  })

  it('two first saves at the same time: one is created (201), the other answers 409', async () => {
    const project = await request(w.h.app)
      .post('/api/projects')
      .set(w.as('designer'))
      .send({ code: 'CH-0401', name: 'Race residence PV', customerName: 'R. Race', siteAddress: '1 Dash Way', siteCity: 'Cedar Hollow', systemKind: 'grid_tied' })
    const path = `/api/projects/${project.body.project.id}/design`
    const send = (role: 'designer' | 'admin') => request(w.h.app).put(path).set(w.as(role)).send({ version: null, document: DEMO_DESIGN_INPUTS.gridTied })
    const statuses = (await Promise.all([send('designer'), send('admin')])).map((r) => r.status).sort()
    expect(statuses).toEqual([201, 409])
  })

  it('an archived project\u2019s design is read-only (409)', async () => {
    const { id } = w.projects['CH-0105']!
    const project = (await request(w.h.app).get(`/api/projects/${id}`).set(w.as('designer'))).body.project
    await request(w.h.app).post(`/api/projects/${id}/archive`).set(w.as('designer')).send({ version: project.version })
    const design = (await request(w.h.app).get(`/api/projects/${id}/design`).set(w.as('designer'))).body.design
    const res = await request(w.h.app).put(`/api/projects/${id}/design`).set(w.as('designer')).send({ version: design.version, document: design.document })
    expect(res.status).toBe(409)
    expect(res.body.error.message).toMatch(/archived/)
  })
})
