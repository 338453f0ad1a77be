import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoEmail } from './support/harness'
import { binary, generateRevision, pdfText, projectPath } from './support/plan-sets'
import { parseSvg } from './support/xml-dom'
import { today, workflowSteps } from './support/workflow-steps'
import { fieldsOf, samplePdf, startWorkspace, type Workspace } from './support/workspace'

/**
 * Hostile strings in the text fields people type: stored exactly as given (after the trim every
 * text field applies), never breaking a query, and escaped where they are shown — in the e-mail
 * HTML, the single-line SVG and the plan-set PDF. Text the database cannot hold (NUL, unpaired
 * surrogates) is refused with 400 naming the field, never a 500.
 */
const HOSTILE = [
  `Robert'); DROP TABLE projects;-- "quoted" \\ backslash`,
  '<script>alert("x")</script><img src=x onerror=alert(1)>',
  '\u202Egnp.exe\u200F right-to-left \u200E marks',
  'bell \u0007 escape \u001b[31m red \u007f delete',
  '{{constructor.constructor("return process")()}} ${process.exit()}',
  '%s %n %x \\u0000 written out, emoji 🔌⚡ and 漢字',
] as const
/** As long as a name may be (120 characters), in a letter outside Latin-1. */
const LONG = 'Ω'.repeat(120)

let w: Workspace
const { stepOk, publishRevision } = workflowSteps(() => w)
beforeAll(async () => {
  w = await startWorkspace({ JOB_POLL_SECONDS: '1' }, { worker: true, mail: true })
}, 90_000)
afterAll(() => w.h.close())

describe('stored as given', () => {
  it('keeps hostile text in projects, equipment and user names exactly', async () => {
    for (const [k, text] of [...HOSTILE, LONG].entries()) {
      const created = await request(w.h.app).post('/api/projects').set(w.as('designer')).send({
        code: `HX-${k}`, name: text, customerName: text, customerEmail: null, customerPhone: null, siteAddress: text, siteCity: text,
        jurisdictionId: null, utility: text, systemKind: 'grid_tied', targetSubmissionDate: null, designerId: null, reviewerId: null, coordinatorId: null,
      })
      expect(created.status, `${JSON.stringify(text)}: ${JSON.stringify(created.body)}`).toBe(201)
      const read = (await request(w.h.app).get(`/api/projects/${created.body.project.id}`).set(w.as('reviewer'))).body.project
      expect([read.name, read.customerName, read.siteAddress, read.siteCity, read.utility]).toEqual([text, text, text, text, text])
      const found = await request(w.h.app).get('/api/projects').query({ q: text.slice(0, 40) }).set(w.as('reviewer'))
      expect(found.status).toBe(200)
      expect(found.body.items.map((p: { code: string }) => p.code)).toContain(`HX-${k}`)

      const item = await request(w.h.app).post('/api/equipment').set(w.as('designer')).send({
        kind: 'optimizer', manufacturer: text.slice(0, 80), model: `${k} ${text}`.slice(0, 120), notes: text, spec: { maxOutputVoltageV: 60, maxOutputCurrentA: 15, maxInputVoltageV: 80 },
      })
      expect(item.status, JSON.stringify(item.body)).toBe(201)
      expect(item.body.item).toMatchObject({ manufacturer: text.slice(0, 80), notes: text })
    }
    const user = await request(w.h.app).patch(`/api/users/${w.userIds.coordinator}`).set(w.as('admin')).send({ name: HOSTILE[1] })
    expect(user.status).toBe(200)
    expect(user.body.user.name).toBe(HOSTILE[1])
  })

  it('refuses NUL and unpaired surrogates with 400 naming the field, in any body, query or nested document', async () => {
    const id = w.projects['CH-0105']!.id
    const version = (await request(w.h.app).get(`/api/projects/${id}`).set(w.as('admin'))).body.project.version
    for (const bad of ['a\u0000b', 'half \ud83d pair', 'tail \udc00 first']) {
      const res = await request(w.h.app).patch(`/api/projects/${id}`).set(w.as('admin')).send({ version, name: bad })
      expect(res.status, JSON.stringify(bad)).toBe(400)
      expect(fieldsOf(res)).toEqual(['name'])
    }
    const design = (await request(w.h.app).get(`/api/projects/${id}/design`).set(w.as('designer'))).body.design
    const nested = await request(w.h.app).put(`/api/projects/${id}/design`).set(w.as('designer')).send({
      version: design.version, document: { ...design.document, topology: { ...design.document.topology, arrays: [{ ...design.document.topology.arrays[0]!, name: 'roof\u0000' }] } },
    })
    expect(nested.status).toBe(400)
    expect(fieldsOf(nested)).toEqual(['document.topology.arrays.0.name'])
    const query = await request(w.h.app).get('/api/projects').query({ q: 'x\u0000' }).set(w.as('admin'))
    expect(query.status).toBe(400)
    expect(fieldsOf(query)).toEqual(['q'])
  })
})

