// A reader on a published story: the server's SVG graph turns live, hovering moves
// the readout, a setup can be toggled off, the page's one units and correction
// standard control switches every graph and table, never the prose (and is
// remembered), the data downloads as CSV. axe-core finds no serious or
// critical problem on the home page, a story and search. Screenshots at phone and
// desktop widths go to .data/test/screenshots.
import { mkdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { seriousViolations } from '../support/axe'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { signedIn, uniqueEmail } from '../support/http'
import { expectOk } from '../support/workspace'
import { createStory, publishStory, storyBench, type StoryBench } from '../support/stories'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
// A switch refetches the figures: on a loaded machine that can take more than the default second.
const NETWORK = { timeout: 10_000 }
const word = `quindle${Math.random().toString(36).slice(2, 7)}`
let bench: StoryBench
let slug = ''

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true })
  const editor = await signedIn('editor@example.com')
  bench = await storyBench(editor)
  const body = [
    `The long-duration cam against the baseline on a ${word} test engine (synthetic pulls, invented data).`,
    '',
    `::pull-graph{setups="${bench.baselineId},${bench.camId}" channel="both"}`,
    '::',
    '',
    `It gained :figure-value{of="peak-power-gain" setup=${bench.camId} vs=${bench.baselineId}} at the peak.`,
    '',
    `::gain-graph{baseline=${bench.baselineId} setups="${bench.camId}"}`,
    '::',
    '',
    '::results-table',
    '::',
  ].join('\n')
  const story = await createStory(editor, bench.benchTestId, { body, deck: 'More duration, more top end.', headline: `Cam swap on the ${word} engine` })
  await publishStory(editor, story.id)
  slug = story.slug
}, 120_000)

