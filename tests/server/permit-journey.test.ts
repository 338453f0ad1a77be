import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Role } from '../../shared/auth/roles'
import type { ProjectStatus } from '../../shared/schemas/project'
import type { WorkflowAction } from '../../shared/workflow'
import { DEMO_PASSWORD } from '../../server/demo/seed'
import { RevisionStampEntity, UserEntity } from '../../server/entities'
import { DIGEST_QUEUE } from '../../server/jobs/mail-queue'
import { PackageQueue } from '../../server/jobs/queue'
import { unzip } from '../support/unzip'
import { demoEmail } from './support/harness'
import { binary, generateRevision, pdfText, projectPath } from './support/plan-sets'
import { fieldsOf, samplePdf, startWorkspace, type Workspace } from './support/workspace'

/**
 * The whole permit journey through the API, as the three people of the organisation take it:
 * the designer hands a plan set to review, the reviewer comments and asks for changes, approves
 * and stamps; the coordinator records the submission, an AHJ corrections round and the permit.
 * Mail goes through the real worker to a fake SMTP server on loopback.
 */
let w: Workspace
const CODE = 'CH-0101'
const path = () => projectPath(w, CODE)
const today = new Date().toISOString().slice(0, 10)

beforeAll(async () => {
  w = await startWorkspace({ JOB_POLL_SECONDS: '1', JOB_RETRY_DELAY_SECONDS: '1' }, { worker: true, mail: true })
}, 90_000)
afterAll(() => w.h.close())

const version = async () => (await request(w.h.app).get(path()).set(w.as('admin'))).body.project.version as number

async function step(role: Role, action: WorkflowAction, extra: Record<string, unknown> = {}) {
  return request(w.h.app).post(`${path()}/transitions`).set(w.as(role)).send({ action, version: await version(), ...extra })
}

async function stepOk(role: Role, action: WorkflowAction, extra: Record<string, unknown> = {}): Promise<ProjectStatus> {
  const res = await step(role, action, extra)
  expect(res.status, `${action}: ${JSON.stringify(res.body)}`).toBe(200)
  return res.body.project.status
}

/** The mails caught so far with this category, waiting for the worker to deliver them. */
async function mailsOf(category: string, count: number) {
  for (let i = 0; i < 120; i++) {
    const found = w.h.mailbox().filter((m) => m.category === category)
    if (found.length >= count) return found
    await new Promise((r) => setTimeout(r, 250))
  }
  throw new Error(`expected ${count} "${category}" mail(s); caught ${JSON.stringify(w.h.mailbox().map((m) => [m.category, m.to]))}`)
}
const recipients = (mails: { to: string[] }[]) => mails.flatMap((m) => m.to).sort()

