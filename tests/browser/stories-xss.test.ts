// Script in a story body or a note must never run: not in the editor's live
// preview (which renders whatever is typed, before the server has refused it),
// not on the preview link's page rendered by the server, not on the desk, and not
// in the notes. Each payload sets a marker or opens a dialog if it ever runs.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { DEMO_PASSWORD, signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { expectOk } from '../support/workspace'
import { acceptLeaving, benchWithPulls, createStoryFor, saveStateIs, type StoryBench } from './stories-fixtures'

// Common practice: the usual ways script gets into a page past a filter (tags,
// attributes, URL schemes with hidden characters, and MDC's own component syntax).
const PAYLOADS = [
  '<script>window.__xss = "script"</script>',
  '<img src="/nope.png" onerror="window.__xss = \'img\'; alert(1)">',
  '[click me](javascript:window.__xss=\'md-link\')',
  '<a id="xss-html-link" href="javascript:window.__xss=\'html-link\'">html link</a>',
  '<a id="xss-tab-link" href="jav&#x09;ascript:window.__xss=\'tab-link\'">tab link</a>',
  '<svg onload="window.__xss=\'svg\'"><circle r="4"/></svg>',
  '<iframe srcdoc="<script>parent.__xss=\'iframe\'</script>"></iframe>',
  '::pull-graph{caption="x\\" onmouseover=\\"window.__xss=\'mdc-quote\'" setups="1"}\n::',
  ':figure-value{of="peak-power" setup=1 onclick="window.__xss=\'mdc-onclick\'"}',
  '<details open ontoggle="window.__xss=\'details\'">x</details>',
  '[data](data:text/html;base64,PHNjcmlwdD5wYXJlbnQuX194c3M9MTwvc2NyaXB0Pg==)',
  '::nuxt-link{to="javascript:window.__xss=\'component\'"}\ngo\n::',
  '<p style="background-image:url(javascript:window.__xss=\'style\')">styled</p>',
]
// Unclosed, it takes everything after it into the dropped <math>: so it goes last.
const MUTATION = '<math><mtext><table><mglyph><style><img src=x onerror="window.__xss=\'mxss\'">'
const BODY = `Safe opening line.\n\n${PAYLOADS.join('\n\n')}\n\nSafe closing line.\n\n${MUTATION}`

async function watchForScript(page: Page): Promise<string[]> {
  const caught: string[] = []
  page.on('dialog', async (d) => {
    if (d.type() === 'beforeunload') return // acceptLeaving answers those
    caught.push(`dialog: ${d.type()} ${d.message()}`)
    await d.dismiss()
  })
  return caught
}

async function expectNothingRan(page: Page, caught: string[], root: string) {
  // Click the body's links (they lost their script targets) and hover the text,
  // so handlers that wait for a pointer would get their chance.
  const links = page.locator(`${root} a:not([href])`)
  for (let i = 0; i < await links.count(); i++) await links.nth(i).click({ force: true, noWaitAfter: true }).catch(() => {})
  await page.locator(root).first().hover().catch(() => {})
  await page.waitForTimeout(800)
  expect(caught).toEqual([])
  expect(await page.evaluate(() => (window as unknown as { __xss?: unknown }).__xss)).toBeUndefined()
  const unsafe = await page.evaluate((sel) => {
    const scope = document.querySelector(sel)
    if (!scope) return ['no such element']
    const found: string[] = []
    for (const el of scope.querySelectorAll('*')) {
      if (['SCRIPT', 'IFRAME', 'OBJECT', 'EMBED'].includes(el.tagName)) found.push(el.tagName)
      for (const a of el.attributes) {
        if (/^on/i.test(a.name)) found.push(`${el.tagName}[${a.name}]`)
        if (/^\s*(javascript|data|vbscript):/i.test(a.value) && ['href', 'src', 'action', 'formaction', 'srcdoc'].includes(a.name)) found.push(`${el.tagName}[${a.name}=${a.value}]`)
      }
    }
    return found
  }, root)
  // Graphs' own SVG has no handlers either; anything listed here came from the body.
  expect(unsafe).toEqual([])
}