describe('a reader on a story', () => {
  let browser: BrowserSession
  beforeAll(async () => { browser = await openBrowser() })
  afterAll(async () => { await browser?.close() })

  it('reads the graph, toggles a setup, switches units and standard, and downloads the data', async () => {
    const { page } = browser
    await page.goto(`/stories/${slug}`)
    // The prose's inline value and the note near the first figure: the edition's own standard.
    const prose = page.getByTestId('figure-value').first()
    const proseText = await prose.textContent()
    expect(proseText).toMatch(/\d hp|within repeatability/)
    await expect(page.getByTestId('story-edition-note').textContent()).resolves.toContain('Figures in the text are corrected to SAE J1349')
    const graph = page.getByTestId('figure-graph').first()
    await graph.scrollIntoViewIfNeeded()
    await page.locator('[data-testid="figure-graph"][data-live="true"]').first().waitFor({ timeout: 20_000 })

    // Hover the left part of the live graph: the readout leaves its middle default for a lower rpm.
    const live = graph.getByTestId('figure-live')
    const box = (await live.boundingBox())!
    const at = graph.getByTestId('figure-readout-at')
    const rpmOf = async () => Number((await at.textContent())!.replace(/[^\d]/g, ''))
    const middle = await rpmOf()
    await page.mouse.move(box.x + box.width * 0.25, box.y + box.height * 0.5, { steps: 4 })
    await expect.poll(rpmOf, { timeout: 5000 }).toBeLessThan(middle)
    // It keeps following the pointer: over to the right, then back to the left.
    const low = await rpmOf()
    await page.mouse.move(box.x + box.width * 0.8, box.y + box.height * 0.5, { steps: 6 })
    await expect.poll(rpmOf, { timeout: 5000 }).toBeGreaterThan(middle)
    await page.mouse.move(box.x + box.width * 0.4, box.y + box.height * 0.4, { steps: 6 })
    await expect.poll(rpmOf, { timeout: 5000 }).toBeLessThan(middle)
    expect(await rpmOf()).toBeGreaterThan(low)
    // The slider beside it is the keyboard's way along the curve: End goes to the top of the range.
    await graph.getByTestId('figure-readout-rpm').focus()
    await page.keyboard.press('End')
    await expect.poll(rpmOf).toBeGreaterThan(middle)
    await expect(graph.getByTestId('figure-readout-row').count()).resolves.toBe(2)
    expect(await graph.getByTestId('figure-readout-row').first().textContent()).toMatch(/\d hp/)

    // Toggle the cam off: one curve left in the readout.
    await graph.getByTestId(`figure-toggle-${bench.camId}`).uncheck()
    await expect.poll(() => graph.getByTestId('figure-readout-row').count()).toBe(1)
    await graph.getByTestId(`figure-toggle-${bench.camId}`).check()

    // One page-level control for units and standard: no graph has a switch of its own.
    expect(await page.locator('[data-testid^="figure-units-"]').count()).toBe(0)
    await expect(page.getByTestId('units-switch').count()).resolves.toBe(1)
    await expect(page.getByTestId('standard-switch').count()).resolves.toBe(1)

    // The reader's units: the graph's readout, every graph's numbers, the table and the CSV follow, and are remembered.
    const data = page.getByTestId('story-data')
    await data.getByTestId('units-switch').selectOption('kw-nm')
    await expect.poll(() => graph.getByTestId('figure-readout-row').first().textContent(), NETWORK).toMatch(/kW/)
    await expect.poll(() => data.getByTestId('story-results').getAttribute('data-units'), NETWORK).toBe('kw-nm')
    await expect(data.getByTestId('results-table').textContent()).resolves.toContain('kW')

    // The correction standard redraws the story's figures too.
    await data.getByTestId('standard-switch').selectOption('din-70020')
    await expect.poll(() => data.getByTestId('story-results').getAttribute('data-standard'), NETWORK).toBe('din-70020')
    const graphs = page.getByTestId('figure-graph')
    await expect(graphs.count()).resolves.toBe(2)
    for (let i = 0; i < 2; i++) {
      await expect.poll(() => graphs.nth(i).locator('figcaption').textContent(), NETWORK).toContain('DIN 70020')
      await expect.poll(() => graphs.nth(i).getByTestId('figure-data').textContent(), NETWORK).toContain('(kW)')
    }
    // One page-level switch: the body's results table follows in standard and units, the prose never.
    const bodyTable = page.getByTestId('figure-results-table').first()
    await expect.poll(() => bodyTable.textContent(), NETWORK).toContain('DIN 70020')
    await expect.poll(() => bodyTable.textContent(), NETWORK).toContain('kW')
    expect(await prose.textContent()).toBe(proseText)
    await expect(page.getByTestId('story-edition-note').textContent()).resolves.toContain('now show DIN 70020')

    const [download] = await Promise.all([page.waitForEvent('download'), data.getByTestId('download-data').click()])
    const csv = readFileSync((await download.path())!, 'utf8')
    expect(csv.split(/\r?\n/)[1]).toContain('DIN 70020')
    expect(csv).toContain('Peak power (kW)')
    expect(csv).toContain('Averaged curves')
    expect(download.suggestedFilename()).toBe(`${slug}-data.csv`)

    await page.reload()
    await expect.poll(() => page.getByTestId('units-switch').inputValue()).toBe('kw-nm')
    await expect.poll(() => page.getByTestId('standard-switch').inputValue()).toBe('din-70020')
    await page.screenshot({ path: join(SHOTS, 'reader-story-desktop.png'), fullPage: true })
  })

  it('has no serious or critical accessibility problems on a story', async () => {
    const { page } = browser
    await page.goto(`/stories/${slug}`)
    await page.getByTestId('story-data').waitFor()
    expect(await seriousViolations(page)).toEqual([])
  })

  it('reaches the download and the switches by keyboard', async () => {
    const { page } = browser
    await page.goto(`/stories/${slug}`)
    const reached = new Set<string>()
    for (let i = 0; i < 80 && reached.size < 3; i++) {
      await page.keyboard.press('Tab')
      const id = await page.evaluate(() => document.activeElement?.getAttribute('data-testid') ?? '')
      if (['units-switch', 'standard-switch', 'download-data'].includes(id)) reached.add(id)
    }
    expect([...reached].sort()).toEqual(['download-data', 'standard-switch', 'units-switch'])
  })
})

