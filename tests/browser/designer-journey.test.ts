import { createHash } from 'node:crypto'
import { readFile } from 'node:fs/promises'
import type { Locator } from 'playwright-core'
import { expect, inject, it } from 'vitest'
import { evaluateDesign, SAFETY_CAUTION } from '../../shared/electrical'
import { parseDesign } from '../../shared/schemas/design'
import { PACKAGE_FILE_NAMES, PACKAGE_STEP_LABELS } from '../../shared/schemas/revision'
import { openBrowser, signIn } from './support/browser'
import { unzip } from '../support/unzip'

const DESIGNER = 'designer@larkspur-solar.example'
const PROJECT_CODE = 'CH-0101'
const EDITED_RUN = 'R1'
/** The demo has the roof run at 65 ft; any other length shows the edit reached the package. */
const EDITED_LENGTH_FT = 72
const DESCRIPTION = 'Issued for permit'
const STEP_LABELS = new Set(Object.values(PACKAGE_STEP_LABELS))

interface ProgressSample { label: string; percent: number }
const isWorking = (s: ProgressSample) =>
  s.percent > 0 && s.percent < 100 && s.label !== PACKAGE_STEP_LABELS.queued && s.label !== PACKAGE_STEP_LABELS.done

it('a designer edits a run, generates a revision, watches it, previews it and downloads the zip', async () => {
  const appUrl = inject('appUrl')
  const session = await openBrowser('designer')
  const { page, shoot, step, close } = session
  try {
    await step('sign in', () => signIn(session, appUrl, DESIGNER))

    await step('open the project', async () => {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Projects' }).click()
      await page.getByRole('heading', { name: 'Projects' }).waitFor()
      const link = page.getByRole('link', { name: PROJECT_CODE, exact: true })
      await link.waitFor()
      await shoot('02-projects')
      await link.click()
      await page.getByRole('heading', { name: 'Marsh residence PV' }).waitFor()
    })

    await step('change a run and save', async () => {
      await page.getByRole('button', { name: 'Open the design' }).click()
      const state = page.getByText(/^Saved · version \d+$/)
      await state.waitFor()
      const savedVersion = Number((await state.textContent())?.match(/\d+/)?.[0])
      const length = page.getByLabel(`Run ${EDITED_RUN} length in feet`)
      await length.fill(String(EDITED_LENGTH_FT))
      await length.press('Tab') // the number field takes its value on blur, as a user leaves it
      await page.getByText(`Unsaved changes to version ${savedVersion}`).waitFor()
      await page.getByRole('button', { name: 'Save design (Ctrl+S)' }).click()
      await page.getByText(`Saved · version ${savedVersion + 1}`).waitFor()
      expect(await length.inputValue()).toBe(String(EDITED_LENGTH_FT))
      await shoot('03-design-editor')
    })

    await step('open the plan-set page', async () => {
      await page.getByRole('link', { name: PROJECT_CODE, exact: true }).click()
      await page.getByRole('button', { name: 'Plan set and revisions' }).click()
      await page.getByRole('heading', { name: 'Plan set and revisions' }).waitFor()
      await expect.poll(() => page.getByText(SAFETY_CAUTION).first().isVisible()).toBe(true)
    })

    const samples: ProgressSample[] = []
    await step('generate a revision and watch its progress', async () => {
      await page.getByRole('button', { name: 'Generate a revision' }).click()
      const dialog = page.getByRole('dialog', { name: 'Generate a revision' })
      await dialog.getByLabel('What this revision is for').fill(DESCRIPTION)
      await dialog.getByRole('button', { name: 'Generate', exact: true }).click()

      const published = page.getByRole('heading', { name: 'Revision 0 is published' })
      const bar = page.getByRole('progressbar')
      const deadline = Date.now() + 90_000
      while (!(await published.isVisible())) {
        if (Date.now() > deadline) throw new Error(`not published within 90 s; progress seen: ${JSON.stringify(samples)}`)
        const sample = await readProgress(bar)
        if (sample && isWorking(sample) && !samples.some(isWorking)) await shoot('04-plan-set-in-progress')
        if (sample) samples.push(sample)
        await page.waitForTimeout(150)
      }
      await shoot('05-plan-set-published')
    })
    // a worker took the job and the bar stood part-way at a named step before it was published
    expect(samples.some(isWorking), `progress seen: ${JSON.stringify(samples)}`).toBe(true)
    for (const sample of samples) expect(STEP_LABELS).toContain(sample.label)
    // the bar only moves forward
    expect(samples.map((s) => s.percent)).toEqual([...samples.map((s) => s.percent)].sort((a, b) => a - b))

    await step('preview the single-line diagram', async () => {
      await page.getByRole('heading', { name: `Revision 0: ${DESCRIPTION}` }).waitFor()
      const diagram = page.getByRole('img', { name: 'Single-line diagram of revision 0' })
      await diagram.waitFor()
      // tests compile without the DOM library: the image's two properties, typed by hand
      const loadedWidth = () => diagram.evaluate((img) => {
        const { complete, naturalWidth } = img as unknown as { complete: boolean; naturalWidth: number }
        return complete ? naturalWidth : 0
      })
      await expect.poll(loadedWidth, { timeout: 15_000 }).toBeGreaterThan(0)
      await shoot('06-single-line-preview')
    })

    await step('open the PDF tab', async () => {
      const [response] = await Promise.all([
        page.waitForResponse((r) => r.url().endsWith('/files/plan-set.pdf')),
        page.getByRole('tab', { name: 'Plan set (PDF)' }).click(),
      ])
      expect(response.status()).toBe(200)
      expect(response.headers()['content-type']).toMatch(/^application\/pdf/)
      expect((await response.body()).subarray(0, 5).toString('latin1')).toBe('%PDF-')
      // the page hands the fetched file to the frame as a blob: URL (its CSP keeps fetch to 'self')
      const frame = page.locator('iframe[title="Plan set of revision 0"]')
      await expect.poll(() => frame.getAttribute('src')).toMatch(/^blob:/)
      await frame.scrollIntoViewIfNeeded()
      await page.waitForTimeout(5000) // let the inline viewer paint before the picture
      // the viewer paints in its own process: a full-page capture (a resized viewport) loses it
      await shoot('07-plan-set-pdf', { fullPage: false })
    })

    const download = await step('download the zip', async () => {
      const [started] = await Promise.all([
        page.waitForEvent('download'),
        page.getByRole('button', { name: `Download ${PROJECT_CODE}_rev00.zip` }).click(),
      ])
      return started
    })
    expect(download.suggestedFilename()).toBe(`${PROJECT_CODE}_rev00.zip`)
    const entries = await unzip(await readFile(await download.path()))
    expect([...entries.keys()].sort()).toEqual([...PACKAGE_FILE_NAMES].sort())
    const manifest = JSON.parse(entries.get('manifest.json')!.toString('utf8')) as {
      project: { code: string }; revision: number; description: string; caution: string
      files: { name: string; bytes: number; sha256: string }[]
    }
    expect(manifest).toMatchObject({ project: { code: PROJECT_CODE }, revision: 0, description: DESCRIPTION, caution: SAFETY_CAUTION })
    expect(manifest.files.map((f) => f.name).sort()).toEqual(PACKAGE_FILE_NAMES.filter((n) => n !== 'manifest.json').sort())
    for (const file of manifest.files) {
      const bytes = entries.get(file.name)!
      expect(bytes.byteLength, file.name).toBe(file.bytes)
      expect(createHash('sha256').update(bytes).digest('hex'), file.name).toBe(file.sha256)
    }
    // the saved edit reached the package, and its calculations are the engine's for that design
    const design = parseDesign(JSON.parse(entries.get('design.json')!.toString('utf8')))
    if (!design.ok) throw new Error(`design.json is not a valid design: ${JSON.stringify(design)}`)
    expect(design.value.topology.runs.find((r) => r.id === EDITED_RUN)?.lengthFt).toBe(EDITED_LENGTH_FT)
    const calculations: unknown = JSON.parse(entries.get('calculations.json')!.toString('utf8'))
    expect(calculations).toEqual(JSON.parse(JSON.stringify(evaluateDesign(design.value))))
  } finally {
    await close()
  }
})

/** The bar's step (its accessible name) and share done, or null while it is not on screen. */
async function readProgress(bar: Locator): Promise<ProgressSample | null> {
  if (!(await bar.isVisible())) return null
  // the bar may go between the two reads: a short wait, and no sample then
  const read = (attribute: string) => bar.getAttribute(attribute, { timeout: 500 }).catch(() => null)
  const [name, now] = await Promise.all([read('aria-label'), read('aria-valuenow')])
  if (name === null || now === null) return null
  return { label: name.replace(/^Plan set generation, /, ''), percent: Number(now) }
}