describe('script in a story or a note does not run', () => {
  let bench: StoryBench
  let session: BrowserSession
  let storyId = 0

  beforeAll(async () => {
    bench = await benchWithPulls()
    const story = await createStoryFor(bench.writer.client, bench.benchTestId, 'A story that tries to run script', 'Harmless first text.')
    storyId = story.id
    session = await openBrowser({ width: 1440, height: 1000 })
    acceptLeaving(session.page)
    await signInThroughPage(session.page, bench.writer.email, bench.writer.password)
  })
  afterAll(async () => {
    await session?.close()
    await closeTestDb()
  })

  it('the server refuses to store such a body', async () => {
    const story = expectOk(await bench.writer.client.get(`/api/stories/${storyId}`)).story
    const res = await bench.writer.client.patch(`/api/stories/${storyId}`, { version: story.version, body: BODY })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.length).toBeGreaterThanOrEqual(5)
  })

  it('the editor\'s live preview renders typed payloads as harmless text', async () => {
    const { page } = session
    const caught = await watchForScript(page)
    await gotoReady(page, `/stories/${storyId}/edit`)
    await page.getByTestId('editor-body').fill(BODY)
    // The text is refused on save (shown beside the field) but never lost or run.
    await saveStateIs(page, 'invalid')
    expect(await page.getByTestId('body-safety').locator('li').count()).toBeGreaterThan(3)
    await expect.poll(() => page.getByTestId('editor-preview').textContent(), { timeout: 10_000 }).toContain('Safe closing line.')
    await expectNothingRan(page, caught, '[data-testid="editor-preview"]')
  })

  it('a body that got into the database anyway is made safe by the renderer (preview link and desk)', async () => {
    // Defence in depth: write the body past the API's check, straight into the row.
    await testDb()('stories').where({ id: storyId }).update({ body: BODY })
    const link = expectOk(await bench.writer.client.post(`/api/stories/${storyId}/preview-links`, { label: 'XSS check' }), 201)

    const visitor = await openBrowser()
    try {
      const caught = await watchForScript(visitor.page)
      const res = await visitor.page.goto(new URL(link.url).pathname)
      expect(res?.status()).toBe(200)
      const html = await res!.text()
      expect(html).toContain('Safe closing line.')
      expect(html).not.toMatch(/window\.__xss\s*=\s*"script"<\/script>/)
      expect(html).toMatch(/<meta name="robots" content="noindex/)
      await expectNothingRan(visitor.page, caught, '[data-testid="story-text"]')
    }
    finally {
      await visitor.close()
    }

    const desk = await openBrowser({ width: 1440, height: 1000 })
    try {
      await signInThroughPage(desk.page, 'editor@example.com', DEMO_PASSWORD)
      const caught = await watchForScript(desk.page)
      await desk.page.goto(`/desk/${storyId}`)
      await desk.page.getByTestId('story-text').waitFor()
      expect(await desk.page.getByTestId('story-text').textContent()).toContain('Safe closing line.')
      await expectNothingRan(desk.page, caught, '[data-testid="story-text"]')
    }
    finally {
      await desk.close()
    }
  })

  it('notes are shown as text, whatever they contain', async () => {
    const editorApi = await signedIn('editor@example.com')
    const note = PAYLOADS.slice(0, 7).join(' | ')
    expectOk(await editorApi.post(`/api/stories/${storyId}/notes`, { body: note, anchor: '<img src=x onerror="window.__xss=\'anchor\'">' }), 201)
    const { page } = session
    const caught = await watchForScript(page)
    await gotoReady(page, `/stories/${storyId}/edit`)
    const thread = page.getByTestId('note-thread').first()
    await thread.waitFor()
    expect(await thread.getByTestId('note-body').textContent()).toContain('<script>window.__xss = "script"</script>')
    await expectNothingRan(page, caught, '[data-testid="notes"]')
  })
})
