import { mkdirSync } from 'node:fs'
import { afterAll, beforeAll, beforeEach, describe, expect, it, onTestFailed } from 'vitest'
import type { Page } from 'playwright-core'
import { camEvents, ciToLiters, displacementCi, syntheticPull } from '#shared/dyno'
import { formatReported } from '#shared/utils/figures'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { BASE_URL, DEMO_PASSWORD } from '../support/http'

// The workspace's other paths through the pages: build sheet, cam card, a save that
// meets someone else's, a bad file, the operator's link to the inbox, delete and
// restore. Names and data are invented.
const ORIGIN = new URL(BASE_URL).origin
const SHOTS = process.env.WORKSPACE_SHOTS // a folder: screenshots for a human look, off in CI

async function shot(page: Page, name: string) {
  if (!SHOTS) return
  mkdirSync(SHOTS, { recursive: true })
  await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true })
}

const pull = (seed: number) => syntheticPull({ seed, fromRpm: 2000, toRpm: 6000, peakTorqueLbFt: 180, peakTorqueRpm: 4400, widthLowRpm: 2000, widthHighRpm: 1500 })

describe('workspace pages beyond the first import', () => {
  let browser: BrowserSession
  let page: Page
  let id = 0
  let setupId = 0

  const api = async (method: 'get' | 'post' | 'patch' | 'put', path: string, data?: unknown) => {
    const res = await page.request[method](path, { data, headers: { origin: ORIGIN } })
    return { status: res.status(), body: await res.json() as any }
  }

  beforeAll(async () => {
    browser = await openBrowser({ width: 1400, height: 1000 })
    page = browser.page
    await signInThroughPage(page, 'writer@example.com', DEMO_PASSWORD)
    const created = await api('post', '/api/bench-tests', { title: `Invented four-cylinder intake test ${Date.now()}`, engineFamily: 'ohc-four', partType: 'intake' })
    expect(created.status).toBe(201)
    id = created.body.benchTest.id
    const setup = await api('post', `/api/bench-tests/${id}/setups`, { label: 'Stock intake (invented)' })
    setupId = setup.body.setup.id
  })
  afterAll(async () => { await browser?.close() })
  beforeEach((ctx) => { onTestFailed(() => shot(page, `failed-${ctx.task.name.slice(0, 40).replace(/\W+/g, '-')}`)) })

  it('shows displacement live on the build sheet and saves it', async () => {
    await gotoReady(page, `/bench-tests/${id}`)
    const sheet = page.getByTestId('build-sheet-form')
    await sheet.getByTestId('build-sheet-bore').fill('3.386')
    await sheet.getByTestId('build-sheet-stroke').fill('3.386')
    await sheet.getByTestId('build-sheet-cylinders').fill('4')
    // pi/4 x bore^2 x stroke x cylinders (published: textbook swept volume, shared/dyno engine.ts)
    const ci = displacementCi({ boreIn: 3.386, strokeIn: 3.386, cylinders: 4 })
    await expect(sheet.getByTestId('build-sheet-displacement').textContent()).resolves.toContain(`${formatReported(ci, 1)} in³ · ${formatReported(ciToLiters(ci), 2)} L`)
    await sheet.getByTestId('build-sheet-save').click()
    await sheet.getByText(/^Saved:/).waitFor()
    await shot(page, 'overview')
    const detail = await api('get', `/api/bench-tests/${id}`)
    expect(detail.body.buildSheet.cylinders).toBe(4)
  })

  it('keeps what was typed when someone else saved the details meanwhile', async () => {
    await gotoReady(page, `/bench-tests/${id}`)
    const form = page.getByTestId('bench-test-edit-form')
    const current = await api('get', `/api/bench-tests/${id}`)
    const theirs = await api('patch', `/api/bench-tests/${id}`, { version: current.body.benchTest.version, shop: 'Invented Dyno Works' })
    expect(theirs.status).toBe(200)
    await form.getByTestId('bench-test-title').fill('My better title (invented)')
    await form.getByTestId('bench-test-save').click()
    const dialog = form.getByTestId('conflict-dialog')
    await dialog.waitFor()
    await shot(page, 'conflict')
    // Theirs changed the shop only: keeping mine saves my title and keeps their shop.
    expect(await dialog.getByTestId('conflict-kept').textContent()).toContain('Shop')
    await dialog.getByTestId('conflict-keep').click()
    await page.getByTestId('bench-test-heading').filter({ hasText: 'My better title (invented)' }).waitFor()
    const after = await api('get', `/api/bench-tests/${id}`)
    expect(after.body.benchTest).toMatchObject({ title: 'My better title (invented)', shop: 'Invented Dyno Works' })
    expect(await form.getByTestId('bench-test-title').inputValue()).toBe('My better title (invented)')
  })

  it('computes cam events on the card as it is typed', async () => {
    await gotoReady(page, `/bench-tests/${id}/setups`)
    const form = page.getByTestId('setup-create-form')
    await form.getByTestId('setup-label').fill('Bigger cam (invented)')
    await form.getByTestId('part-category').selectOption('camshaft')
    await form.getByTestId('part-add').click()
    const card = form.getByTestId('part-card-camshaft')
    const cam = { intakeDuration050Deg: '224', exhaustDuration050Deg: '232', intakeLiftIn: '0.48', exhaustLiftIn: '0.49', lsaDeg: '112', iclDeg: '108' }
    for (const [k, v] of Object.entries(cam)) await card.getByTestId(`part-${k}`).fill(v)
    // Cam card definitions (published, shared/dyno cam.ts): overlap = IVO + EVC.
    const e = camEvents({ intakeDuration: 224, exhaustDuration: 232, lsa: 112, icl: 108 })
    expect(e.overlap).toBe(4)
    await expect(card.getByTestId('cam-overlap').textContent()).resolves.toMatch(/^\s*4°\s*$/)

    // Labels that wrap take their extra line above themselves: the fields of one row of
    // the card keep their inputs level at every width (issue 15 item 6).
    for (const width of [640, 820, 1400]) {
      await page.setViewportSize({ width, height: 1000 })
      await page.waitForTimeout(100)
      const rows = await card.evaluate((el) => {
        const byRow = new Map<number, { label: number, control: number }[]>()
        for (const field of el.querySelectorAll('.form-field')) {
          const control = field.querySelector('input, select, textarea')
          const label = field.querySelector('label')
          if (!control || !label) continue
          const top = Math.round(field.getBoundingClientRect().top)
          byRow.set(top, [...(byRow.get(top) ?? []), { label: label.getBoundingClientRect().height, control: Math.round(control.getBoundingClientRect().top) }])
        }
        return [...byRow.values()].filter(r => r.length > 1)
      })
      for (const row of rows) expect(new Set(row.map(f => f.control)).size, `controls of one row level at ${width} px: ${JSON.stringify(row)}`).toBe(1)
      if (width === 640) {
        expect(rows.length, 'fields side by side at 640 px').toBeGreaterThan(0)
        await shot(page, 'setup-form-640')
      }
    }

    await form.getByTestId('setup-add').click()
    await form.getByTestId('setup-added').waitFor()
    // The setup list shows the cam card as a table, intake beside exhaust, with its
    // events at 0.050 in (worked by hand from the definitions, check-sources.md:
    // IVO = 224/2 - 108 = 4 BTDC, EVO = 232/2 + 116 - 180 = 52 BBDC, IVC 40 ABDC, EVC 0).
    const table = page.getByTestId('setup-cam-table').last()
    await table.waitFor()
    const cells = await table.locator('tbody tr').evaluateAll(rows => rows.map(r => [...r.children].map(c => c.textContent!.replace(/\s+/g, ' ').trim())))
    expect(cells).toContainEqual(['Opens at 0.050 in', '4° BTDC', '52° BBDC'])
    expect(cells).toContainEqual(['Closes at 0.050 in', '40° ABDC', '0° ATDC'])
    expect(await page.getByTestId('setup-cam-pair').last().textContent()).toMatch(/Overlap at 0\.050\sin\s4°/)
    await shot(page, 'setups')
  })

  it('shows a bad file\'s problems with line and column and will not save it', async () => {
    await gotoReady(page, `/bench-tests/${id}/pulls`)
    const good = pull(77).csv.split('\r\n')
    good[12] = good[12]!.replace(/^(\d+),[^,]+/, '$1,4o2.1') // a typo in a torque cell
    await page.getByTestId('import-file-input').setInputFiles({ name: 'typo.csv', mimeType: 'text/csv', buffer: Buffer.from(good.join('\r\n')) })
    const file = page.getByTestId('import-file-0')
    await file.and(page.locator('[data-state="errors"]')).waitFor({ timeout: 20_000 })
    const problems = await file.getByTestId('import-problems').textContent()
    expect(problems).toContain('line 13')
    expect(problems).toContain('Torque (lb-ft)')
    expect(await page.getByTestId('import-save').isDisabled()).toBe(true)
    await shot(page, 'import-bad')
    await page.getByTestId('import-remove-0').click()
  })

  it('asks which column holds what when a header is not recognised', async () => {
    await gotoReady(page, `/bench-tests/${id}/pulls`)
    const csv = pull(79).csv.replace('RPM,', 'Motor speed,')
    await page.getByTestId('import-file-input').setInputFiles({ name: 'odd-header.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    const file = page.getByTestId('import-file-0')
    await file.and(page.locator('[data-state="errors"]')).waitFor({ timeout: 20_000 })
    const mapping = file.getByTestId('import-mapping')
    expect(await mapping.textContent()).toContain('Motor speed')
    await mapping.getByTestId('import-mapping-0').selectOption('rpm')
    await mapping.getByTestId('import-mapping-apply').click()
    await file.and(page.locator('[data-state="ok"]')).waitFor({ timeout: 20_000 })
    expect(await page.getByTestId('import-save').isDisabled()).toBe(false)
    await page.getByTestId('import-remove-0').click()
  })

  it('takes a file from the operator\'s link into the inbox and makes it a pull', async () => {
    await gotoReady(page, `/bench-tests/${id}/inbox`)
    await page.getByTestId('link-label').fill('Cell 2 (invented)')
    await page.getByTestId('link-create').click()
    const url = await page.getByTestId('link-url').inputValue()
    expect(url).toMatch(/\/upload\/[^/]+$/)

    const operator = await openBrowser()
    try {
      await gotoReady(operator.page, new URL(url).pathname)
      await expect(operator.page.getByTestId('upload-title').textContent()).resolves.toContain('My better title (invented)')
      await operator.page.getByTestId('import-file-input').setInputFiles({ name: 'cell2-pull.csv', mimeType: 'text/csv', buffer: Buffer.from(pull(78).csv) })
      await operator.page.getByTestId('upload-sent-received').waitFor({ timeout: 20_000 })
      await shot(operator.page, 'upload')
    }
    finally { await operator.close() }

    await page.reload()
    const card = page.locator('[data-testid^="inbox-file-"]').first()
    await card.waitFor()
    await card.locator('[data-testid^="inbox-select-"]').check()
    await card.locator('[data-testid^="inbox-setup-"]').selectOption(String(setupId))
    await shot(page, 'inbox')
    await page.getByTestId('inbox-assign').click()
    await page.getByText('added as a pull of its setup').waitFor()
    const pulls = await api('get', `/api/bench-tests/${id}/pulls`)
    expect(pulls.body.pulls.map((p: any) => p.fileName)).toContain('cell2-pull.csv')

    const [link] = (await api('get', `/api/bench-tests/${id}/operator-links`)).body.links
    await page.getByTestId(`link-revoke-${link.id}`).click()
    await page.getByTestId(`link-${link.id}`).getByTestId('link-state').filter({ hasText: 'Revoked' }).waitFor()
    const late = await openBrowser()
    try {
      await late.page.goto(new URL(url).pathname)
      await expect(late.page.getByTestId('upload-closed').textContent()).resolves.toMatch(/withdrawn/i)
    }
    finally { await late.close() }
  })

  it('leaves a pull out only with a reason, and takes it back', async () => {
    await gotoReady(page, `/bench-tests/${id}/pulls`)
    const { body } = await api('get', `/api/bench-tests/${id}/pulls`)
    const pullId = body.pulls[0].id
    await page.getByTestId(`pull-exclude-${pullId}`).click()
    const row = page.getByTestId(`pull-${pullId}`)
    await row.getByRole('button', { name: 'Leave out' }).click()
    await expect(row.locator(`#pull-${pullId}-reason-error`).textContent()).resolves.toContain('Say why the pull is left out')
    await page.getByTestId(`pull-reason-${pullId}`).fill('Belt slipped at 5,800 rpm (invented)')
    await row.getByRole('button', { name: 'Leave out' }).click()
    await page.getByTestId(`pull-include-${pullId}`).waitFor()
    expect((await api('get', `/api/bench-tests/${id}/pulls`)).body.pulls[0]).toMatchObject({ included: false, exclusionReason: 'Belt slipped at 5,800 rpm (invented)' })
    await page.getByTestId(`pull-include-${pullId}`).click()
    await page.getByTestId(`pull-exclude-${pullId}`).waitFor()
  })

  it('moves a setup down the list and makes another the baseline', async () => {
    await gotoReady(page, `/bench-tests/${id}/setups`)
    const names = () => page.getByTestId('setup-list').getByTestId('setup-name').allTextContents()
    const before = await names()
    await page.getByTestId(`setup-down-${setupId}`).click()
    await expect.poll(names).toEqual([...before].reverse())
    const other = (await api('get', `/api/bench-tests/${id}`)).body.setups.find((s: any) => s.id !== setupId)
    await page.getByTestId(`setup-make-baseline-${other.id}`).click()
    await page.getByTestId(`setup-${other.id}`).getByTestId('setup-baseline-badge').waitFor()
    expect(await page.getByTestId(`setup-${setupId}`).getByTestId('setup-baseline-badge').count()).toBe(0)
  })

  it('asks before deleting a setup with pulls, and restores it', async () => {
    await gotoReady(page, `/bench-tests/${id}/setups`)
    await page.getByTestId(`setup-delete-${setupId}`).click()
    const dialog = page.getByTestId('confirm-dialog')
    await dialog.waitFor()
    expect(await dialog.textContent()).toMatch(/1 pull/)
    await shot(page, 'delete-confirm')
    await dialog.getByTestId('confirm-ok').click()
    await page.getByTestId(`setup-restore-${setupId}`).click()
    await page.getByTestId(`setup-${setupId}`).waitFor()
  })

  it('draws the analysis for the one setup with pulls', async () => {
    await gotoReady(page, `/bench-tests/${id}/analysis`)
    await page.locator('[data-testid="analysis-chart"][data-series-count="1"]').waitFor({ timeout: 20_000 })
    await page.getByTestId(`results-peak-power-${setupId}`).waitFor()
    await shot(page, 'analysis')
  })

  it('deletes the bench test only after confirming, and restores it from the list', async () => {
    await gotoReady(page, `/bench-tests/${id}`)
    await page.getByTestId('bench-test-delete').click()
    const dialog = page.getByTestId('confirm-dialog')
    await dialog.waitFor()
    expect(await dialog.textContent()).toMatch(/pull/)
    await dialog.getByTestId('confirm-ok').click()
    await page.waitForURL(/\/bench-tests\?deleted=/)
    await page.getByTestId('bench-test-deleted-notice').getByRole('button', { name: 'Restore it' }).click()
    await page.waitForURL(new RegExp(`/bench-tests/${id}$`))
    await page.getByTestId('bench-test-heading').waitFor()
  })

  it.runIf(!!SHOTS)('pictures the demo bench test with the most pulls (for a human look)', async () => {
    const list = (await api('get', '/api/bench-tests')).body.benchTests as { id: number, pullCount: number }[]
    const demo = [...list].sort((a, b) => b.pullCount - a.pullCount)[0]
    expect(demo?.pullCount).toBeGreaterThan(0)
    for (const section of ['pulls', 'analysis']) {
      await gotoReady(page, `/bench-tests/${demo!.id}/${section}`)
      if (section === 'analysis') await page.locator('[data-testid="analysis-chart"] svg').first().waitFor({ timeout: 20_000 })
      await shot(page, `demo-${section}`)
    }
  })
})
