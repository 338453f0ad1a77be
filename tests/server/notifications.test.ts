import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { NOTIFICATION_CATEGORIES } from '../../shared/schemas/notifications'
import { MailTemplates } from '../../server/mail/templates'
import { demoEmail } from './support/harness'
import { workflowSteps } from './support/workflow-steps'
import { fieldsOf, startWorkspace, type Workspace } from './support/workspace'

/** E-mail settings per user, who receives a step's mail, and the development mail catcher. */
let w: Workspace
const CODE = 'CH-0103'
beforeAll(async () => {
  w = await startWorkspace({}, { worker: true, mail: true })
}, 60_000)
afterAll(() => w.h.close())

const { publishRevision, stepOk } = workflowSteps(() => w)

async function caught(category: string, atLeast: number) {
  for (let i = 0; i < 80; i++) {
    const found = w.h.mailbox().filter((m) => m.category === category)
    if (found.length >= atLeast) return found
    await new Promise((r) => setTimeout(r, 250))
  }
  return w.h.mailbox().filter((m) => m.category === category)
}

describe('notification settings', () => {
  it('lists every category switched on, and keeps the ones a user switches off', async () => {
    const start = await request(w.h.app).get('/api/profile/notifications').set(w.as('designer'))
    expect(start.status).toBe(200)
    expect(start.body.items.map((i: { category: string }) => i.category)).toEqual([...NOTIFICATION_CATEGORIES])
    expect(start.body.items.every((i: { enabled: boolean }) => i.enabled)).toBe(true)
    const off = await request(w.h.app).put('/api/profile/notifications').set(w.as('designer')).send({ optOuts: ['changes_requested'] })
    expect(off.status).toBe(200)
    expect(off.body.items.find((i: { category: string }) => i.category === 'changes_requested').enabled).toBe(false)
    const unknown = await request(w.h.app).put('/api/profile/notifications').set(w.as('designer')).send({ optOuts: ['everything'] })
    expect(unknown.status).toBe(400)
    expect(fieldsOf(unknown)).toEqual(['optOuts.0'])
    // another user's settings are untouched
    const reviewer = await request(w.h.app).get('/api/profile/notifications').set(w.as('reviewer'))
    expect(reviewer.body.items.every((i: { enabled: boolean }) => i.enabled)).toBe(true)
  })

  it('sends a step mail to those who want it, never to the one who took the step or to someone switched off', async () => {
    await publishRevision(CODE, 0)
    await stepOk(CODE, 'designer', 'request_review')
    await stepOk(CODE, 'reviewer', 'request_changes', { note: 'Add <b>the GEC</b> size' })
    const review = await caught('review_requested', 1)
    expect(review.flatMap((m) => m.to)).toEqual([demoEmail('reviewer')])
    // the designer switched changes_requested off: nothing goes, however long we wait for the worker
    expect(await caught('changes_requested', 1)).toEqual([])

    const html = review[0]!.html!
    expect(html).toContain(demoEmail('reviewer'))
    expect(html).toContain('CAUTION')
  })
})

describe('mail templates', () => {
  it('escape hostile text in HTML and keep subjects on one line', () => {
    const mail = new MailTemplates().render('changes_requested', {
      recipientName: 'Ines', recipientEmail: 'ines@kestrelfen.example', settingsUrl: 'http://x/profile', actorName: '<img src=x onerror=alert(1)>',
      project: { code: 'KF-1', name: 'Roof\nBcc: victim@example.com', siteCity: 'Fen' }, statusLabel: 'Changes requested', revisionNumber: 0,
      note: '<script>alert(1)</script>', jurisdictionName: 'AHJ', resubmittal: false, projectUrl: 'http://x/p', reviewUrl: 'http://x/r',
    })
    expect(mail.html).not.toContain('<script>')
    expect(mail.html).toContain('&lt;script&gt;')
    expect(mail.html).not.toContain('<img src=x')
    expect(mail.subject).not.toMatch(/[\r\n]/)
    expect(mail.text).toContain('<script>alert(1)</script>')
  })
})

describe('the development mail catcher', () => {
  it('shows administrators what was caught, with text and HTML', async () => {
    const list = await request(w.h.app).get('/api/dev/mailbox').set(w.as('admin'))
    expect(list.status).toBe(200)
    expect(list.body.items.length).toBeGreaterThan(0)
    const first = list.body.items[0]
    const one = await request(w.h.app).get(`/api/dev/mailbox/${first.id}`).set(w.as('admin'))
    expect(one.status).toBe(200)
    expect(one.body).toMatchObject({ id: first.id, subject: first.subject })
    expect(one.body.text).toContain('CAUTION')
    expect(one.body).not.toHaveProperty('raw')
    expect((await request(w.h.app).get('/api/dev/mailbox/../../etc/passwd').set(w.as('admin'))).status).toBe(404)
    expect((await request(w.h.app).get('/api/dev/mailbox/1700000000000-deadbeef').set(w.as('admin'))).status).toBe(404)
    expect((await request(w.h.app).get('/api/dev/mailbox').set(w.as('coordinator'))).status).toBe(403)
  })
})
