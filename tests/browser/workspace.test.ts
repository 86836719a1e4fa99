import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import {
  applyCorrection, averagePulls, correctionFactor, hpToKw, lbFtToNm, parsePullCsv, peakOf, reportRound, syntheticPull,
  type AtRpm, type CorrectionStandard,
} from '#shared/dyno'
import { ANALYSIS_GRID } from '#shared/types/analysis'
import { OKABE_ITO } from '#shared/utils/chart-options'
import { formatReported } from '#shared/utils/figures'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { DEMO_PASSWORD } from '../support/http'

// Two invented setups of an invented engine, one synthetic pull each
// (shared/dyno/synthetic.ts: seeded torque model with noise and a drawn weather day).
const MODEL = { fromRpm: 2500, toRpm: 6500, widthLowRpm: 2200, widthHighRpm: 1800 }
const PULLS = [
  { label: 'Stock cast manifolds (invented)', file: 'stock-pull-1.csv', pull: syntheticPull({ ...MODEL, seed: 4101, peakTorqueLbFt: 420, peakTorqueRpm: 4200 }) },
  { label: 'Long-tube headers 1-3/4 in (invented)', file: 'long-tube-pull-1.csv', pull: syntheticPull({ ...MODEL, seed: 4102, peakTorqueLbFt: 441, peakTorqueRpm: 4500 }) },
]
// The page opens with the bench test's default standard, which a new bench test sets to this.
const STANDARD: CorrectionStandard = 'sae-j1349-1990'

/**
 * What the results table should say, computed here from the same CSV text with
 * shared/dyno: parse, correct with the file's weather, average on the analysis grid,
 * take the peaks and round them as reported (half away from zero, product brief).
 */
function expectedPeaks(csv: string): { power: AtRpm, torque: AtRpm } {
  const parsed = parsePullCsv(csv)
  expect(parsed.ok).toBe(true)
  const w = parsed.weather!
  const corrected = applyCorrection(parsed.points, STANDARD, { baroInHg: w.baroInHg!, airTempF: w.airTempF!, humidityPct: w.humidityPct! })
  const curve = averagePulls([corrected], ANALYSIS_GRID.curveStepRpm).points
  return { power: peakOf(curve, 'powerHp'), torque: peakOf(curve, 'torqueLbFt') }
}

const figure = (text: string | null) => Number((text ?? '').replace(/,/g, ''))

