// The writer's editor (issue 15 items 4 and 5) and the desk's pages (item 9):
// - each figure in the picker starts from its kind's defaults: a results table after a
//   pull graph lists the baseline and every setup, with no caption carried over;
// - the writer runs the number check in the editor: the wrong figure is quoted in its
//   sentence and its note stands beside that paragraph in the preview, numbers grouped;
// - the desk's pages hydrate without a mismatch logged in the console.
// Screenshots go to .data/test/screenshots (editor-*.png, desk-*.png).
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { DEMO_PASSWORD } from '../support/http'
import { acceptLeaving, benchWithPulls, createStoryFor, saveStateIs, type StoryBench } from './stories-fixtures'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')

/** Console messages of a page that speak of a hydration mismatch. */
function hydrationWarnings(page: Page): string[] {
  const seen: string[] = []
  page.on('console', (m) => {
    if (/hydration/i.test(m.text())) seen.push(`${m.type()}: ${m.text().slice(0, 300)}`)
  })
  return seen
}

describe('the editor: figure picker defaults and the writer\'s number check', () => {
  let bench: StoryBench
  let writer: BrowserSession
  let storyId = 0

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true })
    bench = await benchWithPulls()
    // A number the data does not give, in a sentence of its own paragraph.
    const body = [
      'We swapped the stock cam for a longer one, on an invented engine.',
      '',
      'At the peak the long cam gained 108 hp over the stock one.',
      '',
    ].join('\n')
    storyId = (await createStoryFor(bench.writer.client, bench.benchTestId, `Numbers in the editor ${Date.now().toString(36)}`, body)).id
    writer = await openBrowser({ width: 1440, height: 1000 })
    acceptLeaving(writer.page)
    await signInThroughPage(writer.page, bench.writer.email, bench.writer.password)
  }, 120_000)
  afterAll(async () => {
    await writer?.close()
  })

  it('a results table after a pull graph starts with the baseline and every setup and an empty caption', async () => {
    const { page } = writer
    await gotoReady(page, `/stories/${storyId}/edit`)
    await page.getByTestId('picker-open').click()
    const picker = page.getByTestId('picker')
    await picker.waitFor()
    await picker.getByTestId('picker-kind').selectOption('pull-graph')
    // The graph: only the cam, with a caption of its own.
    expect(await picker.getByTestId(`picker-setup-${bench.baselineId}`).isChecked()).toBe(true)
    await picker.getByTestId(`picker-setup-${bench.baselineId}`).uncheck()
    await picker.getByTestId('picker-caption').fill('The long cam alone')
    expect(await picker.getByTestId('picker-snippet').textContent()).toBe(`::pull-graph{setups="${bench.camId}" caption="The long cam alone"}\n::`)
    await picker.getByTestId('picker-insert').click()
    await picker.waitFor({ state: 'hidden' })

    await page.getByTestId('picker-open').click()
    await picker.waitFor()
    await picker.getByTestId('picker-kind').selectOption('results-table')
    expect(await picker.getByTestId(`picker-setup-${bench.baselineId}`).isChecked()).toBe(true)
    expect(await picker.getByTestId(`picker-setup-${bench.baselineId}`).isDisabled()).toBe(true)
    expect(await picker.getByTestId(`picker-setup-${bench.camId}`).isChecked()).toBe(true)
    expect(await picker.getByTestId('picker-caption').inputValue()).toBe('')
    await page.screenshot({ path: join(SHOTS, 'editor-picker-1440.png') })
    await picker.getByTestId('picker-insert').click()
    await picker.waitFor({ state: 'hidden' })

    // Opened again for another graph: the previous graph's choices are gone.
    await page.getByTestId('picker-open').click()
    await picker.getByTestId('picker-kind').selectOption('pull-graph')
    expect(await picker.getByTestId(`picker-setup-${bench.baselineId}`).isChecked()).toBe(true)
    expect(await picker.getByTestId('picker-caption').inputValue()).toBe('')
    await picker.getByRole('button', { name: 'Cancel' }).click()

    const body = await page.getByTestId('editor-body').inputValue()
    expect(body).toContain(`::pull-graph{setups="${bench.camId}" caption="The long cam alone"}`)
    expect(body).toContain(`::results-table{setups="${bench.baselineId},${bench.camId}"}`)
    await saveStateIs(page, 'saved')
    // The table in the preview has the baseline's row.
    const table = page.getByTestId('editor-preview').getByTestId('figure-results-table')
    await expect.poll(() => table.locator('tbody tr').count(), { timeout: 15_000 }).toBe(2)
  }, 120_000)

  it('the writer checks the numbers: the wrong figure is quoted and noted beside its paragraph, numbers grouped', async () => {
    const { page } = writer
    await page.getByTestId('editor-number-check-run').click()
    const panel = page.getByTestId('editor-number-check')
    await expect.poll(() => panel.getAttribute('data-flagged'), { timeout: 20_000 }).toBe('1')
    const flag = panel.getByTestId('number-flag')
    expect(await flag.count()).toBe(1)
    expect((await flag.getByTestId('number-flag-quote').textContent())!.replace(/\s+/g, ' ').trim())
      .toBe('“At the peak the long cam gained 108 hp over the stock one.”')
    expect(await flag.textContent()).not.toMatch(/Line \d/)
    // The data's nearest figure as the page prints it: grouped, the unit joined by a no-break space.
    expect(await flag.getByTestId('number-flag-note').textContent()).toMatch(/^The data gives [\d,.]+\u00a0hp \(/)

    // In the preview: the note sits with the paragraph that says 108 hp, and only there.
    const preview = page.getByTestId('editor-preview')
    const noted = preview.locator('[data-number-noted]')
    await expect.poll(() => noted.count(), { timeout: 10_000 }).toBe(1)
    expect(await noted.locator('p').first().textContent()).toContain('gained 108 hp over the stock one')
    expect(await noted.getByTestId('number-note').textContent()).toContain('108 hp')
    await page.screenshot({ path: join(SHOTS, 'editor-number-check-1440.png'), fullPage: true })

    // An rpm figure the data does not give: its note groups thousands ("5,380 rpm", not "5380").
    const editorBody = page.getByTestId('editor-body')
    await editorBody.click()
    await page.keyboard.press('Control+End')
    await page.keyboard.type('\n\nThe long cam made its peak power at 9,990 rpm.')
    await expect.poll(() => page.getByTestId('editor-number-check-stale').count(), { timeout: 10_000 }).toBe(1)
    // The preview follows the text a moment later; then the notes of the old text are gone.
    await expect.poll(() => noted.count(), { timeout: 10_000 }).toBe(0)
    await page.getByTestId('editor-number-check-run').click()
    await expect.poll(() => panel.getAttribute('data-flagged'), { timeout: 20_000 }).toBe('2')
    const rpmNote = (await panel.getByTestId('number-flag-note').nth(1).textContent())!
    expect(rpmNote).toMatch(/^The data gives \d,\d{3}\u00a0rpm \(/)
    await expect.poll(() => noted.count(), { timeout: 10_000 }).toBe(2)

    // A phone: the note stays under its paragraph, inside the screen.
    await page.setViewportSize({ width: 390, height: 900 })
    await page.waitForTimeout(300)
    const box = await noted.first().getByTestId('number-note').boundingBox()
    expect(box!.x + box!.width).toBeLessThanOrEqual(391)
    await page.screenshot({ path: join(SHOTS, 'editor-number-check-390.png'), fullPage: true })
    await page.setViewportSize({ width: 1440, height: 1000 })
  }, 120_000)

  it('the desk: the same notes beside the text, and its pages hydrate without a mismatch', async () => {
    // Editors open any story on the desk, drafts included.
    const editor = await openBrowser({ width: 1280, height: 900 })
    try {
      const warnings = hydrationWarnings(editor.page)
      await signInThroughPage(editor.page, 'editor@example.com', DEMO_PASSWORD)
      for (const path of ['/desk', `/desk/${storyId}`]) {
        await gotoReady(editor.page, path)
        await editor.page.waitForTimeout(500)
      }
      const check = editor.page.getByTestId('number-check')
      await expect.poll(() => check.getAttribute('data-flagged'), { timeout: 20_000 }).toBe('2')
      expect((await check.getByTestId('number-flag-quote').first().textContent())!).toContain('gained')
      await expect.poll(() => editor.page.locator('[data-number-noted]').count(), { timeout: 10_000 }).toBe(2)
      await editor.page.screenshot({ path: join(SHOTS, 'desk-number-check-1280.png'), fullPage: true })
      expect(warnings, 'hydration warnings on the desk pages').toEqual([])
    }
    finally {
      await editor.close()
    }
  }, 120_000)
})
