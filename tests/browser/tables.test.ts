// No table on any page is ever clipped (issue 15 item 13). Every page that has a table
// is opened at 390, 768 and 1280 px: each table sits in the shared TableFrame and
// either fits it or scrolls inside it with its cue showing; the page itself never
// scrolls sideways. The story's results table shows every column at every width
// (a card per setup on a phone). Units stay with their numbers (no break inside
// "+13.4 lb-ft"). Screenshots go to .data/test/screenshots.
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { DEMO_PASSWORD, signedIn } from '../support/http'
import { createSetup, expectOk } from '../support/workspace'
import { createStory, publishStory, storyBench, type StoryBench } from '../support/stories'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
const WIDTHS = [390, 768, 1280]
// Three widths and several pages each, on a machine shared by many builds.
const PAGE_TIMEOUT = 240_000
let bench: StoryBench
let slug = ''
let storyId = 0
let uploadToken = ''

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true })
  const editor = await signedIn('editor@example.com')
  bench = await storyBench(editor)
  uploadToken = expectOk(await editor.post(`/api/bench-tests/${bench.benchTestId}/operator-links`, { expiresInHours: 2 }), 201).token
  // A setup with a cam card, for the setup list's cam table.
  await createSetup(editor, bench.benchTestId, 'Cam card only (invented)', {
    parts: [{ category: 'camshaft', maker: 'Invented Cam Works', intakeDuration050Deg: 236, exhaustDuration050Deg: 242, intakeAdvertisedDeg: 288, intakeLiftIn: 0.58, exhaustLiftIn: 0.59, lsaDeg: 112, iclDeg: 108 }],
  })
  const body = [
    'The long-duration cam against the baseline (synthetic pulls, invented data).',
    '',
    `::pull-graph{setups="${bench.baselineId},${bench.camId}" channel="both"}`,
    '::',
    '',
    '::results-table',
    '::',
  ].join('\n')
  const story = await createStory(editor, bench.benchTestId, { body, deck: 'Tables at every width.' })
  await publishStory(editor, story.id)
  slug = story.slug
  storyId = story.id
}, 120_000)

interface TableReport { index: number, inFrame: boolean, fits: boolean, cue: boolean, frameRight: number, tableWidth: number, frameWidth: number }

/** Every visible table on the page, measured against its frame and the viewport. */
function measureTables(page: Page) {
  return page.evaluate(() => [...document.querySelectorAll('table')].flatMap((table, index): TableReport[] => {
    const box = table.getBoundingClientRect()
    if (box.width === 0 || box.height === 0) return []
    const frame = table.closest('[data-table-frame]') as HTMLElement | null
    const scroller = frame?.querySelector('.table-frame-scroll') as HTMLElement | null
    const frameBox = (frame ?? table).getBoundingClientRect()
    const cue = frame?.querySelector('[data-testid="table-scroll-cue"]') as HTMLElement | null
    return [{
      index,
      inFrame: Boolean(frame && scroller),
      fits: scroller ? table.getBoundingClientRect().width <= scroller.clientWidth + 1 : false,
      cue: Boolean(frame?.dataset.overflowing === 'true' && cue && cue.getBoundingClientRect().height > 0),
      frameRight: frameBox.right,
      tableWidth: Math.round(box.width),
      frameWidth: Math.round(scroller?.clientWidth ?? 0),
    }]
  }))
}

async function expectNoClippedTable(page: Page, where: string, minTables = 1) {
  // The frames measure themselves after hydration; give them a frame to do it.
  await page.waitForTimeout(200)
  const tables = await measureTables(page)
  expect(tables.length, `${where}: tables found`).toBeGreaterThanOrEqual(minTables)
  const viewport = page.viewportSize()!.width
  for (const t of tables) {
    expect(t.inFrame, `${where}: table ${t.index} is in the shared frame`).toBe(true)
    expect(t.fits || t.cue, `${where}: table ${t.index} (${t.tableWidth} px in ${t.frameWidth} px) fits or shows its scroll cue`).toBe(true)
    expect(t.frameRight, `${where}: table ${t.index}'s frame ends inside the screen`).toBeLessThanOrEqual(viewport + 1)
  }
  expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth), `${where}: the page does not scroll sideways`).toBeLessThanOrEqual(0)
}

interface TablePage { name: string, path: string, ready?: string, min?: number, prepare?: (page: Page) => Promise<void> }

