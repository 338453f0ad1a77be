import path from 'node:path'
import { fileURLToPath } from 'node:url'

export const REPOSITORY_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..')
/** Debian's `chromium` package puts its launcher here. */
export const CHROMIUM_PATH = '/usr/bin/chromium'
/** Screenshots and the app's log of the last run (git-ignored). */
export const SCREENSHOT_DIR = path.join(REPOSITORY_ROOT, 'test-results', 'browser')
