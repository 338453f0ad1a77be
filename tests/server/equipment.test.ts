import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fieldsOf, startWorkspace, type Workspace } from './support/workspace'

let w: Workspace
beforeAll(async () => {
  w = await startWorkspace()
})
afterAll(() => w.h.close())

/** Invented 430 W module: 1762 × 1134 mm gives 21.5 % at STC. */
const moduleSpec = {
  pmaxW: 430, vocV: 38.9, vmpV: 32.4, iscA: 14.0, impA: 13.28,
  vocCoefficient: { value: -0.26, unit: '%/°C' }, pmaxCoefficient: { value: -0.3, unit: '%/°C' }, iscCoefficient: { value: 0.046, unit: '%/°C' },
  cells: 108, maxSeriesFuseA: 25, maxSystemVoltageV: 1000, lengthMm: 1762, widthMm: 1134,
}
const moduleItem = (model: string, spec: Record<string, unknown> = {}) => ({ kind: 'module', manufacturer: 'Generic', model, spec: { ...moduleSpec, ...spec } })

const csvUpload = (path: string, role: { Authorization: string }, csv: string) =>
  request(w.h.app).post(path).set(role).attach('file', Buffer.from(csv, 'utf8'), { filename: 'modules.csv', contentType: 'text/csv' })