describe('a permit set from design to permit', () => {
  let verificationId: string
  let signedPdf: Buffer

  it('hands revision 0 to review, and the assigned reviewer hears of it', async () => {
    const job = await generateRevision(w, CODE, 'Issued for permit')
    expect(job.state, job.error).toBe('completed')
    expect(await stepOk('designer', 'request_review')).toBe('in_review')
    const mails = await mailsOf('review_requested', 1)
    expect(recipients(mails)).toEqual([demoEmail('reviewer')])
    expect(mails[0]!.subject).toContain(CODE)
    expect(mails[0]!.text).toContain('Imani Okafor')
    expect(mails[0]!.text).toContain('licensed')
  })

  it('pins comments to the set, a sheet and a circuit; approval waits for them', async () => {
    const comment = (anchor: object, body: string, role: Role = 'reviewer') => request(w.h.app).post(`${path()}/review-comments`).set(w.as(role)).send({ anchor, body })
    expect((await comment({ kind: 'general' }, 'Show the rapid-shutdown initiator on E-601')).status).toBe(201)
    expect((await comment({ kind: 'sheet', sheetId: 'E-602' }, 'Add the conduit fill derivation')).status).toBe(201)
    const circuit = await comment({ kind: 'circuit', circuitId: 'R1' }, 'Check the voltage drop of this run')
    expect(circuit.status, JSON.stringify(circuit.body)).toBe(201)
    expect(circuit.body.comment).toMatchObject({ anchor: { kind: 'circuit', circuitId: 'R1' }, revision: { number: 0 }, author: { role: 'reviewer' }, resolved: null })

    const unknownRun = await comment({ kind: 'circuit', circuitId: 'R999' }, 'x')
    expect(unknownRun.status).toBe(422)
    expect(fieldsOf(unknownRun)).toEqual(['anchor.circuitId'])
    expect((await comment({ kind: 'sheet', sheetId: '../etc' }, 'x')).status).toBe(400)
    expect((await comment({ kind: 'general' }, 'x', 'designer')).status).toBe(403)

    const approve = await step('reviewer', 'approve_and_stamp', { stamp: { certificatePassword: DEMO_PASSWORD } })
    expect(approve.status).toBe(409)
    expect(fieldsOf(approve)).toEqual(['comments'])
    expect(approve.body.error.message).toContain('3 review comments are still open')
  })

  it('goes back to the designer, who answers and resolves every comment', async () => {
    expect(await stepOk('reviewer', 'request_changes', { note: 'See the three comments' })).toBe('changes_requested')
    expect(recipients(await mailsOf('changes_requested', 1))).toEqual([demoEmail('designer')])
    const list = (await request(w.h.app).get(`${path()}/review-comments`).set(w.as('designer'))).body
    expect(list.open).toBe(3)
    for (const c of list.items) {
      const replied = await request(w.h.app).post(`${path()}/review-comments/${c.id}/replies`).set(w.as('designer')).send({ body: 'Done in the drawing notes' })
      expect(replied.status).toBe(201)
      const resolved = await request(w.h.app).post(`${path()}/review-comments/${c.id}/resolve`).set(w.as('designer'))
      expect(resolved.status).toBe(200)
      expect(resolved.body.comment.resolved.by.role).toBe('designer')
    }
    const again = await request(w.h.app).post(`${path()}/review-comments/${list.items[0].id}/resolve`).set(w.as('designer'))
    expect(again.status).toBe(409)
    const after = (await request(w.h.app).get(`${path()}/review-comments`).set(w.as('reviewer'))).body
    expect(after.open).toBe(0)
    expect(after.items.every((c: { replies: unknown[] }) => c.replies.length === 1)).toBe(true)
    expect(await stepOk('designer', 'request_review')).toBe('in_review')
  })

  it('stamps only with the certificate password, then signs the plan set and rebuilds the package', async () => {
    let res = await step('reviewer', 'approve_and_stamp')
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['stamp.certificatePassword'])
    res = await step('reviewer', 'approve_and_stamp', { stamp: { certificatePassword: 'not-the-password' } })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['stamp.certificatePassword'])
    expect(await w.h.db.getRepository(RevisionStampEntity).count()).toBe(0)

    expect(await stepOk('reviewer', 'approve_and_stamp', { stamp: { certificatePassword: DEMO_PASSWORD }, note: 'Checked against the adopted edition' })).toBe('stamped')
    const revision = (await request(w.h.app).get(`${path()}/revisions`).set(w.as('coordinator'))).body.items[0]
    expect(revision.stamp).toMatchObject({ holderName: 'Teodor Lindqvist', licenceNumber: 'EC-40718 (demo)', demo: true })
    verificationId = revision.stamp.verificationId
    expect(verificationId).toMatch(/^[0-9A-Z]{4}-[0-9A-Z]{4}-[0-9A-Z]{4}$/)

    signedPdf = (await binary(request(w.h.app).get(`${path()}/revisions/0/files/plan-set.pdf`).set(w.as('coordinator')))).body
    expect(revision.files.find((f: { name: string }) => f.name === 'plan-set.pdf').sha256).toBe(revision.stamp.signedPdfSha256)
    const text = await pdfText(signedPdf)
    // every framed sheet carries the stamp text; the caution stays on every sheet
    const sheets = revision.sheetCount as number
    expect(text.split(verificationId).length - 1).toBeGreaterThanOrEqual(sheets)
    expect(text.split('Licence EC-40718 (demo), Cedar Hollow County (invented)').length - 1).toBe(sheets)
    expect(text).toContain('DEMO CERTIFICATE')

    const zip = (await binary(request(w.h.app).get(`${path()}/revisions/0/package`).set(w.as('coordinator')))).body
    const entries = await unzip(zip)
    const manifest = JSON.parse(entries.get('manifest.json')!.toString('utf8'))
    expect(manifest.stampedBy).toMatchObject({ name: 'Teodor Lindqvist', licenceNumber: 'EC-40718 (demo)', verificationId, demoCertificate: true })
    expect(entries.get('plan-set.pdf')!.equals(signedPdf)).toBe(true)

    const mails = await mailsOf('stamped', 2)
    expect(recipients(mails)).toEqual([demoEmail('coordinator'), demoEmail('designer')].sort())
  })

  it('verifies the stamped PDF as intact, and a copy with one byte changed as altered', async () => {
    const verify = (bytes: Buffer) => request(w.h.app).post('/api/verify').attach('file', bytes, 'plan-set.pdf')
    const intact = await verify(signedPdf)
    expect(intact.status, JSON.stringify(intact.body)).toBe(200)
    expect(intact.body).toMatchObject({ signature: 'valid', match: 'exact', stamp: { verificationId, projectCode: CODE, revisionNumber: 0, holderName: 'Teodor Lindqvist' } })

    const tampered = Buffer.from(signedPdf)
    const at = Math.floor(tampered.length / 3)
    tampered[at] = tampered[at]! ^ 0x01
    const changed = await verify(tampered)
    expect(changed.status).toBe(200)
    expect(changed.body.signature).toBe('altered')
    expect(changed.body.match).toBe('altered_copy')
    expect(changed.body.stamp.verificationId).toBe(verificationId)
    expect(changed.body.reason).toContain('changed after signing')

    const unsigned = await verify(await samplePdf('An unsigned sheet'))
    expect(unsigned.body).toMatchObject({ signature: 'unsigned', match: 'unknown', stamp: null })

    const byId = await request(w.h.app).get(`/api/verify/${verificationId.toLowerCase().replace(/-/g, ' ')}`)
    expect(byId.status).toBe(200)
    expect(byId.body).toEqual({ verificationId, projectCode: CODE, revisionNumber: 0, holderName: 'Teodor Lindqvist', stampedAt: expect.any(String) })
    expect((await request(w.h.app).get('/api/verify/0000-0000-0000')).status).toBe(404)
    expect((await request(w.h.app).get('/api/verify/nonsense')).status).toBe(400)
  })

  it('records the submission, a corrections round and the permit, each as a workflow step', async () => {
    let res = await step('coordinator', 'record_submission')
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['submission'])
    res = await step('coordinator', 'record_submission', { submission: { method: 'fax', submittedOn: '2099-01-01' } })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['submission.method'])
    res = await step('coordinator', 'record_submission', { submission: { method: 'portal', submittedOn: '2099-01-01' } })
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['submission.submittedOn'])
    expect(await stepOk('coordinator', 'record_submission', { submission: { method: 'portal', submittedOn: today, ahjReference: 'CHBD-2026-0412', feeAmount: '350', feeDueOn: today } })).toBe('submitted')
    expect(recipients(await mailsOf('submitted', 2))).toEqual([demoEmail('designer'), demoEmail('reviewer')].sort())

    const letter = await request(w.h.app).post(`${path()}/submission/letters`).set(w.as('coordinator')).attach('file', await samplePdf('Correction letter 1'), 'corrections-1.pdf')
    expect(letter.status, JSON.stringify(letter.body)).toBe(201)
    expect(await stepOk('coordinator', 'record_corrections', {
      note: 'Two items from the plan reviewer',
      submission: { letterFileId: letter.body.file.id, receivedOn: today, responseDueOn: today, items: ['Show the GEC size', 'Label the AC disconnect'] },
    })).toBe('ahj_corrections')
    expect(recipients(await mailsOf('ahj_corrections', 2))).toEqual([demoEmail('designer'), demoEmail('reviewer')].sort())

    let current = (await request(w.h.app).get(`${path()}/submission`).set(w.as('designer'))).body
    expect(current.submission).toMatchObject({ method: 'portal', ahjReference: 'CHBD-2026-0412', feeCents: 35000, feeAmount: '350.00', revision: { number: 0 } })
    expect(current.submission.letters).toHaveLength(1)
    expect(current.due.map((d: { kind: string }) => d.kind).sort()).toEqual(['corrections_response', 'fee_payment'])

    const patched = await request(w.h.app).patch(`${path()}/submission`).set(w.as('coordinator')).send({
      version: current.submission.version, feePaidOn: today, correctionItems: [{ letterId: current.submission.letters[0].id, index: 0, done: true }],
    })
    expect(patched.status, JSON.stringify(patched.body)).toBe(200)
    expect(patched.body.submission.letters[0].items).toEqual([{ text: 'Show the GEC size', done: true }, { text: 'Label the AC disconnect', done: false }])
    const stale = await request(w.h.app).patch(`${path()}/submission`).set(w.as('coordinator')).send({ version: current.submission.version, inspectionOn: today })
    expect(stale.status).toBe(409)

    const letterFile = (await binary(request(w.h.app).get(`${path()}/submission/files/${letter.body.file.id}`).set(w.as('designer')))).body
    expect(await pdfText(letterFile)).toContain('Correction letter 1')

    expect(await stepOk('coordinator', 'record_resubmittal', { submission: { resubmittedOn: today } })).toBe('resubmitted')
    expect(await stepOk('coordinator', 'record_permit', { submission: { permitNumber: 'EP-88213', issuedOn: today, expiresOn: '2099-12-31', inspectionOn: today } })).toBe('permit_issued')
    expect(recipients(await mailsOf('permit_issued', 2))).toEqual([demoEmail('designer'), demoEmail('reviewer')].sort())
    current = (await request(w.h.app).get(`${path()}/submission`).set(w.as('reviewer'))).body
    expect(current.submission).toMatchObject({ permitNumber: 'EP-88213', permitIssuedOn: today, permitExpiresOn: '2099-12-31', feePaidOn: today })
    expect(current.submission.letters[0].resubmittedOn).toBe(today)

    const board = await request(w.h.app).get('/api/submissions?status=permit_issued').set(w.as('coordinator'))
    expect(board.status).toBe(200)
    expect(board.body.items.map((r: { project: { code: string } }) => r.project.code)).toEqual([CODE])
    expect(board.body.items[0]).toMatchObject({ submission: { method: 'portal', permitNumber: 'EP-88213', openCorrectionItems: 0 }, nextDueOn: today, overdue: false })
    const csv = await request(w.h.app).get('/api/submissions.csv').set(w.as('coordinator'))
    expect(csv.status).toBe(200)
    expect(csv.text.split('\r\n')[0]).toBe('Project code,Project,Status,Jurisdiction,Method,Submitted on,AHJ reference,Permit number,Open correction items,Next due,Overdue')
    expect(csv.text).toContain(`${CODE},`)
    expect((await request(w.h.app).get('/api/submissions').set(w.as('designer'))).status).toBe(403)

    const due = await request(w.h.app).get('/api/submissions/due').set(w.as('coordinator'))
    expect(due.body.items.map((d: { kind: string }) => d.kind)).toEqual(['inspection'])
  })

  it('sends the daily digest to the coordinator and the administrator with what is due', async () => {
    // as the worker's daily schedule does it: a job on the digest queue
    const queue = new PackageQueue(w.h.databaseUrl, w.h.config.jobs, 'api')
    await (await queue.boss()).send(DIGEST_QUEUE, {})
    await queue.stop()
    const mails = await mailsOf('daily_digest', 2)
    expect(recipients(mails)).toEqual([demoEmail('admin'), demoEmail('coordinator')].sort())
    expect(mails[0]!.text).toContain('Inspection under permit EP-88213')
  })

  it('starts a new draft when the stamped design is edited; the stamp stays with its revision', async () => {
    const design = (await request(w.h.app).get(`${path()}/design`).set(w.as('designer'))).body.design
    const saved = await request(w.h.app).put(`${path()}/design`).set(w.as('designer')).send({ version: design.version, document: { ...design.document, project: { ...design.document.project, name: `${design.document.project.name} (revised)` } } })
    expect(saved.status, JSON.stringify(saved.body)).toBe(200)
    expect((await request(w.h.app).get(path()).set(w.as('designer'))).body.project.status).toBe('draft')
    const revisions = (await request(w.h.app).get(`${path()}/revisions`).set(w.as('designer'))).body.items
    expect(revisions[0].stamp.verificationId).toBe(verificationId)
    // the old revision is not of the current design: it cannot be handed to review again
    const res = await step('designer', 'request_review')
    expect(res.status).toBe(422)
    expect(fieldsOf(res)).toEqual(['revisionNumber'])
  })
})

