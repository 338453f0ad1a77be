import request from 'supertest'
import { PDFDocument, StandardFonts } from 'pdf-lib'
import type { Role } from '../../../shared/auth/roles'
import { login, seedTwoOrganizations, startHarness, tokensByRole, type Harness, type HarnessOptions } from './harness'

export interface Workspace {
  h: Harness
  /** Authorization header of a demo-organisation user of this role. */
  as: (role: Role) => { Authorization: string }
  /** The same for the foreign organisation ("Quillfeather Energy"). */
  asForeign: (role: Role) => { Authorization: string }
  userIds: Record<Role, string>
  /** Demo projects by code, e.g. `CH-0101`. */
  projects: Record<string, { id: string; version: number }>
}

/** A fresh database with the demo organisation (and its demo workspace, the reviewer with demo stamp credentials) plus a foreign one, signed in as every role of both. */
export async function startWorkspace(overrides: Record<string, string> = {}, options: HarnessOptions = {}): Promise<Workspace> {
  const h = await startHarness(overrides, options)
  await seedTwoOrganizations(h)
  const tokens = await tokensByRole(h.app)
  const roles = ['admin', 'designer', 'reviewer', 'coordinator'] as const
  const foreign = Object.fromEntries(await Promise.all(roles.map(async (r) => [r, (await login(h.app, `${r}@quillfeather.example`)).token] as const)))
  const as = (role: Role) => ({ Authorization: `Bearer ${tokens[role]}` })
  const me = await Promise.all(roles.map(async (r) => [r, (await request(h.app).get('/api/auth/me').set(as(r))).body.user.id as string] as const))
  const list = await request(h.app).get('/api/projects?pageSize=100').set(as('admin'))
  const projects = Object.fromEntries((list.body.items as { code: string; id: string; version: number }[]).map((p) => [p.code, { id: p.id, version: p.version }]))
  return {
    h,
    as,
    asForeign: (role) => ({ Authorization: `Bearer ${foreign[role]}` }),
    userIds: Object.fromEntries(me) as Record<Role, string>,
    projects,
  }
}

/** Field names of a 4xx answer, sorted. */
export const fieldsOf = (res: { body: { error?: { fields?: { field: string }[] } } }) => (res.body.error?.fields ?? []).map((f) => f.field).sort()

/** A real one-page PDF (pdf-lib), so the content checks have genuine PDF bytes to read. */
export async function samplePdf(text: string): Promise<Buffer> {
  const doc = await PDFDocument.create()
  // fixed dates: the same text gives the same bytes, so content addressing can be checked
  doc.setCreationDate(new Date(Date.UTC(2026, 0, 1)))
  doc.setModificationDate(new Date(Date.UTC(2026, 0, 1)))
  const page = doc.addPage([612, 792])
  page.drawText(text, { x: 72, y: 700, size: 14, font: await doc.embedFont(StandardFonts.Helvetica) })
  return Buffer.from(await doc.save())
}
