import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { BASE_URL } from './http'

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'

// Flags measured on this kind of machine: without the networking ones Chromium
// keeps trying hosts it cannot reach; --headless because launchPersistentContext
// is used (launch() refuses a user data dir).
const ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage']

export interface BrowserSession { context: BrowserContext, page: Page, close: () => Promise<void> }

/** A fresh browser profile per call: no cookies carried between tests. */
export async function openBrowser(viewport = { width: 1280, height: 900 }): Promise<BrowserSession> {
  const dir = mkdtempSync(join(tmpdir(), 'pullsheet-browser-'))
  const context = await chromium.launchPersistentContext(dir, { executablePath: CHROMIUM, args: ARGS, viewport, baseURL: BASE_URL })
  const page = context.pages()[0] ?? await context.newPage()
  return {
    context,
    page,
    async close() {
      await context.close()
      rmSync(dir, { recursive: true, force: true })
    },
  }
}

/**
 * Signs in through the real form, the way a person does. Typing before Vue hydrates
 * the form would be lost (hydration sets each v-model input back to its state), so
 * every page a test types into is opened with gotoReady.
 */
export async function signInThroughPage(page: Page, email: string, password: string): Promise<void> {
  await gotoReady(page, '/login')
  await page.getByTestId('login-email').fill(email)
  await page.getByTestId('login-password').fill(password)
  await page.getByTestId('login-submit').click()
  await page.getByTestId('user-name').waitFor({ timeout: 15_000 })
}

/** Opens a page and waits until Vue has hydrated it (app/plugins/hydrated.client.ts). */
export async function gotoReady(page: Page, url: string): Promise<void> {
  await page.goto(url)
  await page.locator('html[data-hydrated="true"]').waitFor({ state: 'attached', timeout: 20_000 })
}