describe('stamping preconditions', () => {
  it('refuses a reviewer without a stamp image or certificate, or with an expired licence (422 naming the field)', async () => {
    const code = 'CH-0102'
    expect((await generateRevision(w, code, 'Issued for permit')).state).toBe('completed')
    const at = projectPath(w, code)
    const send = async (role: Role, action: WorkflowAction, extra: Record<string, unknown> = {}) => {
      const v = (await request(w.h.app).get(at).set(w.as('admin'))).body.project.version
      return request(w.h.app).post(`${at}/transitions`).set(w.as(role)).send({ action, version: v, ...extra })
    }
    expect((await send('designer', 'request_review')).status).toBe(200)
    const users = w.h.db.getRepository(UserEntity)
    const reviewer = await users.findOneByOrFail({ email: demoEmail('reviewer') })
    try {
      await users.update({ id: reviewer.id }, { stampImageFileId: null })
      let res = await send('reviewer', 'approve_and_stamp', { stamp: { certificatePassword: DEMO_PASSWORD } })
      expect(res.status).toBe(422)
      expect(fieldsOf(res)).toEqual(['stampImage'])
      await users.update({ id: reviewer.id }, { stampImageFileId: reviewer.stampImageFileId, licenceExpiry: '2021-03-31' })
      res = await send('reviewer', 'approve_and_stamp', { stamp: { certificatePassword: DEMO_PASSWORD } })
      expect(res.status).toBe(422)
      expect(fieldsOf(res)).toEqual(['licenceExpiry'])
      const profile = await request(w.h.app).get('/api/profile/stamp').set(w.as('reviewer'))
      expect(profile.body.problems.map((p: { field: string }) => p.field)).toEqual(['licenceExpiry'])
    } finally {
      await users.update({ id: reviewer.id }, { stampImageFileId: reviewer.stampImageFileId, licenceExpiry: reviewer.licenceExpiry })
    }
    const profile = await request(w.h.app).get('/api/profile/stamp').set(w.as('reviewer'))
    expect(profile.body).toMatchObject({ problems: [], certificate: { demo: true, commonName: 'Teodor Lindqvist' }, stampImage: { fileName: 'demo-stamp.png' } })
    expect((await request(w.h.app).get('/api/profile/stamp').set(w.as('designer'))).status).toBe(403)
  })
})
