import { expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { SAFETY_CAUTION } from '../../shared/electrical'
import { DEMO_PASSWORD } from '../../server/demo/seed'
import { openBrowser, signIn, type BrowserSession } from './support/browser'

/**
 * The permit journey of the three people after the designer: the designer asks for review, the
 * reviewer comments and sends it back, the designer answers and asks again, the reviewer approves
 * and stamps; the coordinator records the submission, an AHJ corrections round and the permit.
 * Then anyone checks the stamped PDF on the public verification page, and the administrator reads
 * the e-mails the steps sent in the development mail catcher.
 */
const PROJECT_CODE = 'CH-0102'
const PROJECT_NAME = 'Okafor residence PV and storage'
/** A comment with markup in it: shown as the text it is, never run or rendered. */
const HOSTILE_COMMENT = 'Show the voltage drop of R1 <img src=x onerror="alert(1)"> at the design high temperature'
const EMAIL = {
  admin: 'admin@larkspur-solar.example',
  designer: 'designer@larkspur-solar.example',
  reviewer: 'reviewer@larkspur-solar.example',
  coordinator: 'coordinator@larkspur-solar.example',
}

async function apiToken(appUrl: string, email: string): Promise<string> {
  const res = await fetch(`${appUrl}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) })
  expect(res.status).toBe(200)
  return ((await res.json()) as { token: string }).token
}

async function api<T>(appUrl: string, token: string, path: string, init: RequestInit = {}): Promise<T> {
  const res = await fetch(`${appUrl}/api${path}`, { ...init, headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', ...init.headers } })
  if (!res.ok) throw new Error(`${path} answered ${res.status}: ${await res.text()}`)
  return (await res.json()) as T
}

/** Revision 0 of the project, published through the API (the designer's journey shows generating in the browser). */
async function publishRevision(appUrl: string): Promise<string> {
  const token = await apiToken(appUrl, EMAIL.designer)
  const list = await api<{ items: { id: string; code: string }[] }>(appUrl, token, `/projects?q=${PROJECT_CODE}`)
  const projectId = list.items.find((p) => p.code === PROJECT_CODE)!.id
  const { job } = await api<{ job: { id: string } }>(appUrl, token, `/projects/${projectId}/revisions`, { method: 'POST', body: JSON.stringify({ description: 'Issued for permit' }) })
  for (let i = 0; i < 240; i++) {
    const { job: now } = await api<{ job: { state: string; error: string | null } }>(appUrl, token, `/projects/${projectId}/package-jobs/${job.id}`)
    if (now.state === 'completed') return projectId
    if (now.state === 'failed') throw new Error(`generation failed: ${now.error}`)
    await new Promise((r) => setTimeout(r, 500))
  }
  throw new Error('revision 0 was not published within 2 minutes')
}

async function openProject(page: Page, appUrl: string, projectId: string): Promise<void> {
  await page.goto(`${appUrl}/projects/${projectId}`)
  await page.getByRole('heading', { name: PROJECT_NAME }).waitFor()
}

/** Takes a workflow step from the project or review page through its dialog; `fill` enters what the step records. */
async function takeStep(page: Page, label: string, fill: (dialog: ReturnType<Page['getByRole']>) => Promise<void> = async () => {}): Promise<void> {
  await page.getByRole('button', { name: label, exact: true }).first().click()
  const dialog = page.getByRole('dialog', { name: label })
  await dialog.waitFor()
  await fill(dialog)
  await dialog.getByRole('button', { name: label, exact: true }).click()
  await dialog.waitFor({ state: 'hidden' })
}

const statusIs = (page: Page, status: string) => page.getByText(status, { exact: true }).first().waitFor()

async function asPerson<T>(role: keyof typeof EMAIL, appUrl: string, journey: (session: BrowserSession) => Promise<T>): Promise<T> {
  const session = await openBrowser(`permit-${role}`)
  try {
    await session.step('sign in', () => signIn(session, appUrl, EMAIL[role]))
    return await journey(session)
  } finally {
    await session.close()
  }
}

it('the designer asks for review, the reviewer comments and stamps, the coordinator takes it to the permit, the stamp verifies', async () => {
  const appUrl = inject('appUrl')
  const projectId = await publishRevision(appUrl)

  await asPerson('designer', appUrl, async ({ page, step, shoot }) => {
    await step('ask for review', async () => {
      await openProject(page, appUrl, projectId)
      await takeStep(page, 'Ask for review', (dialog) => dialog.getByLabel('Note').fill('Ready for your review'))
      await statusIs(page, 'In review')
      await shoot('01-review-asked')
    })
  })

  await asPerson('reviewer', appUrl, async ({ page, step, shoot }) => {
    await step('open the review page', async () => {
      await openProject(page, appUrl, projectId)
      await page.getByRole('button', { name: 'Review', exact: true }).click()
      await page.getByRole('heading', { name: `Review of ${PROJECT_CODE} · ${PROJECT_NAME}` }).waitFor()
      await page.getByRole('heading', { name: 'Conductor schedule' }).waitFor()
      await expect.poll(() => page.getByText(SAFETY_CAUTION).first().isVisible()).toBe(true)
      await shoot('02-review-page')
    })
    await step('pin a comment to a circuit', async () => {
      const dialogs: string[] = []
      page.on('dialog', (dialog) => {
        dialogs.push(dialog.message())
        void dialog.dismiss()
      })
      await page.getByRole('button', { name: 'Comment on run R1' }).click()
      await page.getByLabel('Comment', { exact: true }).fill(HOSTILE_COMMENT)
      await page.getByRole('button', { name: 'Add comment' }).click()
      await page.getByText(HOSTILE_COMMENT).first().waitFor()
      await page.getByText('Circuit R1').first().waitFor()
      // the markup stayed text: no element was made from it and no script ran
      expect(await page.locator('img[src="x"]').count()).toBe(0)
      expect(dialogs).toEqual([])
      await shoot('03-comment')
    })
    await step('request changes', async () => {
      await takeStep(page, 'Request changes', (dialog) => dialog.getByLabel('Note (required)').fill('One comment on R1'))
      await statusIs(page, 'Changes requested')
    })
  })

  await asPerson('designer', appUrl, async ({ page, step, shoot }) => {
    await step('answer and resolve the comment, then ask again', async () => {
      await page.goto(`${appUrl}/projects/${projectId}/review`)
      await page.getByText(HOSTILE_COMMENT).first().waitFor()
      await page.getByRole('textbox', { name: /^Reply to the comment/ }).fill('Added on E-602')
      await page.getByRole('button', { name: 'Reply', exact: true }).click()
      await page.getByText('Added on E-602').waitFor()
      await page.getByRole('button', { name: 'Resolve', exact: true }).click()
      await expect.poll(() => page.getByRole('button', { name: 'Resolve', exact: true }).count()).toBe(0)
      await shoot('04-comment-resolved')
      await takeStep(page, 'Ask for review')
      await statusIs(page, 'In review')
    })
  })

  await asPerson('reviewer', appUrl, async ({ page, step, shoot }) => {
    await step('approve and stamp with the certificate password', async () => {
      await page.goto(`${appUrl}/projects/${projectId}/review`)
      await page.getByRole('heading', { name: `Review of ${PROJECT_CODE} · ${PROJECT_NAME}` }).waitFor()
      await takeStep(page, 'Approve and stamp', async (dialog) => {
        await dialog.getByLabel('Signing certificate password').fill(DEMO_PASSWORD)
        await shoot('05-approve-dialog', { fullPage: false })
      })
      await statusIs(page, 'Stamped')
      await page.getByText('Stamped', { exact: true }).first().waitFor()
      await shoot('06-stamped')
    })
  })

  const letter = Buffer.from('%PDF-1.4\n1 0 obj <</Type/Catalog/Pages 2 0 R>> endobj\n2 0 obj <</Type/Pages/Kids[]/Count 0>> endobj\ntrailer <</Root 1 0 R/Size 3>>\n%%EOF\n')
  await asPerson('coordinator', appUrl, async ({ page, step, shoot }) => {
    await step('find the stamped set on the submission board', async () => {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Submissions' }).click()
      await page.getByRole('heading', { name: 'Submissions' }).waitFor()
      await page.getByRole('link', { name: PROJECT_CODE, exact: true }).waitFor()
      await shoot('07-board')
    })
    await step('record the submission', async () => {
      await openProject(page, appUrl, projectId)
      await takeStep(page, 'Record submission to the AHJ', async (dialog) => {
        await dialog.getByText('Online portal').click()
        await dialog.getByLabel('AHJ reference').fill('CHBD-2026-7731')
        await dialog.getByLabel('Permit fee, no currency sign').fill('275')
      })
      await statusIs(page, 'Submitted to AHJ')
      await page.getByText('CHBD-2026-7731').first().waitFor()
    })
    await step('record the AHJ corrections with their letter', async () => {
      await takeStep(page, 'Record AHJ corrections', async (dialog) => {
        await dialog.locator('input[type="file"]').setInputFiles({ name: 'corrections-1.pdf', mimeType: 'application/pdf', buffer: letter })
        await dialog.getByText('Uploaded corrections-1.pdf').waitFor()
        await dialog.getByLabel('Response due on').fill(new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10))
        await dialog.getByLabel('Items of the letter, one per line').fill('Show the battery disconnect\nLabel the ESS per 706')
        await dialog.getByLabel('Note (required)').fill('Two items from the plan reviewer')
      })
      await statusIs(page, 'AHJ corrections')
      await page.getByText('Label the ESS per 706').first().waitFor()
      await shoot('08-corrections')
    })
    await step('record the resubmittal and the permit', async () => {
      await takeStep(page, 'Record resubmittal')
      await statusIs(page, 'Resubmitted')
      await takeStep(page, 'Record permit issued', (dialog) => dialog.getByLabel('Permit number').fill('EP-40291'))
      await statusIs(page, 'Permit issued')
      await page.getByText('EP-40291').first().waitFor()
      await shoot('09-permit')
    })
  })

  // the stamped PDF as the coordinator downloads it, and a copy with one byte changed
  const token = await apiToken(appUrl, EMAIL.coordinator)
  const revisions = await api<{ items: { stamp: { verificationId: string } | null }[] }>(appUrl, token, `/projects/${projectId}/revisions`)
  const verificationId = revisions.items[0]!.stamp!.verificationId
  const pdf = Buffer.from(await (await fetch(`${appUrl}/api/projects/${projectId}/revisions/0/files/plan-set.pdf`, { headers: { Authorization: `Bearer ${token}` } })).arrayBuffer())
  const tampered = Buffer.from(pdf)
  const middle = Math.floor(tampered.length / 2)
  tampered[middle] = tampered[middle]! ^ 0x20

  const inspector = await openBrowser('permit-verify')
  try {
    const { page, step, shoot } = inspector
    await step('look the stamp up by its verification id, signed out', async () => {
      await page.goto(`${appUrl}/verify/${verificationId}`)
      await page.getByRole('heading', { name: 'Verify a stamped plan set' }).waitFor()
      await page.getByText('Teodor Lindqvist').first().waitFor()
      await page.getByText(PROJECT_CODE).first().waitFor()
      await shoot('01-by-id')
    })
    await step('check the stamped PDF, then a changed copy', async () => {
      const upload = page.locator('input[type="file"]')
      await upload.setInputFiles({ name: 'plan-set.pdf', mimeType: 'application/pdf', buffer: pdf })
      await page.getByText('Signature intact', { exact: true }).waitFor()
      await shoot('02-intact')
      await upload.setInputFiles({ name: 'plan-set-edited.pdf', mimeType: 'application/pdf', buffer: tampered })
      await page.getByText('Changed after stamping', { exact: true }).waitFor()
      await shoot('03-altered')
    })
  } finally {
    await inspector.close()
  }

  await asPerson('admin', appUrl, async ({ page, step, shoot }) => {
    await step('read the caught e-mails', async () => {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Caught mail' }).click()
      await page.getByRole('heading', { name: 'Caught mail' }).waitFor()
      await page.getByText(`${PROJECT_CODE}: revision 0 is waiting for your review`).first().waitFor()
      await shoot('01-caught-mail')
    })
  })
  // who received what: the worker delivers each step's mails to the people it concerns
  const adminToken = await apiToken(appUrl, EMAIL.admin)
  const to = async (category: string) => {
    const { items } = await api<{ items: { to: string[]; category: string | null; subject: string }[] }>(appUrl, adminToken, '/dev/mailbox')
    return [...new Set(items.filter((m) => m.category === category && m.subject.includes(PROJECT_CODE)).flatMap((m) => m.to))].sort()
  }
  await expect.poll(() => to('permit_issued'), { timeout: 30_000 }).toEqual([EMAIL.designer, EMAIL.reviewer].sort())
  expect(await to('review_requested')).toEqual([EMAIL.reviewer])
  expect(await to('changes_requested')).toEqual([EMAIL.designer])
  expect(await to('stamped')).toEqual([EMAIL.coordinator, EMAIL.designer].sort())
  expect(await to('ahj_corrections')).toEqual([EMAIL.designer, EMAIL.reviewer].sort())
})
