import { PDFParse } from 'pdf-parse'
import request from 'supertest'
import { expect } from 'vitest'
import type { Role } from '../../../shared/auth/roles'
import type { Workspace } from './workspace'

/** Supertest collects a binary body as a Buffer. */
export const binary = (req: request.Test) =>
  req.buffer(true).parse((res, done) => {
    const chunks: Buffer[] = []
    res.on('data', (c: Buffer) => chunks.push(c))
    res.on('end', () => done(null, Buffer.concat(chunks)))
  })

/** The text of a PDF, whitespace collapsed (pdf-parse). */
export async function pdfText(bytes: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(bytes) })
  const result = await parser.getText()
  await parser.destroy()
  return result.text.replace(/\s+/g, ' ')
}

export const projectPath = (w: Workspace, code: string) => `/api/projects/${w.projects[code]!.id}`

/** Polls a generation of the project at `projectUrl` (`/api/projects/<id>`) until it has finished, one way or the other. */
export async function finishedJob(w: Workspace, projectUrl: string, jobId: string) {
  for (let i = 0; i < 240; i++) {
    const res = await request(w.h.app).get(`${projectUrl}/package-jobs/${jobId}`).set(w.as('coordinator'))
    expect(res.status).toBe(200)
    if (res.body.job.state === 'completed' || res.body.job.state === 'failed') return res.body.job
    await new Promise((r) => setTimeout(r, 250))
  }
  throw new Error(`job ${jobId} did not finish in 60 s`)
}

/** Requests a generation (a worker must run) and waits for it. */
export async function generateRevision(w: Workspace, code: string, description: string, role: Role = 'designer') {
  const res = await request(w.h.app).post(`${projectPath(w, code)}/revisions`).set(w.as(role)).send({ description })
  expect(res.status, JSON.stringify(res.body)).toBe(202)
  expect(res.body.job).toMatchObject({ state: 'queued', step: 'queued', progress: 0, description, revisionId: null })
  return finishedJob(w, projectPath(w, code), res.body.job.id)
}
