// The feed as a person meets it (issue 15 item 16): a visible "Follow by RSS" link on
// the home page and a story page, and /feed.xml opened in the browser reads as a page
// (styled by /feed.css, a link to each story), with nothing refused by its CSP.
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { openBrowser, type BrowserSession } from '../support/browser'
import { signedIn } from '../support/http'
import { createStory, publishStory, storyBench, storyBody } from '../support/stories'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
let slug = ''

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true })
  const editor = await signedIn('editor@example.com')
  const bench = await storyBench(editor)
  const story = await createStory(editor, bench.benchTestId, { body: storyBody(bench), deck: 'A story for the feed (invented data).' })
  await publishStory(editor, story.id)
  slug = story.slug
}, 120_000)

describe('the feed', () => {
  let browser: BrowserSession
  afterAll(async () => { await browser?.close() })

  it('is linked, visibly, from the home page and a story page at phone and desktop widths', async () => {
    for (const width of [390, 1280]) {
      const session = await openBrowser({ width, height: 844 })
      try {
        for (const [name, path] of [['home', '/'], ['story', `/stories/${slug}`]] as const) {
          await session.page.goto(path)
          const link = session.page.getByTestId('feed-link').first()
          await link.scrollIntoViewIfNeeded()
          expect(await link.isVisible(), `${path} at ${width}`).toBe(true)
          expect(await link.getAttribute('href')).toBe('/feed.xml')
          expect(await session.page.locator('head link[rel="alternate"][type="application/rss+xml"]').count()).toBe(1)
          await session.page.screenshot({ path: join(SHOTS, `feed-link-${name}-${width}.png`) })
        }
      }
      finally {
        await session.close()
      }
    }
  })

  it('opens as a readable page: styled, with a link to each story and no CSP refusal', async () => {
    browser = await openBrowser({ width: 390, height: 844 })
    const { page } = browser
    const refused: string[] = []
    page.on('console', (m) => { if (/Content Security Policy|Refused/i.test(m.text())) refused.push(m.text()) })
    await page.goto('/feed.xml')
    const read = page.locator(`a[href$="/stories/${slug}"]`)
    await read.waitFor()
    expect(await read.evaluate(a => a instanceof HTMLAnchorElement)).toBe(true)
    // The stylesheet applied: items are blocks with a rule between them, bookkeeping hidden.
    const styles = await page.evaluate(() => {
      const item = document.getElementsByTagName('item')[0]!
      const guid = document.getElementsByTagName('guid')[0]!
      return { item: getComputedStyle(item).display, border: getComputedStyle(item).borderTopStyle, guid: getComputedStyle(guid).display }
    })
    expect(styles).toEqual({ item: 'block', border: 'solid', guid: 'none' })
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0)
    expect(refused).toEqual([])
    await page.screenshot({ path: join(SHOTS, 'feed-390.png') })
    await page.setViewportSize({ width: 1280, height: 900 })
    await page.screenshot({ path: join(SHOTS, 'feed-1280.png') })
    await read.click()
    await page.waitForURL(new RegExp(`/stories/${slug}$`))
  })
})
