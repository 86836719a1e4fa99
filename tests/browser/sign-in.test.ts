import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { DEMO_PASSWORD } from '../support/http'

// What each role should see in the main navigation (brief: Roles).
const NAV: Record<string, { email: string, shows: string[], hides: string[] }> = {
  reader: { email: 'reader@example.com', shows: ['stories', 'account'], hides: ['bench-tests', 'desk', 'users', 'sign-in'] },
  writer: { email: 'writer@example.com', shows: ['stories', 'bench-tests', 'my-stories'], hides: ['desk', 'users'] },
  editor: { email: 'editor@example.com', shows: ['bench-tests', 'my-stories', 'desk'], hides: ['users', 'mail'] },
  admin: { email: 'admin@example.com', shows: ['bench-tests', 'desk', 'users', 'mail'], hides: ['sign-in', 'register'] },
}

describe('signing in through the page', () => {
  let browser: BrowserSession
  beforeAll(async () => { browser = await openBrowser() })
  afterAll(async () => { await browser?.close() })

  it('shows sign-in and register links to a visitor', async () => {
    const { page } = browser
    await page.goto('/')
    const nav = page.getByTestId('nav-main')
    await expect(nav.getByTestId('nav-link-sign-in').isVisible()).resolves.toBe(true)
    await expect(nav.getByTestId('nav-link-register').isVisible()).resolves.toBe(true)
    await expect(nav.getByTestId('nav-link-desk').count()).resolves.toBe(0)
  })

  it('refuses a wrong password with a message', async () => {
    const { page } = browser
    await gotoReady(page, '/login')
    await page.getByTestId('login-email').fill('writer@example.com')
    await page.getByTestId('login-password').fill('not-the-password')
    await page.getByTestId('login-submit').click()
    const error = page.getByTestId('login-error')
    await error.waitFor()
    expect(await error.textContent()).toMatch(/match|password/i)
  })

  it.each(Object.entries(NAV))('a %s sees the navigation of that role', async (_role, { email, shows, hides }) => {
    const session = await openBrowser()
    try {
      const { page } = session
      await signInThroughPage(page, email, DEMO_PASSWORD)
      await page.goto('/')
      const nav = page.getByTestId('nav-main')
      await nav.waitFor()
      for (const name of shows) expect(await nav.getByTestId(`nav-link-${name}`).count(), `${name} shown`).toBeGreaterThan(0)
      for (const name of hides) expect(await nav.getByTestId(`nav-link-${name}`).count(), `${name} hidden`).toBe(0)
      await page.getByTestId('sign-out').first().click()
      await page.getByTestId('nav-link-sign-in').first().waitFor()
    }
    finally { await session.close() }
  })
})