async function atWidths(role: 'editor' | 'admin' | null, pages: TablePage[]) {
  for (const width of WIDTHS) {
    // Signed in at desktop width (the header shows the user's name there), then narrowed.
    const session: BrowserSession = await openBrowser({ width: 1280, height: 900 })
    try {
      if (role) await signInThroughPage(session.page, `${role}@example.com`, DEMO_PASSWORD)
      await session.page.setViewportSize({ width, height: 900 })
      for (const p of pages) {
        await gotoReady(session.page, p.path)
        if (p.ready) await session.page.locator(p.ready).first().waitFor({ timeout: 20_000 })
        await p.prepare?.(session.page)
        await expectNoClippedTable(session.page, `${p.name} at ${width} px`, p.min)
        if (width !== 768 || p.name.startsWith('story') || p.name === 'analysis') {
          await session.page.screenshot({ path: join(SHOTS, `tables-${p.name}-${width}.png`), fullPage: true })
        }
      }
    }
    finally {
      await session.close()
    }
  }
}

describe('tables at 390, 768 and 1280 px', () => {
  it('the story page: the results table shows every column, numbers keep their units', async () => {
    await atWidths(null, [{ name: 'story', path: `/stories/${slug}`, ready: '[data-testid="figure-results-table"] table' }])
    for (const width of [390, 1280]) {
      const session = await openBrowser({ width, height: 900 })
      try {
        await gotoReady(session.page, `/stories/${slug}`)
        const table = session.page.getByTestId('figure-results-table').locator('table')
        const fit = await table.evaluate((t) => {
          const scroller = t.closest('.table-frame-scroll') as HTMLElement
          // Every value cell is inside the visible part of the frame: nothing hidden off to the side.
          const frame = scroller.getBoundingClientRect()
          const cells = [...t.querySelectorAll('td')]
          return {
            overflow: scroller.scrollWidth - scroller.clientWidth,
            hidden: cells.filter((c) => { const b = c.getBoundingClientRect(); return b.right > frame.right + 1 || b.left < frame.left - 1 }).length,
            // A value and its unit on one line: no cell wraps inside "+13.4 lb-ft".
            wrapped: cells.filter((c) => {
              const range = document.createRange()
              range.selectNodeContents(c)
              const lines = new Set([...range.getClientRects()].filter(r => r.width > 0).map(r => Math.round(r.top)))
              return lines.size > 1
            }).length,
          }
        })
        expect(fit, `results table at ${width} px`).toEqual({ overflow: 0, hidden: 0, wrapped: 0 })
      }
      finally {
        await session.close()
      }
    }
  }, PAGE_TIMEOUT)

  it('the reader\'s other pages with tables', async () => {
    await atWidths(null, [
      { name: 'how-we-test', path: '/how-we-test' },
      // The operator's upload page, with the pull file's description open.
      { name: 'upload', path: `/upload/${uploadToken}`, ready: '[data-testid="pull-file-format"]', prepare: async (page) => {
        await page.getByTestId('pull-file-format').locator('summary').click()
        await page.getByTestId('pull-file-columns').waitFor()
      } },
    ])
  }, PAGE_TIMEOUT)

  it('the workspace and the desk', async () => {
    const bt = bench.benchTestId
    await atWidths('editor', [
      { name: 'bench-tests', path: '/bench-tests', ready: 'table' },
      // The import page with the pull file's description open: its columns table too.
      { name: 'pulls', path: `/bench-tests/${bt}/pulls`, ready: '[data-testid^="pull-group-"] table', min: 2, prepare: async (page) => {
        await page.getByTestId('pull-file-format').locator('summary').click()
        await page.getByTestId('pull-file-columns').waitFor()
      } },
      { name: 'setups', path: `/bench-tests/${bt}/setups`, ready: '[data-testid="setup-cam-table"]' },
      { name: 'analysis', path: `/bench-tests/${bt}/analysis`, ready: '[data-testid="gains-table"]', min: 3 },
      { name: 'inbox', path: `/bench-tests/${bt}/inbox`, ready: '[data-testid="link-list"]' },
      { name: 'desk', path: '/desk', ready: 'table' },
      { name: 'desk-story', path: `/desk/${storyId}`, min: 0 },
    ])
  }, PAGE_TIMEOUT * 2)

  it('the admin pages', async () => {
    await atWidths('admin', [
      { name: 'users', path: '/admin/users', ready: 'table' },
      { name: 'settings', path: '/admin/settings', min: 0 },
      { name: 'mail', path: '/admin/mail', min: 0 },
    ])
  }, PAGE_TIMEOUT)
})