describe('escaped where shown', () => {
  it('keeps hostile workflow text out of the markup of mails, and stores comments, notes and paperwork as given', async () => {
    const code = 'CH-0102'
    await publishRevision(code, 0)
    await stepOk(code, 'designer', 'request_review', { note: HOSTILE[1] })
    const comment = await request(w.h.app).post(`${projectPath(w, code)}/review-comments`).set(w.as('reviewer')).send({ anchor: { kind: 'general' }, body: HOSTILE[0] })
    expect(comment.status).toBe(201)
    expect(comment.body.comment.body).toBe(HOSTILE[0])
    const reply = await request(w.h.app).post(`${projectPath(w, code)}/review-comments/${comment.body.comment.id}/replies`).set(w.as('designer')).send({ body: HOSTILE[4] })
    expect(reply.body.comment.replies[0].body).toBe(HOSTILE[4])
    await request(w.h.app).post(`${projectPath(w, code)}/review-comments/${comment.body.comment.id}/resolve`).set(w.as('designer'))
    await stepOk(code, 'reviewer', 'approve_and_stamp', { note: HOSTILE[2] })
    await stepOk(code, 'coordinator', 'record_submission', { submission: { method: 'portal', submittedOn: today(), ahjReference: HOSTILE[0].slice(0, 80) } })
    const letter = await request(w.h.app).post(`${projectPath(w, code)}/submission/letters`).set(w.as('coordinator')).attach('file', await samplePdf('letter'), `${HOSTILE[2]}.pdf`)
    expect(letter.body.file.name).toBe(`${HOSTILE[2]}.pdf`)
    await stepOk(code, 'coordinator', 'record_corrections', {
      note: HOSTILE[1],
      submission: { letterFileId: letter.body.file.id, receivedOn: today(), responseDueOn: today(), items: [...HOSTILE] },
    })
    const current = (await request(w.h.app).get(`${projectPath(w, code)}/submission`).set(w.as('designer'))).body.submission
    expect(current.ahjReference).toBe(HOSTILE[0].slice(0, 80))
    expect(current.letters[0].items.map((i: { text: string }) => i.text)).toEqual([...HOSTILE])
    const csv = await request(w.h.app).get('/api/submissions.csv').set(w.as('coordinator'))
    expect(csv.status).toBe(200)
    expect(csv.text).toContain('DROP TABLE projects')

    // the mail to the reviewer carries the designer's hostile note: as text in the text part, escaped in the HTML
    let mail = w.h.mailbox().find((m) => m.category === 'review_requested')
    for (let i = 0; !mail && i < 80; i++) {
      await new Promise((r) => setTimeout(r, 250))
      mail = w.h.mailbox().find((m) => m.category === 'review_requested')
    }
    expect(mail?.to).toEqual([demoEmail('reviewer')])
    expect(mail!.text).toContain(HOSTILE[1])
    expect(mail!.html).not.toContain('<script>')
    expect(mail!.html).not.toContain('<img src=x')
    expect(mail!.html).toContain('&lt;script&gt;')
  })

  it('draws hostile project and array names into a well-formed SVG and a readable PDF', async () => {
    const code = 'CH-0103'
    const at = projectPath(w, code)
    const design = (await request(w.h.app).get(`${at}/design`).set(w.as('designer'))).body.design
    const document = {
      ...design.document,
      project: { ...design.document.project, name: HOSTILE[1], owner: HOSTILE[0] },
      topology: { ...design.document.topology, arrays: design.document.topology.arrays.map((a: object) => ({ ...a, name: HOSTILE[2] })) },
    }
    expect((await request(w.h.app).put(`${at}/design`).set(w.as('designer')).send({ version: design.version, document })).status).toBe(200)
    const job = await generateRevision(w, code, HOSTILE[3])
    expect(job.state, job.error).toBe('completed')

    const svg = (await binary(request(w.h.app).get(`${at}/revisions/0/files/single-line.svg`).set(w.as('reviewer')))).body.toString('utf8')
    const dom = parseSvg(svg)
    expect(dom.getElementsByTagName('script')).toHaveLength(0)
    expect(dom.getElementsByTagName('img')).toHaveLength(0)
    expect(svg).toContain('&lt;script&gt;')
    const pdf = (await binary(request(w.h.app).get(`${at}/revisions/0/files/plan-set.pdf`).set(w.as('reviewer')))).body
    const text = await pdfText(pdf)
    expect(text).toContain('<script>alert("x")</script>')
    // eslint-disable-next-line no-control-regex
    expect(text).not.toMatch(/[\u0000-\u0008\u202a-\u202e\u200f]/)
  })
})