// The signed-in reader's page is rendered per request, its article reused from the
// edition's first render (StoryArticleKept): the page must hydrate as a full render
// does (same useId numbers, same payload), and stay interactive.
describe('a signed-in reader on a story whose article is kept', () => {
  let browser: BrowserSession
  beforeAll(async () => { browser = await openBrowser() })
  afterAll(async () => { await browser?.close() })

  it('hydrates without a mismatch and the graphs and the units switch work', async () => {
    const { page } = browser
    // A reader of its own: the units chosen below go to the account's preferences.
    const email = uniqueEmail('kept-reader')
    const password = 'a-long-test-password'
    expectOk(await (await signedIn('admin@example.com')).post('/api/users', { email, displayName: 'Kept reader', role: 'reader', password }), 201)
    await signInThroughPage(page, email, password)
    const warnings: string[] = []
    page.on('console', (m) => { if (/hydration|mismatch/i.test(m.text())) warnings.push(`${m.type()}: ${m.text().slice(0, 300)}`) })
    // The first load renders the article (or reuses an earlier render); the second surely reuses it.
    await gotoReady(page, `/stories/${slug}`)
    await gotoReady(page, `/stories/${slug}`)
    await page.getByTestId('user-name').waitFor()
    const graph = page.getByTestId('figure-graph').first()
    await graph.scrollIntoViewIfNeeded()
    await page.locator('[data-testid="figure-graph"][data-live="true"]').first().waitFor({ timeout: 20_000 })
    // The readout's slider (its id from useId, after the article's) answers the keyboard.
    const at = graph.getByTestId('figure-readout-at')
    const rpmOf = async () => Number((await at.textContent())!.replace(/[^\d]/g, ''))
    const middle = await rpmOf()
    await graph.getByTestId('figure-readout-rpm').focus()
    await page.keyboard.press('End')
    await expect.poll(rpmOf).toBeGreaterThan(middle)
    // The page-level units switch, after the article, redraws the article's graph.
    const data = page.getByTestId('story-data')
    await data.getByTestId('units-switch').selectOption('kw-nm')
    await expect.poll(() => graph.getByTestId('figure-readout-row').first().textContent(), NETWORK).toMatch(/kW/)
    expect(warnings).toEqual([])
  })
})

describe('home, search and phones', () => {
  let browser: BrowserSession
  afterAll(async () => { await browser?.close() })

  it('lists the story on the home page and finds it by search, without serious accessibility problems', async () => {
    browser = await openBrowser()
    const { page } = browser
    await page.goto('/')
    await page.getByTestId(`story-card-${slug}`).first().waitFor()
    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: join(SHOTS, 'reader-home-desktop.png'), fullPage: true })

    await page.getByTestId('search-input').first().fill(word)
    await page.getByTestId('search-submit').first().click()
    await page.waitForURL(/\/search\?q=/)
    await page.getByTestId('search-results').getByTestId(`story-card-${slug}`).waitFor()
    expect(await seriousViolations(page)).toEqual([])
  })

  it('fits a phone screen', async () => {
    const phone = await openBrowser({ width: 390, height: 844 })
    try {
      const { page } = phone
      await page.goto(`/stories/${slug}`)
      await page.getByTestId('story-data').waitFor()
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
      expect(overflow).toBeLessThanOrEqual(0)
      await page.screenshot({ path: join(SHOTS, 'reader-story-phone.png'), fullPage: true })
      await page.goto('/')
      await page.screenshot({ path: join(SHOTS, 'reader-home-phone.png'), fullPage: true })
    }
    finally {
      await phone.close()
    }
  })
})
