// The whole dyno day in browsers, on the demo's planned bench test (server/db/demo/day-plan.ts):
// the writer opens the plan the demo seeded and prints the run sheet, starts the day, and
// two people (the writer and an editor, each in their own browser) watch the day page
// while the operator sends files through the upload link: both see every new pull within
// 2 s without reloading. Then the checklist and the swap to the next cam, the operator's
// phone view, the last cam skipped, the plan against what happened, and a story that
// quotes it, read by a reader on the published page. Screenshots go to
// .data/test/screenshots/day-*.png. Synthetic pulls (invented data).
import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { DEMO_PASSWORD, signedIn, type Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, expectOk, pullCsv, uploadFiles, withCoolant } from '../support/workspace'
import { createStoryFor, pick, saveStateIs, typeInBody } from './stories-fixtures'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
const DEMO_DAY_SLUG = 'three-cams-on-a-5-3-l-pushrod-v8-test-day'
let writer: BrowserSession
let editor: BrowserSession
let api: Client
let bt: { id: number }
let token: string

async function shoot(page: BrowserSession['page'], name: string) {
  await page.screenshot({ path: join(SHOTS, `${name}-1280.png`), fullPage: true })
  await page.setViewportSize({ width: 390, height: 844 })
  await page.screenshot({ path: join(SHOTS, `${name}-390.png`), fullPage: true })
  await page.setViewportSize({ width: 1280, height: 900 })
}

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true })
  api = await signedIn(DEMO.writer)
  const row = await testDb()('bench_tests').where({ slug: DEMO_DAY_SLUG }).first('id')
  expect(row, 'the demo seed plans a dyno day').toBeTruthy()
  bt = { id: Number(row.id) }
  token = expectOk(await api.post(`/api/bench-tests/${bt.id}/operator-links`, { expiresInHours: 4, label: 'Cell 1' }), 201).token
  writer = await openBrowser()
  editor = await openBrowser()
  await signInThroughPage(writer.page, DEMO.writer, DEMO_PASSWORD)
  await signInThroughPage(editor.page, DEMO.editor, DEMO_PASSWORD)
})

afterAll(async () => {
  await writer?.close()
  await editor?.close()
  await closeTestDb()
})

