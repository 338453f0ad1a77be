import { mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../../server/demo/seed'
import { CHROMIUM_PATH, SCREENSHOT_DIR } from './paths'

/** Headless, no GPU, nothing fetched from the network on its own: the flags issue #7 names. */
const CHROMIUM_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run']

export interface BrowserSession {
  page: Page
  /** Saves a screenshot as test-results/browser/<journey>-<name>.png, of the whole page unless told. */
  shoot(name: string, options?: { fullPage?: boolean }): Promise<void>
  /** Runs one step of a journey; a failing step leaves a screenshot named after it, then rethrows. */
  step<T>(name: string, action: () => Promise<T>): Promise<T>
  close(): Promise<void>
}

/** Debian's Chromium with a fresh user-data dir, removed again on close. */
export async function openBrowser(journey: string): Promise<BrowserSession> {
  const userDataDir = mkdtempSync(path.join(os.tmpdir(), 'stringline-chromium-'))
  let context: BrowserContext
  try {
    context = await chromium.launchPersistentContext(userDataDir, {
      executablePath: CHROMIUM_PATH,
      headless: true,
      args: CHROMIUM_ARGS,
      acceptDownloads: true,
      viewport: { width: 1440, height: 900 },
      locale: 'en-US',
    })
  } catch (error) {
    rmSync(userDataDir, { recursive: true, force: true })
    throw error
  }
  const page = context.pages()[0] ?? (await context.newPage())
  const shoot = async (name: string, { fullPage = true } = {}) => {
    // transitions run to their end: a tag caught mid zoom-in shows as an empty box
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${journey}-${name}.png`), fullPage, animations: 'disabled' })
  }
  return {
    page,
    shoot,
    async step(name, action) {
      try {
        return await action()
      } catch (error) {
        await shoot(`FAILED-${name.replace(/[^a-z0-9]+/gi, '-')}`).catch(() => {})
        if (error instanceof Error) error.message = `Step "${name}": ${error.message}`
        throw error
      }
    },
    async close() {
      await context.close()
      rmSync(userDataDir, { recursive: true, force: true })
    },
  }
}

/** Signs a demo user in through the sign-in screen (screenshot `01-sign-in`) and waits for the home page. */
export async function signIn({ page, shoot }: BrowserSession, appUrl: string, email: string): Promise<void> {
  await page.goto(appUrl)
  await page.getByRole('heading', { name: 'Sign in' }).waitFor()
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD)
  await shoot('01-sign-in')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.getByRole('heading', { name: /^Welcome, / }).waitFor()
}