describe('a writer takes a bench test from nothing to compared curves', () => {
  let browser: BrowserSession
  let page: Page
  let benchTestId = 0
  let setupIds: number[] = []

  beforeAll(async () => {
    browser = await openBrowser({ width: 1400, height: 1000 })
    page = browser.page
    await signInThroughPage(page, 'writer@example.com', DEMO_PASSWORD)
  })
  afterAll(async () => { await browser?.close() })

  it('creates a bench test from the list page', async () => {
    await gotoReady(page, '/bench-tests')
    const form = page.getByTestId('bench-test-create-form')
    await form.getByTestId('bench-test-title').fill(`Header sizes on an invented V8 ${Date.now()}`)
    await form.getByTestId('bench-test-part-type').selectOption('exhaust')
    await page.getByTestId('bench-test-create').click()
    await page.waitForURL(/\/bench-tests\/\d+$/)
    benchTestId = Number(/\/bench-tests\/(\d+)$/.exec(page.url())![1])
    expect(benchTestId).toBeGreaterThan(0)
    expect(await page.getByTestId('bench-test-heading').textContent()).toContain('Header sizes on an invented V8')
  })

  it('refuses an empty setup name inline, then adds two setups', async () => {
    await page.getByTestId('bench-test-nav-setups').click()
    await page.waitForURL(/\/setups$/)
    await page.getByTestId('setup-add').click()
    await expect(page.locator('#new-setup-label-error').textContent()).resolves.toContain('Name the setup')

    for (const [i, p] of PULLS.entries()) {
      await page.getByTestId('setup-label').fill(p.label)
      await page.getByTestId('setup-add').click()
      await page.getByTestId('setup-list').locator('[data-testid="setup-name"]').nth(i).waitFor()
    }
    const names = await page.getByTestId('setup-list').getByTestId('setup-name').allTextContents()
    expect(names).toEqual(PULLS.map(p => p.label))
    // The first setup of a bench test is its baseline.
    expect(await page.getByTestId('setup-baseline-badge').count()).toBe(1)

    const res = await page.request.get(`/api/bench-tests/${benchTestId}`)
    const detail = await res.json() as { setups: { id: number, label: string, isBaseline: boolean }[] }
    setupIds = PULLS.map(p => detail.setups.find(s => s.label === p.label)!.id)
    expect(detail.setups.find(s => s.isBaseline)?.id).toBe(setupIds[0])
  })

  it('imports two CSV files in one batch after the preview', async () => {
    await page.getByTestId('bench-test-nav-pulls').click()
    await page.waitForURL(/\/pulls$/)
    await page.getByTestId('import-file-input').setInputFiles(PULLS.map(p => ({ name: p.file, mimeType: 'text/csv', buffer: Buffer.from(p.pull.csv) })))
    for (const [i, p] of PULLS.entries()) {
      const file = page.getByTestId(`import-file-${i}`)
      await file.and(page.locator('[data-state="ok"]')).waitFor({ timeout: 20_000 })
      // Preview before saving: the points and the weather read from the file.
      expect(figure(await file.getByTestId('import-points').textContent())).toBe(p.pull.points.length)
      expect(Number(await file.getByTestId('weather-baro').inputValue())).toBeCloseTo(p.pull.weather.baroInHg, 2)
      expect(Number(await file.getByTestId('weather-temp').inputValue())).toBeCloseTo(p.pull.weather.airTempF, 1)
      await file.getByTestId(`import-setup-${i}`).selectOption(String(setupIds[i]))
    }
    await page.getByTestId('import-save').click()
    await expect(page.getByTestId('import-saved').textContent()).resolves.toContain('2 pulls saved')
    for (const id of setupIds) await page.getByTestId(`pull-group-${id}`).locator('[data-testid^="pull-"]').first().waitFor()
  })

  it('shows both curves and the right peaks in the results table', async () => {
    await page.getByTestId('bench-test-nav-analysis').click()
    await page.waitForURL(/\/analysis$/)
    const chart = page.locator('[data-testid="analysis-chart"][data-series-count="2"]')
    await chart.waitFor({ timeout: 20_000 })
    expect(await chart.getAttribute('data-setup-ids')).toBe(setupIds.join(','))
    // Drawn as SVG: each setup's colour appears on its power and its torque line.
    await chart.locator('svg').first().waitFor()
    for (const colour of OKABE_ITO.slice(0, 2)) {
      const lines = chart.locator(`svg path[stroke="${colour}" i], svg path[stroke="${hexToRgb(colour)}"]`)
      await expect(lines.count()).resolves.toBeGreaterThanOrEqual(2)
    }
    expect(await page.getByTestId('analysis-chart-readout').locator('[data-testid^="readout-setup-"]').count()).toBe(2)

    await page.getByTestId('results-table').waitFor()
    for (const [i, p] of PULLS.entries()) {
      const want = expectedPeaks(p.pull.csv)
      const id = setupIds[i]
      expect(figure(await page.getByTestId(`results-peak-power-${id}`).textContent())).toBe(reportRound(want.power.value))
      expect(figure(await page.getByTestId(`results-peak-power-rpm-${id}`).textContent())).toBe(reportRound(want.power.rpm))
      expect(figure(await page.getByTestId(`results-peak-torque-${id}`).textContent())).toBe(reportRound(want.torque.value))
      expect(figure(await page.getByTestId(`results-peak-torque-rpm-${id}`).textContent())).toBe(reportRound(want.torque.rpm))
    }
  })

  it('switches the table to kW and N-m', async () => {
    await page.getByTestId('analysis-units-kw-nm').check()
    const id = setupIds[1]!
    const want = expectedPeaks(PULLS[1]!.pull.csv)
    const power = page.getByTestId(`results-peak-power-${id}`)
    // NIST SP 811 conversions (shared/dyno units), then rounded as reported.
    await expect.poll(async () => figure(await power.textContent()), { timeout: 15_000 }).toBe(reportRound(hpToKw(want.power.value)))
    expect(figure(await page.getByTestId(`results-peak-torque-${id}`).textContent())).toBe(reportRound(lbFtToNm(want.torque.value)))
    await page.getByTestId('analysis-units-hp-lbft').check()
  })

  it('shows each pull\'s factor under the chosen correction standard', async () => {
    const { body } = await (await page.request.get(`/api/bench-tests/${benchTestId}/pulls`)).json().then(b => ({ body: b as { pulls: { id: number, setupId: number }[] } }))
    const pullId = body.pulls.find(p => p.setupId === setupIds[0])!.id
    const cell = page.getByTestId(`factor-${pullId}`)
    // DIN 70020: (1013 / p[mbar]) x sqrt(T / 293), shared/dyno correction.ts (secondary source, see its README).
    for (const standard of ['din-70020', STANDARD] as const) {
      await page.getByTestId('analysis-standard').selectOption(standard)
      const want = formatReported(correctionFactor(standard, PULLS[0]!.pull.weather), 4)
      await expect.poll(() => cell.textContent(), { timeout: 15_000 }).toContain(want)
    }
  })

  it('keeps its choices in the URL: a shared link opens the same view, and back leaves the page', async () => {
    // Issue 15 item 15: setups shown, baseline, standard and units in the query, written with replace.
    await page.getByTestId('analysis-standard').selectOption('din-70020')
    await page.getByTestId('analysis-units-kw-nm').check()
    await page.getByTestId(`analysis-setup-${setupIds[1]}`).uncheck()
    await expect.poll(() => new URL(page.url()).searchParams.toString())
      .toBe(new URLSearchParams({ setups: String(setupIds[0]), standard: 'din-70020', units: 'kw-nm' }).toString())
    await page.locator(`[data-testid="analysis-chart"][data-setup-ids="${setupIds[0]}"]`).waitFor({ timeout: 20_000 })
    const shared = page.url()

    const other = await openBrowser({ width: 1280, height: 900 })
    try {
      await signInThroughPage(other.page, 'writer@example.com', DEMO_PASSWORD)
      await other.page.goto(shared)
      await other.page.locator(`[data-testid="analysis-chart"][data-setup-ids="${setupIds[0]}"]`).waitFor({ timeout: 20_000 })
      expect(await other.page.getByTestId('analysis-standard').inputValue()).toBe('din-70020')
      expect(await other.page.getByTestId('analysis-units-kw-nm').isChecked()).toBe(true)
      expect(await other.page.getByTestId(`analysis-setup-${setupIds[1]}`).isChecked()).toBe(false)
      await other.page.getByTestId(`analysis-setup-${setupIds[1]}`).check()
      await expect.poll(() => new URL(other.page.url()).searchParams.has('setups')).toBe(false)
      // Every change replaced the entry: back goes to the page before, not to an earlier view.
      await other.page.goBack()
      await expect.poll(() => other.page.url()).not.toContain('/analysis')
    }
    finally {
      await other.close()
    }

    // Coming back through the bench test's tabs (no query) shows the view left behind.
    await page.getByTestId('bench-test-nav-pulls').click()
    await page.waitForURL(/\/pulls$/)
    await page.getByTestId('bench-test-nav-analysis').click()
    await expect.poll(() => new URL(page.url()).searchParams.get('standard')).toBe('din-70020')
    await page.getByTestId(`analysis-setup-${setupIds[1]}`).check()
    await page.getByTestId('analysis-units-hp-lbft').check()
  })
})

function hexToRgb(hex: string): string {
  const n = Number.parseInt(hex.slice(1), 16)
  return `rgb(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255})`
}
