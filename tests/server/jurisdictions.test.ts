import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fieldsOf, startWorkspace, type Workspace } from './support/workspace'

let w: Workspace
beforeAll(async () => {
  w = await startWorkspace()
})
afterAll(() => w.h.close())

const profile = (name: string) => ({
  name,
  necEdition: 2020,
  designLowC: -23,
  designHighC: 34,
  submissionMethod: 'email',
  submissionEmail: 'plans@millbrook.example',
})

describe('jurisdiction profiles', () => {
  it('every member reads the organisation\u2019s profiles; another organisation sees none of them', async () => {
    const res = await request(w.h.app).get('/api/jurisdictions').set(w.as('designer'))
    expect(res.status).toBe(200)
    expect(res.body.total).toBe(1)
    expect(res.body.items[0]).toMatchObject({ name: 'Cedar Hollow Building Department', necEdition: 2023, sheetSize: 'ANSI_B', projectCount: 4, version: 1 })
    expect((await request(w.h.app).get('/api/jurisdictions').set(w.asForeign('admin'))).body.total).toBe(0)
    const id = res.body.items[0].id
    expect((await request(w.h.app).get(`/api/jurisdictions/${id}`).set(w.asForeign('coordinator'))).status).toBe(404)
  })

  it('coordinators and admins create profiles (ANSI B by default); designers and reviewers get 403', async () => {
    const created = await request(w.h.app).post('/api/jurisdictions').set(w.as('coordinator')).send(profile('Millbrook Township'))
    expect(created.status).toBe(201)
    expect(created.body.jurisdiction).toMatchObject({ sheetSize: 'ANSI_B', requiredLabels: [], generalNotesTemplate: '', projectCount: 0, version: 1 })
    expect((await request(w.h.app).post('/api/jurisdictions').set(w.as('admin')).send(profile('Rushford Village'))).status).toBe(201)
    expect((await request(w.h.app).post('/api/jurisdictions').set(w.as('designer')).send(profile('Nope One'))).status).toBe(403)
    expect((await request(w.h.app).post('/api/jurisdictions').set(w.as('reviewer')).send(profile('Nope Two'))).status).toBe(403)
    const taken = await request(w.h.app).post('/api/jurisdictions').set(w.as('admin')).send(profile('millbrook township'))
    expect(taken.status).toBe(409)
    expect(fieldsOf(taken)).toEqual(['name'])
  })

  it('answers 400 naming each bad field: temperatures, labels, template, submission', async () => {
    const res = await request(w.h.app)
      .post('/api/jurisdictions')
      .set(w.as('coordinator'))
      .send({
        ...profile('Bad One'),
        necEdition: 2014,
        designLowC: 40,
        designHighC: 30,
        sheetSize: 'Letter',
        requiredLabels: ['rapid shutdown'],
        generalNotesTemplate: 'Permit for {{project.owner}} {{#each x}}{{/each}}',
        submissionMethod: 'portal',
      })
    expect(res.status).toBe(400)
    expect([...new Set(fieldsOf(res))]).toEqual(['designLowC', 'generalNotesTemplate', 'necEdition', 'requiredLabels.0', 'sheetSize', 'submissionUrl'])
    const templateMessages = res.body.error.fields.filter((f: { field: string }) => f.field === 'generalNotesTemplate').map((f: { message: string }) => f.message)
    expect(templateMessages.join(' ')).toMatch(/unknown field "project.owner".*unknown field "each"/)
    const broken = await request(w.h.app).post('/api/jurisdictions').set(w.as('coordinator')).send({ ...profile('Bad Two'), generalNotesTemplate: '{{#if project.code}}open' })
    expect(fieldsOf(broken)).toEqual(['generalNotesTemplate'])
    expect(broken.body.error.fields[0].message).toMatch(/not a valid template/)
  })

  it('updates at the version read; 409 with the current profile when stale; 422 when the change breaks a rule between fields', async () => {
    const created = await request(w.h.app).post('/api/jurisdictions').set(w.as('coordinator')).send(profile('Alderbank County'))
    const id = created.body.jurisdiction.id
    const changed = await request(w.h.app).patch(`/api/jurisdictions/${id}`).set(w.as('coordinator')).send({ version: 1, sheetSize: 'ANSI_D', requiredLabels: ['690.56(C)'] })
    expect(changed.status).toBe(200)
    expect(changed.body.jurisdiction).toMatchObject({ version: 2, sheetSize: 'ANSI_D', requiredLabels: ['690.56(C)'] })

    const stale = await request(w.h.app).patch(`/api/jurisdictions/${id}`).set(w.as('admin')).send({ version: 1, sheetSize: 'A3' })
    expect(stale.status).toBe(409)
    expect(stale.body).toMatchObject({ currentVersion: 2, current: { id, sheetSize: 'ANSI_D' } })

    const inverted = await request(w.h.app).patch(`/api/jurisdictions/${id}`).set(w.as('coordinator')).send({ version: 2, designLowC: 35 })
    expect(inverted.status).toBe(422)
    expect(fieldsOf(inverted)).toEqual(['designLowC'])
    const noEmail = await request(w.h.app).patch(`/api/jurisdictions/${id}`).set(w.as('coordinator')).send({ version: 2, submissionEmail: null })
    expect(fieldsOf(noEmail)).toEqual(['submissionEmail'])
    expect((await request(w.h.app).patch(`/api/jurisdictions/${id}`).set(w.as('designer')).send({ version: 2, feeNotes: 'x' })).status).toBe(403)
  })

  it('deletes an unused profile at the version read; one in use answers 409', async () => {
    const list = await request(w.h.app).get('/api/jurisdictions?q=cedar').set(w.as('coordinator'))
    const demo = list.body.items[0]
    const inUse = await request(w.h.app).delete(`/api/jurisdictions/${demo.id}?version=${demo.version}`).set(w.as('coordinator'))
    expect(inUse.status).toBe(409)
    expect(inUse.body.error.message).toMatch(/4 project/)

    const created = await request(w.h.app).post('/api/jurisdictions').set(w.as('coordinator')).send(profile('Short-lived Borough'))
    const id = created.body.jurisdiction.id
    expect((await request(w.h.app).delete(`/api/jurisdictions/${id}?version=7`).set(w.as('coordinator'))).status).toBe(409)
    expect((await request(w.h.app).delete(`/api/jurisdictions/${id}`).set(w.as('coordinator'))).status).toBe(400)
    expect((await request(w.h.app).delete(`/api/jurisdictions/${id}?version=1`).set(w.asForeign('coordinator'))).status).toBe(404)
    expect((await request(w.h.app).delete(`/api/jurisdictions/${id}?version=1`).set(w.as('coordinator'))).status).toBe(204)
    expect((await request(w.h.app).get(`/api/jurisdictions/${id}`).set(w.as('coordinator'))).status).toBe(404)
  })

  it('filters by NEC edition and sorts', async () => {
    const res = await request(w.h.app).get('/api/jurisdictions?necEdition=2023&sort=-name').set(w.as('reviewer'))
    expect(res.body.items.map((j: { necEdition: number }) => j.necEdition)).toEqual([2023])
    expect(fieldsOf(await request(w.h.app).get('/api/jurisdictions?necEdition=2011').set(w.as('reviewer')))).toEqual(['necEdition'])
  })
})
