// Graphs on a phone (issue 15 item 14): at 390 px the story's live graph is drawn
// taller than wide, and in it and in the workspace's analysis graph no two pieces
// of text overlap and none runs outside the graph (legend names included).
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Locator } from 'playwright-core'
import { gotoReady, openBrowser, signInThroughPage } from '../support/browser'
import { DEMO_PASSWORD, signedIn } from '../support/http'
import { createStory, publishStory, storyBench, type StoryBench } from '../support/stories'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
let bench: StoryBench
let slug = ''

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true })
  const editor = await signedIn('editor@example.com')
  bench = await storyBench(editor)
  const body = `Two panels on a phone (invented data).\n\n::pull-graph{setups="${bench.baselineId},${bench.camId}" channel="both"}\n::\n`
  const story = await createStory(editor, bench.benchTestId, { body, deck: 'Graphs at phone width.' })
  await publishStory(editor, story.id)
  slug = story.slug
}, 120_000)

/** Pairs of visible SVG texts in the box that overlap, and texts that run outside it. */
async function textClashes(box: Locator) {
  return box.evaluate((root) => {
    const frame = root.getBoundingClientRect()
    const boxes = [...root.querySelectorAll('svg text')].map(t => ({ text: t.textContent ?? '', r: t.getBoundingClientRect() }))
      .filter(b => b.text.trim() && b.r.width > 0 && b.r.height > 0)
    const overlaps: string[] = []
    boxes.forEach((a, i) => boxes.slice(i + 1).forEach((b) => {
      const w = Math.min(a.r.right, b.r.right) - Math.max(a.r.left, b.r.left)
      const h = Math.min(a.r.bottom, b.r.bottom) - Math.max(a.r.top, b.r.top)
      if (w > 1 && h > 1) overlaps.push(`${a.text} / ${b.text}`)
    }))
    const outside = boxes.filter(b => b.r.left < frame.left - 1 || b.r.right > frame.right + 1).map(b => b.text)
    return { overlaps, outside, texts: boxes.length }
  })
}

describe('graphs at 390 px', () => {
  it('the story\'s live graph: taller than wide, nothing overlapping', async () => {
    const phone = await openBrowser({ width: 390, height: 844 })
    try {
      const { page } = phone
      await gotoReady(page, `/stories/${slug}`)
      const graph = page.getByTestId('figure-graph').first()
      await graph.scrollIntoViewIfNeeded()
      await page.locator('[data-testid="figure-graph"][data-live="true"]').first().waitFor({ timeout: 30_000 })
      const live = graph.getByTestId('figure-live')
      await live.locator('svg text').first().waitFor()
      const size = (await live.boundingBox())!
      expect(size.height).toBeGreaterThan(size.width)
      const clashes = await textClashes(live)
      expect(clashes.texts).toBeGreaterThan(6)
      expect(clashes.overlaps).toEqual([])
      expect(clashes.outside).toEqual([])
      await graph.screenshot({ path: join(SHOTS, 'graph-story-390.png') })
    }
    finally {
      await phone.close()
    }
  }, 180_000)

  it('the analysis graph: every legend name inside, nothing overlapping', async () => {
    const session = await openBrowser({ width: 1280, height: 900 })
    try {
      const { page } = session
      await signInThroughPage(page, 'editor@example.com', DEMO_PASSWORD)
      await page.setViewportSize({ width: 390, height: 844 })
      await gotoReady(page, `/bench-tests/${bench.benchTestId}/analysis`)
      const chart = page.locator('[data-testid="analysis-chart"][data-narrow="true"]')
      await chart.locator('svg text').first().waitFor({ timeout: 30_000 })
      await page.waitForTimeout(300)
      const clashes = await textClashes(chart)
      expect(clashes.overlaps).toEqual([])
      expect(clashes.outside).toEqual([])
      const legend = await chart.evaluate(el => [...el.querySelectorAll('svg text')].map(t => t.textContent))
      expect(legend).toContain('Long-duration cam')
      await chart.screenshot({ path: join(SHOTS, 'graph-analysis-390.png') })
    }
    finally {
      await session.close()
    }
  }, 180_000)

  it('the analysis graph\'s tooltip reads like the tables: "5,500 rpm", values to one decimal', async () => {
    const session = await openBrowser({ width: 1280, height: 900 })
    try {
      const { page } = session
      await signInThroughPage(page, 'editor@example.com', DEMO_PASSWORD)
      await gotoReady(page, `/bench-tests/${bench.benchTestId}/analysis`)
      const chart = page.getByTestId('analysis-chart').first()
      await chart.locator('svg text').first().waitFor({ timeout: 30_000 })
      const box = (await chart.boundingBox())!
      await page.mouse.move(box.x + box.width * 0.55, box.y + box.height * 0.3)
      await page.mouse.move(box.x + box.width * 0.56, box.y + box.height * 0.3)
      // ECharts draws its tooltip as a div inside the chart's box, beside the drawing's SVG.
      const tooltip = () => chart.evaluate(el => [...el.querySelectorAll('div')].filter(d => !d.querySelector('svg')).map(d => d.textContent ?? '').find(t => /rpm/.test(t) && /hp|lb-ft/.test(t)) ?? '')
      await expect.poll(tooltip, { timeout: 10_000 }).toMatch(/\d,\d{3}\u00a0rpm/)
      const text = await tooltip()
      expect(text).not.toMatch(/\d\.\d{2}/)
      expect(text).toMatch(/\d\.\d\u00a0(hp|lb-ft)/)
      await page.screenshot({ path: join(SHOTS, 'graph-analysis-tooltip-1280.png') })
    }
    finally {
      await session.close()
    }
  }, 180_000)
})