describe('equipment library', () => {
  it('holds the generic demo equipment of every kind, none of it implausible, invisible to another organisation', async () => {
    const res = await request(w.h.app).get('/api/equipment?pageSize=100').set(w.as('reviewer'))
    expect(res.status).toBe(200)
    const kinds = new Set(res.body.items.map((i: { kind: string }) => i.kind))
    expect([...kinds].sort()).toEqual(['battery', 'charge_controller', 'combiner', 'disconnect', 'inverter', 'microinverter', 'module', 'optimizer', 'transformer'])
    expect(res.body.items.flatMap((i: { warnings: unknown[] }) => i.warnings)).toEqual([])
    const modules = await request(w.h.app).get('/api/equipment?kind=module&sort=-model').set(w.as('designer'))
    expect(modules.body.items.map((i: { model: string }) => i.model)).toEqual(['420 W mono module, 1500 V', '400 W mono module'])
    const search = await request(w.h.app).get('/api/equipment?q=hybrid').set(w.as('designer'))
    expect(search.body.items.map((i: { spec: { kind: string } }) => i.spec.kind)).toEqual(['hybrid'])
    expect((await request(w.h.app).get('/api/equipment').set(w.asForeign('designer'))).body.total).toBe(0)
    expect((await request(w.h.app).get(`/api/equipment/${res.body.items[0].id}`).set(w.asForeign('designer'))).status).toBe(404)
  })

  it('saves a plausible module without warnings, and an implausible one with warnings naming each field', async () => {
    const good = await request(w.h.app).post('/api/equipment').set(w.as('designer')).send(moduleItem('430 W test module'))
    expect(good.status).toBe(201)
    expect(good.body.item).toMatchObject({ kind: 'module', version: 1, warnings: [], datasheet: null, notes: '' })

    // 430 W on 1.2 m² is 35.8 % (over 25 %); −0.6 %/°C Voc; 0.2 %/°C Isc: each a likely typing slip
    const odd = await request(w.h.app)
      .post('/api/equipment')
      .set(w.as('admin'))
      .send(moduleItem('430 W odd module', { lengthMm: 1200, widthMm: 1000, vocCoefficient: { value: -0.6, unit: '%/°C' }, iscCoefficient: { value: 0.2, unit: '%/°C' } }))
    expect(odd.status).toBe(201)
    expect(odd.body.item.warnings.map((f: { field: string }) => f.field).sort()).toEqual(['spec.iscCoefficient.value', 'spec.pmaxW', 'spec.vocCoefficient.value'])
    expect(odd.body.item.warnings.find((f: { field: string }) => f.field === 'spec.pmaxW').message).toMatch(/35\.8 %/)

    // a Voc coefficient given in V/°C is converted before the range check: −0.1 V/°C of 38.9 V is −0.257 %/°C
    const volts = await request(w.h.app).post('/api/equipment').set(w.as('designer')).send(moduleItem('430 W volts module', { vocCoefficient: { value: -0.1, unit: 'V/°C' } }))
    expect(volts.body.item.warnings).toEqual([])
  })

  it('refuses physically impossible data and malformed items (400 naming each field)', async () => {
    const impossible = await request(w.h.app).post('/api/equipment').set(w.as('designer')).send(moduleItem('impossible', { vmpV: 40, impA: 14.5 }))
    expect(impossible.status).toBe(400)
    expect(fieldsOf(impossible)).toEqual(['spec.impA', 'spec.vmpV'])
    const positiveVoc = await request(w.h.app).post('/api/equipment').set(w.as('designer')).send(moduleItem('rising voc', { vocCoefficient: { value: 0.27, unit: '%/°C' } }))
    expect(fieldsOf(positiveVoc)).toEqual(['spec.vocCoefficient.value'])
    const unknownKind = await request(w.h.app).post('/api/equipment').set(w.as('designer')).send({ kind: 'toaster', manufacturer: 'x', model: 'y', spec: {} })
    expect(fieldsOf(unknownKind)).toEqual(['kind'])
    const window = await request(w.h.app)
      .post('/api/equipment')
      .set(w.as('designer'))
      .send({
        kind: 'inverter', manufacturer: 'Generic', model: 'backwards window',
        spec: { kind: 'string', pvInput: { maxDcVoltageV: 600, mpptMinV: 500, mpptMaxV: 200, startVoltageV: 650, mpptCount: 2, maxInputCurrentPerMpptA: 15, maxShortCircuitCurrentPerMpptA: 20 }, acVoltageV: 240, phases: 1, maxContinuousOutputA: 32, ratedPowerW: 7600 },
      })
    expect(fieldsOf(window)).toEqual(['spec.pvInput.mpptMinV', 'spec.pvInput.startVoltageV'])
  })

  it('only designers and admins change the library (403 for reviewers and coordinators)', async () => {
    for (const role of ['reviewer', 'coordinator'] as const) {
      expect((await request(w.h.app).post('/api/equipment').set(w.as(role)).send(moduleItem(`by ${role}`))).status).toBe(403)
    }
  })

  it('replaces an item at the version read; 409 with the current item when stale; the kind cannot change', async () => {
    const created = await request(w.h.app).post('/api/equipment').set(w.as('designer')).send(moduleItem('440 W module'))
    const id = created.body.item.id
    const updated = await request(w.h.app).put(`/api/equipment/${id}`).set(w.as('designer')).send({ ...moduleItem('440 W module', { pmaxW: 440, vmpV: 33.1 }), version: 1, notes: 'rev B' })
    expect(updated.status).toBe(200)
    expect(updated.body.item).toMatchObject({ version: 2, notes: 'rev B', spec: { pmaxW: 440 } })
    const stale = await request(w.h.app).put(`/api/equipment/${id}`).set(w.as('admin')).send({ ...moduleItem('440 W module'), version: 1 })
    expect(stale.status).toBe(409)
    expect(stale.body).toMatchObject({ currentVersion: 2, current: { notes: 'rev B' } })
    const rekind = await request(w.h.app)
      .put(`/api/equipment/${id}`)
      .set(w.as('designer'))
      .send({ kind: 'optimizer', manufacturer: 'Generic', model: '440 W module', version: 2, spec: { maxOutputVoltageV: 60, maxOutputCurrentA: 15, maxInputVoltageV: 80 } })
    expect(rekind.status).toBe(422)
    expect(fieldsOf(rekind)).toEqual(['kind'])
    expect((await request(w.h.app).delete(`/api/equipment/${id}?version=1`).set(w.as('designer'))).status).toBe(409)
    expect((await request(w.h.app).delete(`/api/equipment/${id}?version=2`).set(w.asForeign('designer'))).status).toBe(404)
    expect((await request(w.h.app).delete(`/api/equipment/${id}?version=2`).set(w.as('designer'))).status).toBe(204)
    expect((await request(w.h.app).get(`/api/equipment/${id}`).set(w.as('designer'))).status).toBe(404)
  })

  it('exports CSV that imports into another organisation unchanged (round trip)', async () => {
    const exported = await request(w.h.app).get('/api/equipment/csv/inverter').set(w.as('reviewer'))
    expect(exported.status).toBe(200)
    expect(exported.headers['content-type']).toMatch(/^text\/csv/)
    expect(exported.headers['content-disposition']).toContain('equipment-inverter.csv')
    const csv = exported.text
    expect(csv.split('\r\n')[0]).toMatch(/^manufacturer,model,notes,kind,pvInput\.maxDcVoltageV,/)

    const imported = await csvUpload('/api/equipment/csv/inverter', w.asForeign('designer'), csv)
    expect(imported.status).toBe(200)
    expect(imported.body.report).toEqual({ mode: 'all_or_nothing', imported: csv.trim().split('\r\n').length - 1, rejected: [] })
    const again = await request(w.h.app).get('/api/equipment/csv/inverter').set(w.asForeign('reviewer'))
    expect(again.text).toBe(csv)
  })

  it('keeps spreadsheet formulas out of exported text and restores the text on import', async () => {
    await request(w.h.app).post('/api/equipment').set(w.as('designer')).send({ ...moduleItem('=HYPERLINK("x")'), manufacturer: 'Generic' })
    const csv = (await request(w.h.app).get('/api/equipment/csv/module').set(w.as('designer'))).text
    expect(csv).toContain(`"'=HYPERLINK(""x"")"`)
    const imported = await csvUpload('/api/equipment/csv/module', w.asForeign('admin'), csv)
    expect(imported.body.items.map((i: { model: string }) => i.model)).toContain('=HYPERLINK("x")')
  })

  it('a file with bad rows imports nothing by default and reports every bad row and field (422)', async () => {
    const header = 'manufacturer,model,notes,pmaxW,vocV,vmpV,iscA,impA,vocCoefficient.value,vocCoefficient.unit,pmaxCoefficient.value,pmaxCoefficient.unit,iscCoefficient.value,iscCoefficient.unit,cells,maxSeriesFuseA,maxSystemVoltageV,lengthMm,widthMm'
    const good = (model: string) => `Generic,${model},,430,38.9,32.4,14,13.28,-0.26,%/°C,-0.3,%/°C,0.046,%/°C,108,25,1000,1762,1134`
    const csv = [
      header,
      good('CSV 430 A'),
      'Generic,CSV 430 B,,430,thirty,32.4,14,13.28,-0.26,%/°C,-0.3,%/°C,0.046,%/°C,108,25,1000,1762,1134',
      good('CSV 430 C'),
      good('CSV 430 A'),
      good('400 W mono module'),
      'Generic,CSV 430 D,,430,38.9,32.4,14,13.28,,,-0.3,%/°C,0.046,%/°C,,25,1000,1762',
    ].join('\n')
    const before = (await request(w.h.app).get('/api/equipment?kind=module').set(w.as('designer'))).body.total

    const strict = await csvUpload('/api/equipment/csv/module', w.as('designer'), csv)
    expect(strict.status).toBe(422)
    expect(strict.body.error.code).toBe('import_rejected')
    expect(strict.body.report).toEqual({
      mode: 'all_or_nothing',
      imported: 0,
      rejected: [
        { row: 3, field: 'vocV', message: expect.stringMatching(/number/) },
        { row: 5, field: 'model', message: 'Generic CSV 430 A is already in row 2' },
        { row: 6, field: 'model', message: 'Generic 400 W mono module is already in the library' },
        { row: 7, field: '(row)', message: expect.stringMatching(/fields/i) },
      ],
    })
    expect((await request(w.h.app).get('/api/equipment?kind=module').set(w.as('designer'))).body.total).toBe(before)

    const lenient = await csvUpload('/api/equipment/csv/module?mode=valid_rows', w.as('designer'), csv)
    expect(lenient.status).toBe(200)
    expect(lenient.body.report.mode).toBe('valid_rows')
    expect(lenient.body.report.imported).toBe(2)
    expect(lenient.body.report.rejected.map((r: { row: number }) => r.row)).toEqual([3, 5, 6, 7])
    expect(lenient.body.items.map((i: { model: string }) => i.model)).toEqual(['CSV 430 A', 'CSV 430 C'])
    expect((await request(w.h.app).get('/api/equipment?kind=module').set(w.as('designer'))).body.total).toBe(before + 2)
  })

  it('refuses a file of another kind\u2019s columns (422), a missing file (400), JSON instead of a form (415) and binary content (415)', async () => {
    const inverterCsv = (await request(w.h.app).get('/api/equipment/csv/inverter').set(w.as('designer'))).text
    const wrongKind = await csvUpload('/api/equipment/csv/module', w.as('designer'), inverterCsv)
    expect(wrongKind.status).toBe(422)
    expect(wrongKind.body.error.fields[0].message).toMatch(/unknown column\(s\) kind, pvInput/)
    const noFile = await request(w.h.app).post('/api/equipment/csv/module').set(w.as('designer')).field('note', 'forgot it')
    expect(noFile.status).toBe(400)
    expect(fieldsOf(noFile)).toEqual(['file'])
    expect((await request(w.h.app).post('/api/equipment/csv/module').set(w.as('designer')).send({ rows: [] })).status).toBe(415)
    const binary = await request(w.h.app)
      .post('/api/equipment/csv/module')
      .set(w.as('designer'))
      .attach('file', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0xff, 0xfe]), { filename: 'modules.csv', contentType: 'text/csv' })
    expect(binary.status).toBe(415)
    expect((await request(w.h.app).post('/api/equipment/csv/toaster').set(w.as('designer')).attach('file', Buffer.from('a'), 'x.csv')).status).toBe(400)
    expect((await csvUpload('/api/equipment/csv/module', w.as('reviewer'), inverterCsv)).status).toBe(403)
  })
})
