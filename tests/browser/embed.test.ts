// Another site shows a figure: a tiny page served from its own local origin frames
// /embed/<slug>/<n>; the figure renders (the server's SVG, then the live graph) and
// links back. Screenshots of the embed at phone and desktop widths and of the
// story page's embed codes go to .data/test/screenshots.
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BASE_URL, signedIn } from '../support/http'
import { openBrowser } from '../support/browser'
import { createStory, publishStory, storyBench } from '../support/stories'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
let slug = ''
let server: Server
let forumUrl = ''

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true })
  const editor = await signedIn('editor@example.com')
  const bench = await storyBench(editor)
  const body = [
    'The long-duration cam against the baseline (synthetic pulls, invented data).',
    '',
    `::pull-graph{setups="${bench.baselineId},${bench.camId}" channel="both" caption="Power and torque, both setups"}`,
    '::',
    '',
    '::results-table',
    '::',
  ].join('\n')
  const story = await createStory(editor, bench.benchTestId, { body, headline: 'A cam for the top end, framed elsewhere' })
  await publishStory(editor, story.id)
  slug = story.slug

  // "Another site": a different origin (another port) with a forum post that frames the figure.
  server = createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' })
    res.end(`<!doctype html><html lang="en"><head><meta name="viewport" content="width=device-width, initial-scale=1"><title>A forum post</title></head>
<body style="font-family:sans-serif;margin:12px"><h1>Which cam for my engine?</h1><p>Look at this test:</p>
<iframe id="figure" src="${BASE_URL}/embed/${slug}/1" title="Figure 1" width="100%" height="640" style="border:0;max-width:800px"></iframe>
<iframe id="table" src="${BASE_URL}/embed/${slug}/2" title="Figure 2" width="100%" height="380" style="border:0;max-width:800px"></iframe>
<iframe id="story" src="${BASE_URL}/stories/${slug}" title="The whole story" width="100%" height="200"></iframe></body></html>`)
  })
  await new Promise<void>(resolve => server.listen(0, '127.0.0.1', resolve))
  forumUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}/post`
}, 120_000)

afterAll(() => new Promise<void>(resolve => (server ? server.close(() => resolve()) : resolve())))

describe('a figure embedded in another site', () => {
  for (const width of [1280, 390]) {
    it(`renders, turns live and links back at ${width} px`, async () => {
      const { page, close } = await openBrowser({ width, height: 1100 })
      try {
        await page.goto(forumUrl)
        const frame = page.frameLocator('#figure')
        // The server's SVG comes first (the API test reads it in the HTML); in view, the live
        // graph takes its place, so here the graph is only checked once it is live and drawn.
        await expect.poll(() => frame.getByTestId('figure-graph').getAttribute('data-live'), { timeout: 30_000 }).toBe('true')
        expect(await frame.getByTestId('figure-graph').locator('svg path').count()).toBeGreaterThan(10)
        expect(await frame.locator('figcaption').first().textContent()).toContain('Power and torque, both setups')
        expect(await frame.getByTestId('embed-source').getAttribute('href')).toMatch(new RegExp(`/stories/${slug}$`))
        await expect.poll(() => page.frameLocator('#table').getByTestId('figure-results-table').count(), { timeout: 20_000 }).toBe(1)
        // The story page itself refuses to be framed: its frame stays empty.
        const storyFrame = page.frames().find(f => f.url().includes(`/stories/${slug}`))
        expect(storyFrame ? await storyFrame.locator('[data-testid="story-page"]').count() : 0).toBe(0)
        await page.screenshot({ path: join(SHOTS, `embed-forum-${width}.png`), fullPage: true })
      }
      finally {
        await close()
      }
    }, 90_000)
  }

  it('the story page offers the code of each figure', async () => {
    const { page, close } = await openBrowser({ width: 390, height: 900 })
    try {
      await page.goto(`/stories/${slug}`)
      await page.getByTestId('embed-codes').locator('summary').click()
      const codes = await page.getByTestId('embed-code').evaluateAll(els => els.map(e => (e as HTMLTextAreaElement).value))
      expect(codes).toHaveLength(2)
      expect(codes[0]).toMatch(new RegExp(`^<iframe src="https?://[^"]+/embed/${slug}/1" title="Figure 1, graph: Power and torque, both setups`))
      await page.getByTestId('embed-codes').screenshot({ path: join(SHOTS, 'embed-codes-390.png') })
    }
    finally {
      await close()
    }
  }, 60_000)
})
