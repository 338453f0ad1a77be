import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fieldsOf, startWorkspace, type Workspace } from './support/workspace'

let w: Workspace
beforeAll(async () => {
  w = await startWorkspace()
})
afterAll(() => w.h.close())

const newProject = (code: string) => ({
  code,
  name: 'Birchwood residence PV',
  customerName: 'Leonie Birchwood',
  customerEmail: 'leonie@birchwood.example',
  siteAddress: '5 Tallow Court',
  siteCity: 'Cedar Hollow',
  systemKind: 'grid_tied',
})

describe('projects', () => {
  it('lists the organisation\u2019s open projects, paged, sorted, searched and filtered on the server', async () => {
    const page = await request(w.h.app).get('/api/projects?pageSize=2&sort=code').set(w.as('reviewer'))
    expect(page.status).toBe(200)
    expect(page.body).toMatchObject({ total: 4, page: 1, pageSize: 2 })
    expect(page.body.items.map((p: { code: string }) => p.code)).toEqual(['CH-0101', 'CH-0102'])
    const second = await request(w.h.app).get('/api/projects?pageSize=2&page=2&sort=-code').set(w.as('reviewer'))
    expect(second.body.items.map((p: { code: string }) => p.code)).toEqual(['CH-0102', 'CH-0101'])

    const byCustomer = await request(w.h.app).get('/api/projects?q=okafor').set(w.as('designer'))
    expect(byCustomer.body.items.map((p: { code: string }) => p.code)).toEqual(['CH-0102'])
    const byAddress = await request(w.h.app).get('/api/projects?q=sorrel flats').set(w.as('designer'))
    expect(byAddress.body.items.map((p: { systemKind: string }) => p.systemKind)).toEqual(['ground_mount_farm'])
    const offGrid = await request(w.h.app).get('/api/projects?systemKind=off_grid&status=draft').set(w.as('coordinator'))
    expect(offGrid.body.total).toBe(1)
    const mine = await request(w.h.app).get(`/api/projects?assigneeId=${w.userIds.reviewer}`).set(w.as('reviewer'))
    expect(mine.body.total).toBe(4)
    expect(mine.body.items[0].reviewer).toEqual({ id: w.userIds.reviewer, name: expect.any(String) })
    expect(mine.body.items[0].jurisdiction.name).toBe('Cedar Hollow Building Department')
    expect(mine.body.items[0].design).toEqual({ version: 1, evaluationStatus: null })

    const byJurisdiction = await request(w.h.app).get(`/api/projects?jurisdictionId=${mine.body.items[0].jurisdiction.id}`).set(w.as('designer'))
    expect(byJurisdiction.body.total).toBe(4)
    const pastTheEnd = await request(w.h.app).get('/api/projects?pageSize=2&page=9').set(w.as('designer'))
    expect(pastTheEnd.body).toMatchObject({ items: [], total: 4, page: 9 })
    // the search text is matched literally, not as a LIKE pattern
    const wildcard = await request(w.h.app).get('/api/projects?q=%25').set(w.as('designer'))
    expect(wildcard.body.total).toBe(0)

    const foreign = await request(w.h.app).get('/api/projects').set(w.asForeign('admin'))
    expect(foreign.body.total).toBe(0)
  })

  it('answers 400 naming each bad query field', async () => {
    const res = await request(w.h.app).get('/api/projects?pageSize=500&sort=password&status=finished&assigneeId=x').set(w.as('designer'))
    expect(res.status).toBe(400)
    expect(fieldsOf(res)).toEqual(['assigneeId', 'pageSize', 'sort', 'status'])
  })

  it('designers and admins create projects (201, status draft); other roles get 403', async () => {
    const created = await request(w.h.app).post('/api/projects').set(w.as('designer')).send(newProject('CH-0200'))
    expect(created.status).toBe(201)
    expect(created.body.project).toMatchObject({ code: 'CH-0200', status: 'draft', version: 1, jurisdiction: null, design: null, designer: null })
    expect((await request(w.h.app).post('/api/projects').set(w.as('admin')).send(newProject('CH-0201'))).status).toBe(201)
    expect((await request(w.h.app).post('/api/projects').set(w.as('reviewer')).send(newProject('CH-0202'))).status).toBe(403)
    expect((await request(w.h.app).post('/api/projects').set(w.as('coordinator')).send(newProject('CH-0203'))).status).toBe(403)
  })

  it('refuses a code already used in the organisation, any case (409), but not one used by another organisation', async () => {
    const taken = await request(w.h.app).post('/api/projects').set(w.as('designer')).send(newProject('ch-0101'))
    expect(taken.status).toBe(409)
    expect(fieldsOf(taken)).toEqual(['code'])
    expect((await request(w.h.app).post('/api/projects').set(w.asForeign('designer')).send(newProject('CH-0101'))).status).toBe(201)
  })

  it('answers 400 naming each bad field, and refuses unknown fields', async () => {
    const res = await request(w.h.app)
      .post('/api/projects')
      .set(w.as('designer'))
      .send({ code: 'has spaces', name: '', customerName: 'A', siteAddress: 'B', siteCity: 'C', systemKind: 'windmill', customerEmail: 'nope', status: 'stamped' })
    expect(res.status).toBe(400)
    expect(fieldsOf(res)).toEqual(['(root)', 'code', 'customerEmail', 'name', 'systemKind'])
  })

  it('refuses a foreign jurisdiction and people of the wrong role or organisation (422 naming each)', async () => {
    const foreignProfile = await request(w.h.app)
      .post('/api/jurisdictions')
      .set(w.asForeign('coordinator'))
      .send({ name: 'Elsewhere', necEdition: 2020, designLowC: -10, designHighC: 35, submissionMethod: 'counter', submissionAddress: '1 Main' })
    expect(foreignProfile.status).toBe(201)
    const res = await request(w.h.app)
      .post('/api/projects')
      .set(w.as('designer'))
      .send({ ...newProject('CH-0210'), jurisdictionId: foreignProfile.body.jurisdiction.id, reviewerId: w.userIds.designer, designerId: w.userIds.reviewer })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['designerId', 'jurisdictionId', 'reviewerId'])
  })

  it('sorts by target date, empty dates first going up and last going down, and answers dates as YYYY-MM-DD', async () => {
    const { id } = w.projects['CH-0102']!
    const current = (await request(w.h.app).get(`/api/projects/${id}`).set(w.as('designer'))).body.project
    const dated = await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('designer')).send({ version: current.version, targetSubmissionDate: '2027-01-15' })
    expect(dated.body.project.targetSubmissionDate).toBe('2027-01-15')
    const codesBy = async (sort: string) =>
      (await request(w.h.app).get(`/api/projects?sort=${sort}`).set(w.as('designer'))).body.items.map((p: { code: string; targetSubmissionDate: string | null }) => `${p.code} ${p.targetSubmissionDate}`)
    expect((await codesBy('targetSubmissionDate')).at(-1)).toBe('CH-0102 2027-01-15')
    expect((await codesBy('-targetSubmissionDate'))[0]).toBe('CH-0102 2027-01-15')
  })

  it('a foreign or malformed project id answers 404 to read and write', async () => {
    const foreign = await request(w.h.app).post('/api/projects').set(w.asForeign('designer')).send(newProject('Q-1'))
    const id = foreign.body.project.id
    expect((await request(w.h.app).get(`/api/projects/${id}`).set(w.as('admin'))).status).toBe(404)
    expect((await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('admin')).send({ version: 1, name: 'Taken over' })).status).toBe(404)
    expect((await request(w.h.app).post(`/api/projects/${id}/archive`).set(w.as('admin')).send({ version: 1 })).status).toBe(404)
    expect((await request(w.h.app).get('/api/projects/not-a-uuid').set(w.as('admin'))).status).toBe(404)
  })

  it('updates at the version read; a stale version answers 409 with the current project and changes nothing', async () => {
    const { id } = w.projects['CH-0103']!
    const first = await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('designer')).send({ version: 1, utility: 'Hollow Creek Co-op (off-grid: none)' })
    expect(first.status).toBe(200)
    expect(first.body.project).toMatchObject({ version: 2, utility: 'Hollow Creek Co-op (off-grid: none)' })

    const stale = await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('admin')).send({ version: 1, name: 'Lost edit' })
    expect(stale.status).toBe(409)
    expect(stale.body.error.code).toBe('version_conflict')
    expect(stale.body.currentVersion).toBe(2)
    expect(stale.body.current).toMatchObject({ id, version: 2, name: 'Fernbrake cabin off-grid PV' })
    expect((await request(w.h.app).get(`/api/projects/${id}`).set(w.as('reviewer'))).body.project.name).toBe('Fernbrake cabin off-grid PV')

    const nothing = await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('designer')).send({ version: 2 })
    expect(nothing.status).toBe(200)
    expect(nothing.body.project.version).toBe(2)
    expect((await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('designer')).send({ version: 1 })).status).toBe(409)

    expect((await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('reviewer')).send({ version: 2, name: 'x' })).status).toBe(403)
    expect(fieldsOf(await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('designer')).send({ name: 'no version' }))).toEqual(['version'])
  })

  it('refuses to change the system kind of a project whose design is of that kind (409)', async () => {
    const { id } = w.projects['CH-0101']!
    const res = await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('designer')).send({ version: 1, systemKind: 'off_grid' })
    expect(res.status).toBe(409)
    expect(fieldsOf(res)).toEqual(['systemKind'])
  })

  it('archives (hidden from working lists, read-only) and restores', async () => {
    const created = await request(w.h.app).post('/api/projects').set(w.as('designer')).send(newProject('CH-0300'))
    const id = created.body.project.id
    const archived = await request(w.h.app).post(`/api/projects/${id}/archive`).set(w.as('designer')).send({ version: 1 })
    expect(archived.status).toBe(200)
    expect(archived.body.project.archivedAt).not.toBeNull()
    const open = await request(w.h.app).get('/api/projects?q=CH-0300').set(w.as('designer'))
    expect(open.body.total).toBe(0)
    const inArchive = await request(w.h.app).get('/api/projects?q=CH-0300&archived=true').set(w.as('designer'))
    expect(inArchive.body.total).toBe(1)
    expect((await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('designer')).send({ version: 2, name: 'x' })).status).toBe(409)
    expect((await request(w.h.app).post(`/api/projects/${id}/archive`).set(w.as('designer')).send({ version: 2 })).status).toBe(409)
    const restored = await request(w.h.app).post(`/api/projects/${id}/restore`).set(w.as('admin')).send({ version: 2 })
    expect(restored.body.project).toMatchObject({ archivedAt: null, version: 3 })
  })

  it('fills the jurisdiction\u2019s general notes with the project\u2019s fields', async () => {
    const { id } = w.projects['CH-0101']!
    const res = await request(w.h.app).get(`/api/projects/${id}/general-notes`).set(w.as('reviewer'))
    expect(res.status).toBe(200)
    expect(res.body.notes).toContain('Marsh residence PV (CH-0101) at 14 Quillon Lane, Cedar Hollow')
    expect(res.body.notes).toContain('NFPA 70, 2023 edition')
    expect(res.body.notes).toContain('Hollow Creek Electric Cooperative gives written permission')
  })
})
