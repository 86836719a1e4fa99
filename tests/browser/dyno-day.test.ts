// The dyno day in browsers: the writer plans the day in the plan editor, starts it,
// and two people (the writer and an editor, each in their own browser) watch the day
// page while the operator sends files through the upload link; both see every new pull
// within 2 s without reloading. Then the swap to the next step, the run sheet on paper
// and the operator's phone view. Screenshots go to .data/test/screenshots/day-*.png.
import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { DEMO_PASSWORD, signedIn, type Client } from '../support/http'
import { closeTestDb } from '../support/db'
import { DEMO, createBenchTest, createSetup, expectOk, pullCsv, uploadFiles } from '../support/workspace'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
let writer: BrowserSession
let editor: BrowserSession
let api: Client
let bt: { id: number }
let token: string

function withCoolant(csv: string, coolantF: number): string {
  const lines = csv.split('\r\n')
  const header = lines.findIndex(l => l.startsWith('RPM'))
  return lines.map((l, i) => (i === header ? `${l},Coolant (F)` : i > header && l ? `${l},${coolantF}` : l)).join('\r\n')
}

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true })
  api = await signedIn(DEMO.writer)
  // A bench test of its own, so a step left current cannot catch another test's uploads.
  bt = await createBenchTest(api, 'Cam swap day (invented)')
  await createSetup(api, bt.id, 'Baseline')
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

describe('the dyno day', () => {
  it('plans the day in the editor', async () => {
    const page = writer.page
    await gotoReady(page, `/bench-tests/${bt.id}/plan`)
    await page.getByTestId('plan-empty').waitFor()
    await page.getByTestId('plan-rpm-to').fill('6000')
    await page.getByTestId('plan-add-step').click()
    await page.getByTestId('step-0-setup').selectOption({ label: 'Baseline (baseline)' })
    await page.getByTestId('step-0-change').fill('As delivered: stock cam, dual-plane intake')
    await page.getByTestId('step-0-pulls').fill('2')
    await page.getByTestId('step-0-checklist').fill('Warm up to 180 F\nCheck the fuel pressure')
    await page.getByTestId('plan-add-step').click()
    await page.getByTestId('step-1-new-label').fill('Cam B')
    await page.getByTestId('step-1-change').fill('Swap the cam for the mid-range grind (invented maker)')
    await page.getByTestId('step-1-minutes').fill('90')
    await page.getByTestId('step-1-checklist').fill('Degree the cam\nSet the lash\nCheck for leaks')
    await page.getByTestId('plan-save').click()
    await page.getByTestId('plan-notice').waitFor()
    expect(await page.getByTestId('plan-notice').textContent()).toContain('version 1')
    await page.screenshot({ path: join(SHOTS, 'day-plan-1280.png'), fullPage: true })
    await page.setViewportSize({ width: 390, height: 844 })
    await page.screenshot({ path: join(SHOTS, 'day-plan-390.png'), fullPage: true })
    await page.setViewportSize({ width: 1280, height: 900 })
  })

  it('shows both watchers each new pull within 2 s', async () => {
    await gotoReady(writer.page, `/bench-tests/${bt.id}/day`)
    await writer.page.getByTestId('day-next').click()
    await writer.page.getByTestId('day-current').waitFor()
    await gotoReady(editor.page, `/bench-tests/${bt.id}/day`)
    for (const s of [writer, editor]) await s.page.locator('[data-testid="day-live"][data-state="live"]').waitFor({ timeout: 10_000 })

    for (const [n, coolant] of [[1, 184], [2, 209]] as const) {
      const sent = Date.now()
      const res = await uploadFiles(token, [{ name: `base-${n}.csv`, text: withCoolant(pullCsv({ seed: 70 + n }).csv, coolant) }])
      expect(res.body.received[0].filedTo).toBe('Baseline')
      const seen = await Promise.all([writer, editor].map(async (s) => {
        await s.page.locator('[data-testid="day-pulls"] > li').nth(n - 1).waitFor({ timeout: 5000 })
        return Date.now() - sent
      }))
      for (const ms of seen) expect(ms).toBeLessThan(2000)
    }
    const second = editor.page.locator('[data-testid="day-pulls"] > li').nth(1)
    expect(await second.getAttribute('data-flagged')).toBe('true')
    expect(await second.textContent()).toContain('coolant 209 F, above the window\'s 200 F')
    await expect.poll(() => writer.page.getByTestId('day-verdict').textContent(), { timeout: 5000 }).toMatch(/two pulls within \d\.\d percent: enough|spread \d\.\d percent: make another pull/)
    await writer.page.getByTestId('day-chart').waitFor()
    await writer.page.getByTestId('results-table').waitFor()
  })

  it('ticks the checklist and moves to the next step; the gain over the previous setup shows', async () => {
    const page = writer.page
    await page.getByTestId('day-next').click()
    await expect.poll(() => page.getByTestId('day-current').textContent(), { timeout: 5000 }).toContain('Cam B')
    const boxes = page.locator('[data-testid="day-current"] input[type="checkbox"]')
    await boxes.first().check()
    await expect.poll(() => editor.page.locator('[data-testid="day-current"] input[type="checkbox"]').first().isChecked(), { timeout: 5000 }).toBe(true)
    for (const seed of [81, 82]) await uploadFiles(token, [{ name: `cam-${seed}.csv`, text: withCoolant(pullCsv({ seed, peakTorqueLbFt: 452 }).csv, 190) }])
    await page.locator('[data-testid="day-pulls"] > li').nth(1).waitFor({ timeout: 5000 })
    await page.getByTestId('day-gain').waitFor({ timeout: 10_000 })
    expect(await page.getByTestId('day-gain').textContent()).toContain('Cam B against Baseline')
    expect(await page.getByTestId('day-report-summary').textContent()).toMatch(/^2 of 2 planned setups tested, 4 pulls made of 5 planned\./)
    await page.screenshot({ path: join(SHOTS, 'day-view-1280.png'), fullPage: true })
    await page.setViewportSize({ width: 390, height: 844 })
    await page.screenshot({ path: join(SHOTS, 'day-view-390.png'), fullPage: true })
    await page.setViewportSize({ width: 1280, height: 900 })
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

  it('shows the operator what is next and what was received, on a phone', async () => {
    const phone = await openBrowser({ width: 390, height: 844 })
    try {
      await gotoReady(phone.page, `/upload/${token}`)
      await phone.page.getByTestId('operator-plan').waitFor()
      expect(await phone.page.getByTestId('operator-current').textContent()).toContain('Cam B')
      expect(await phone.page.getByTestId('operator-received').textContent()).toContain('2 of 3 pulls received')
      await phone.page.screenshot({ path: join(SHOTS, 'day-operator-390.png'), fullPage: true })
      await phone.page.setViewportSize({ width: 1280, height: 900 })
      await phone.page.screenshot({ path: join(SHOTS, 'day-operator-1280.png'), fullPage: true })
    }
    finally {
      await phone.close()
    }
  })
})