describe('the whole dyno day on the demo bench test', () => {
  it('opens the plan the demo wrote', async () => {
    const page = writer.page
    await gotoReady(page, `/bench-tests/${bt.id}/plan`)
    await page.getByTestId('plan-step-2').waitFor()
    expect(await page.getByTestId('step-0-change').inputValue()).toBe('None: the engine as delivered')
    expect(await page.getByTestId('step-2-minutes').inputValue()).toBe('90')
    await shoot(page, 'day-plan')
  })

  it('prints the run sheet on at most two pages', async () => {
    const page = writer.page
    await gotoReady(page, `/run-sheet/${bt.id}`)
    expect(await page.getByTestId('run-sheet-safety').textContent()).toContain('Safety')
    await page.screenshot({ path: join(SHOTS, 'day-run-sheet-1280.png'), fullPage: true })
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = await page.pdf({ format, printBackground: true })
      const file = join(SHOTS, `day-run-sheet-${format}.pdf`)
      writeFileSync(file, pdf)
      const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file]).toString())![1])
      expect(pages).toBeGreaterThanOrEqual(1)
      expect(pages).toBeLessThanOrEqual(2)
      execFileSync('pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '1', file, join(SHOTS, `day-run-sheet-${format}`)])
    }
  })

  it('starts the day, and both watchers see each new pull within 2 s', async () => {
    await gotoReady(writer.page, `/bench-tests/${bt.id}/day`)
    await writer.page.getByTestId('day-next').click()
    await writer.page.getByTestId('day-current').waitFor()
    await gotoReady(editor.page, `/bench-tests/${bt.id}/day`)
    for (const s of [writer, editor]) await s.page.locator('[data-testid="day-live"][data-state="live"]').waitFor({ timeout: 10_000 })

    // Both files go through before the times are judged, so a slow moment on a busy
    // machine fails this test alone, not the rest of the day.
    const seen: number[] = []
    for (const [n, coolant] of [[1, 184], [2, 209]] as const) {
      const sent = Date.now()
      const res = await uploadFiles(token, [{ name: `factory-${n}.csv`, text: withCoolant(pullCsv({ seed: 70 + n }).csv, coolant) }])
      expect(res.body.received[0].filedTo).toBe('Factory cam')
      seen.push(...await Promise.all([writer, editor].map(async (s) => {
        await s.page.locator('[data-testid="day-pulls"] > li').nth(n - 1).waitFor({ timeout: 10_000 })
        return Date.now() - sent
      })))
    }
    const second = editor.page.locator('[data-testid="day-pulls"] > li').nth(1)
    expect(await second.getAttribute('data-flagged')).toBe('true')
    expect(await second.textContent()).toContain('coolant 209 F, above the window\'s 200 F')
    await expect.poll(() => writer.page.getByTestId('day-verdict').textContent(), { timeout: 5000 }).toMatch(/two pulls within \d\.\d percent: enough|spread \d\.\d percent: make another pull/)
    await writer.page.getByTestId('day-chart').waitFor()
    await writer.page.getByTestId('results-table').waitFor()
    for (const ms of seen) expect(ms, 'from the upload to the pull on both watchers\' pages').toBeLessThan(2000)
  })

  it('ticks the checklist and swaps to the next cam; the gain over the previous setup shows', async () => {
    const page = writer.page
    await page.getByTestId('day-next').click()
    await expect.poll(() => page.getByTestId('day-current').textContent(), { timeout: 5000 }).toContain('Cam B: mid-range grind')
    const boxes = page.locator('[data-testid="day-current"] input[type="checkbox"]')
    await boxes.first().check()
    await expect.poll(() => editor.page.locator('[data-testid="day-current"] input[type="checkbox"]').first().isChecked(), { timeout: 5000 }).toBe(true)
    for (const seed of [81, 82]) await uploadFiles(token, [{ name: `cam-b-${seed}.csv`, text: withCoolant(pullCsv({ seed, peakTorqueLbFt: 452 }).csv, 190) }])
    await page.locator('[data-testid="day-pulls"] > li').nth(1).waitFor({ timeout: 5000 })
    await page.getByTestId('day-gain').waitFor({ timeout: 10_000 })
    expect(await page.getByTestId('day-gain').textContent()).toContain('Cam B: mid-range grind against Factory cam')
    expect(await page.getByTestId('day-report-summary').textContent()).toMatch(/^2 of 3 planned setups tested, 4 pulls made of 6 planned\./)
    await shoot(page, 'day-view')
  })

  it('shows the operator what is on and what was received, on a phone', async () => {
    const phone = await openBrowser({ width: 390, height: 844 })
    try {
      await gotoReady(phone.page, `/upload/${token}`)
      await phone.page.getByTestId('operator-plan').waitFor()
      expect(await phone.page.getByTestId('operator-current').textContent()).toContain('Cam B: mid-range grind')
      expect(await phone.page.getByTestId('operator-received').textContent()).toContain('2 of 2 pulls received')
      await phone.page.screenshot({ path: join(SHOTS, 'day-operator-390.png'), fullPage: true })
      await phone.page.setViewportSize({ width: 1280, height: 900 })
      await phone.page.screenshot({ path: join(SHOTS, 'day-operator-1280.png'), fullPage: true })
    }
    finally {
      await phone.close()
    }
  })

  it('skips the last cam, and the day keeps the plan against what happened', async () => {
    const page = writer.page
    await page.getByTestId('day-next').click()
    await expect.poll(() => page.getByTestId('day-current').textContent(), { timeout: 5000 }).toContain('Cam C: top-end grind')
    await page.getByTestId('day-skip').click()
    await page.getByTestId('day-idle').waitFor()
    await expect.poll(() => editor.page.getByTestId('day-report-summary').textContent(), { timeout: 5000 })
      .toMatch(/^2 of 3 planned setups tested, 4 pulls made of 6 planned\. 1 setup was skipped: Cam C: top-end grind\./)
    const outcomes = await page.locator('[data-testid="day-report"] tbody tr td:last-child').allTextContents()
    expect(outcomes.map(t => t.trim())).toEqual(['short', 'done', 'skipped'])
  })

  it('the story quotes the day, and readers see it on the published page', async () => {
    const page = writer.page
    const story = await createStoryFor(api, bt.id, 'Three cams, one day (invented)', 'The factory cam against two grinds.\n\n::pull-graph{channel="power"}\n::\n')
    await gotoReady(page, `/stories/${story.id}/edit`)
    await typeInBody(page, '\n\nHow the day went:\n\n')
    await pick(page, async (picker) => {
      await picker.getByTestId('picker-kind').selectOption('day-report')
      expect(await picker.getByTestId('picker-day-note').textContent()).toContain('1 setup was skipped: Cam C: top-end grind.')
    })
    expect(await page.getByTestId('editor-body').inputValue()).toContain('::day-report\n::')
    await saveStateIs(page, 'saved')
    const preview = page.getByTestId('editor-preview')
    await expect.poll(() => preview.getByTestId('figure-day-report-summary').textContent(), { timeout: 10_000 }).toContain('4 pulls made of 6 planned')

    const desk = await signedIn(DEMO.editor)
    const move = async (action: string) => {
      const { story: now } = expectOk(await desk.get(`/api/stories/${story.id}`))
      expectOk(await desk.post(`/api/stories/${story.id}/transitions`, { action, version: now.version }))
    }
    await move('submit')
    expectOk(await desk.get(`/api/stories/${story.id}/number-check`))
    await move('approve')
    await move('publish_now')

    const reader = await openBrowser({ width: 390, height: 844 })
    try {
      await gotoReady(reader.page, `/stories/${story.slug}`)
      const figure = reader.page.getByTestId('figure-day-report')
      await figure.waitFor()
      expect(await figure.textContent()).toContain('2 of 3 planned setups tested, 4 pulls made of 6 planned. 1 setup was skipped: Cam C: top-end grind.')
      // On a phone each step is a line of its own and nothing runs off the side.
      const items = await figure.getByTestId('figure-day-report-list').locator('li').allTextContents()
      expect(items.map(t => t.replace(/\s+/g, ' ').trim())).toEqual([
        'Factory cam: short. 2 of 2 pulls made, 1 counted.',
        'Cam B: mid-range grind: done. 2 of 2 pulls made, 2 counted; swap 0 min (90 planned).',
        'Cam C: top-end grind: skipped. 0 of 2 pulls made, 0 counted; swap 90 min planned.',
      ])
      expect(await figure.evaluate(el => el.scrollWidth <= el.clientWidth + 1)).toBe(true)
      await figure.screenshot({ path: join(SHOTS, 'day-story-figure-390.png') })
      await reader.page.setViewportSize({ width: 1280, height: 900 })
      expect(await figure.locator('tbody tr').count()).toBe(3)
      expect(await figure.locator('tbody tr').first().textContent()).toContain('Factory cam')
      await figure.screenshot({ path: join(SHOTS, 'day-story-figure-1280.png') })
    }
    finally {
      await reader.close()
    }
  })
})
