import request from 'supertest'
import { expect } from 'vitest'
import type { Role } from '../../../shared/auth/roles'
import type { ProjectStatus } from '../../../shared/schemas/project'
import type { TimelineEntryDto } from '../../../shared/schemas/workflow'
import type { WorkflowAction } from '../../../shared/workflow'
import { DEMO_PASSWORD } from '../../../server/demo/seed'
import { DesignEntity, PlanSetRevisionEntity, ProjectEntity } from '../../../server/entities'
import { createFileStorage } from '../../../server/storage'
import { samplePdf, type Workspace } from './workspace'

export const today = () => new Date().toISOString().slice(0, 10)
const STAMP = { stamp: { certificatePassword: DEMO_PASSWORD } }

/** Moving demo projects through the workflow in API tests, with what each step needs; `workspace` is read when a helper runs (after beforeAll). */
export function workflowSteps(workspace: () => Workspace) {
  const idOf = (code: string) => workspace().projects[code]!.id
  const projectRow = (code: string) => workspace().h.db.getRepository(ProjectEntity).findOneByOrFail({ id: idOf(code) })

  /**
   * A published revision of the stored design, written straight to the table: generating real plan
   * sets is the revisions test's job; here the workflow needs the row, and stamping needs a plan-set
   * PDF in storage with a stamp box.
   */
  async function publishRevision(code: string, number: number, designVersionOffset = 0) {
    const design = await workspace().h.db.getRepository(DesignEntity).findOneByOrFail({ projectId: idOf(code) })
    const storage = createFileStorage(workspace().h.config)
    const pdf = await samplePdf(`Plan set of ${code}, revision ${number}`)
    const manifest = Buffer.from(JSON.stringify({ product: 'Stringline', files: [] }))
    const file = async (name: string, bytes: Buffer, mediaType: string) => ({ name, bytes: bytes.length, sha256: await storage.put(bytes), mediaType })
    return workspace().h.db.getRepository(PlanSetRevisionEntity).save({
      organizationId: design.organizationId, projectId: design.projectId, number, description: `Revision ${number}`,
      designSnapshot: design.document, designVersion: design.version + designVersionOffset, engineVersion: 'test', necEdition: 2023,
      evaluation: {} as never, evaluationStatus: 'pass', sheetSize: 'ANSI B', packageName: `${code}_rev${number}.zip`,
      packageSha256: 'a'.repeat(64), packageBytes: 1, files: [await file('plan-set.pdf', pdf, 'application/pdf'), await file('manifest.json', manifest, 'application/json')],
      sheetCount: 1, stampBoxes: [{ page: 0, x: 400, y: 40, width: 178, height: 150 }], createdBy: null,
    })
  }

  /** What each paperwork step records, as a coordinator would enter it (a correction letter is uploaded first). */
  async function paperwork(code: string, action: WorkflowAction): Promise<Record<string, unknown>> {
    switch (action) {
      case 'record_submission':
        return { submission: { method: 'portal', submittedOn: today(), ahjReference: `AHJ-${code}` } }
      case 'record_corrections': {
        const letter = await request(workspace().h.app).post(`/api/projects/${idOf(code)}/submission/letters`).set(workspace().as('coordinator')).attach('file', await samplePdf('Corrections'), 'letter.pdf')
        expect(letter.status).toBe(201)
        return { submission: { letterFileId: letter.body.file.id, receivedOn: today(), responseDueOn: today(), items: ['Show the GEC size'] } }
      }
      case 'record_resubmittal':
        return { submission: { resubmittedOn: today() } }
      case 'record_permit':
        return { submission: { permitNumber: `EP-${code}`, issuedOn: today() } }
      default:
        return {}
    }
  }

  async function step(code: string, role: Role, action: WorkflowAction, extra: { note?: string; revisionNumber?: number; version?: number } & Record<string, unknown> = {}) {
    const version = extra.version ?? (await projectRow(code)).version
    return request(workspace().h.app).post(`/api/projects/${idOf(code)}/transitions`).set(workspace().as(role)).send({ action, version, ...extra })
  }

  /** Takes the step with what it needs (the certificate password to stamp, a paperwork step's details, overridable by `extra`); expects 200. */
  async function stepOk(code: string, role: Role, action: WorkflowAction, extra: Record<string, unknown> = {}) {
    const needs = action === 'approve_and_stamp' ? STAMP : await paperwork(code, action)
    const res = await step(code, role, action, { ...needs, ...extra })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    return res.body as { project: { status: ProjectStatus; version: number }; transition: TimelineEntryDto }
  }

  return { idOf, projectRow, publishRevision, paperwork, step, stepOk }
}
