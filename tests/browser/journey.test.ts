// The whole journey through the pages, each person in their own browser: a writer
// sets up a bench test and hands the dyno operator an upload link; the operator
// (no account) drops the pull files; the writer files them from the inbox, adds a
// photo, writes the story with a graph, an inline value and the photo, and sends it;
// an editor leaves a note, approves and schedules it seconds ahead and the
// publishing job puts it live; a reader finds it from the home page, reads the graph
// and downloads the data, which agrees with the pulls; the e-mails are in the catcher.
// Pulls come from shared/dyno's synthetic model (invented data); names are invented.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ANALYSIS_GRID } from '#shared/types/analysis'
import {
  applyCorrection, averagePulls, correctionStandardInfo, hpToKw, lbFtToNm, parsePullCsv, peakOf, reportRound, syntheticPull, valueAt,
  type CorrectionStandard, type PullPoint,
} from '#shared/dyno'
import { STORY_PATHS } from '#shared/types/stories'
import { SITE_TIME_ZONE, toZonedInput } from '#shared/utils/story-time'
import { formatTime } from '#shared/utils/time-text'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { BASE_URL, DEMO_PASSWORD } from '../support/http'
import { caughtMail, waitForMail } from '../support/mail'
import { makeJpeg } from '../support/photos'
import { expectOk, newWriter } from '../support/workspace'
import { csvRows } from '../support/csv'
import { WRITER_PASSWORD, figuresOf, pick, poll, saveStateIs, typeInBody } from './stories-fixtures'

const EDITOR = 'editor@example.com'
const RUN = Date.now().toString(36)
const TITLE = `Header sizes on an invented V8, journey ${RUN}`
const HEADLINE = `Long-tube headers on the bench, journey ${RUN}`
const NOTE = `Say how long the primaries are (${RUN}).`
const APPROVAL = `Good to go, numbers check out (${RUN}).`
// A new bench test corrects to this standard until the writer picks another.
const STANDARD: CorrectionStandard = 'sae-j1349-1990'

// Two setups, two repeat pulls each, as the dyno computer would write them.
const MODEL = { fromRpm: 2500, toRpm: 6500, widthLowRpm: 2200, widthHighRpm: 1800 }
const SETUPS = [
  { label: 'Stock cast manifolds (invented)', model: { peakTorqueLbFt: 420, peakTorqueRpm: 4200 }, seeds: [5101, 5102] },
  { label: 'Long-tube headers (invented)', model: { peakTorqueLbFt: 441, peakTorqueRpm: 4500 }, seeds: [5103, 5104] },
].map((s, i) => ({
  ...s,
  pulls: s.seeds.map((seed, n) => ({ name: `cell3-${i === 0 ? 'stock' : 'headers'}-${n + 1}-${RUN}.csv`, pull: syntheticPull({ ...MODEL, ...s.model, seed }) })),
}))

/**
 * A setup's curve as the story should report it, worked out here from the files the
 * operator sent: each pull corrected with the weather its file states, the repeat
 * pulls averaged on the analysis grid (shared/dyno; brief: peaks of the mean curve).
 */
function expectedCurve(setup: (typeof SETUPS)[number]): PullPoint[] {
  const corrected = setup.pulls.map(({ pull }) => {
    const parsed = parsePullCsv(pull.csv)
    expect(parsed.ok).toBe(true)
    return applyCorrection(parsed.points, STANDARD, pull.weather)
  })
  return averagePulls(corrected, ANALYSIS_GRID.curveStepRpm).points
}

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
const subject = (prefix: string) => new RegExp(`^${escape(prefix)}: ${escape(HEADLINE)}$`)
const figure = (text: string | null) => Number((text ?? '').replace(/[^\d.-]/g, ''))

describe('from the operator\'s upload link to the reader\'s download', () => {
  let writerAccount: Awaited<ReturnType<typeof newWriter>>
  let writer: BrowserSession
  let editor: BrowserSession
  let files = ''
  let benchTestId = 0
  let setupIds: number[] = []
  let uploadUrl = ''
  let photoId = 0
  let storyId = 0
  let slug = ''
  let scheduledAt = ''
  let valueText = ''

  beforeAll(async () => {
    writerAccount = await newWriter('writer')
    writer = await openBrowser({ width: 1440, height: 1000 })
    editor = await openBrowser({ width: 1440, height: 1000 })
    await signInThroughPage(writer.page, writerAccount.email, WRITER_PASSWORD)
    await signInThroughPage(editor.page, EDITOR, DEMO_PASSWORD)
    files = mkdtempSync(join(tmpdir(), 'pullsheet-journey-'))
  })
  afterAll(async () => {
    await writer?.close()
    await editor?.close()
    if (files) rmSync(files, { recursive: true, force: true })
  })

  it('the writer sets up the bench test with a baseline and one change, and makes an upload link', async () => {
    const { page } = writer
    await gotoReady(page, '/bench-tests')
    const form = page.getByTestId('bench-test-create-form')
    await form.getByTestId('bench-test-title').fill(TITLE)
    await form.getByTestId('bench-test-part-type').selectOption('exhaust')
    await page.getByTestId('bench-test-create').click()
    await page.waitForURL(/\/bench-tests\/\d+$/)
    benchTestId = Number(/\/bench-tests\/(\d+)$/.exec(page.url())![1])

    await page.getByTestId('bench-test-nav-setups').click()
    await page.waitForURL(/\/setups$/)
    for (const [i, s] of SETUPS.entries()) {
      await page.getByTestId('setup-label').fill(s.label)
      await page.getByTestId('setup-add').click()
      await page.getByTestId('setup-list').getByTestId('setup-name').nth(i).waitFor()
    }
    expect(await page.getByTestId('setup-list').getByTestId('setup-name').allTextContents()).toEqual(SETUPS.map(s => s.label))
    const detail = await (await page.request.get(`/api/bench-tests/${benchTestId}`)).json() as { setups: { id: number, label: string, isBaseline: boolean }[] }
    setupIds = SETUPS.map(s => detail.setups.find(d => d.label === s.label)!.id)
    expect(detail.setups.find(s => s.isBaseline)?.id).toBe(setupIds[0])

    await gotoReady(page, `/bench-tests/${benchTestId}/inbox`)
    await page.getByTestId('link-label').fill(`Cell 3, ${RUN} (invented)`)
    await page.getByTestId('link-create').click()
    uploadUrl = await page.getByTestId('link-url').inputValue()
    expect(uploadUrl).toMatch(/\/upload\/[^/]+$/)
    await page.getByTestId('link-list').getByText(`Cell 3, ${RUN} (invented)`).waitFor()
  })

  it('the dyno operator, signed in nowhere, drops the pull files on the link\'s page', async () => {
    const paths = SETUPS.flatMap(s => s.pulls).map(({ name, pull }) => {
      const path = join(files, name)
      writeFileSync(path, pull.csv)
      return path
    })
    const operator = await openBrowser()
    try {
      const { page } = operator
      await gotoReady(page, new URL(uploadUrl).pathname)
      expect(await page.getByTestId('user-name').count()).toBe(0)
      expect(await page.getByTestId('upload-title').textContent()).toContain(TITLE)
      const left = figure(await page.getByTestId('upload-files-left').textContent())
      await page.getByTestId('import-file-input').setInputFiles(paths)
      await expect.poll(() => page.getByTestId('upload-sent-received').count(), { timeout: 30_000 }).toBe(paths.length)
      expect(await page.getByTestId('upload-sent-refused').count()).toBe(0)
      for (const p of SETUPS.flatMap(s => s.pulls)) await page.getByTestId('upload-sent-received').filter({ hasText: p.name }).getByText('Received.').waitFor()
      expect(figure(await page.getByTestId('upload-files-left').textContent())).toBe(left - paths.length)
    }
    finally { await operator.close() }
  })

  it('the writer files them from the inbox under their setups', async () => {
    const { page } = writer
    await gotoReady(page, `/bench-tests/${benchTestId}/inbox`)
    for (const [i, s] of SETUPS.entries()) {
      for (const { name } of s.pulls) {
        const card = page.locator('[data-testid^="inbox-file-"]').filter({ hasText: name })
        await card.waitFor()
        expect(await card.textContent()).toContain('passes the check')
        await card.locator('[data-testid^="inbox-select-"]').check()
        await card.locator('[data-testid^="inbox-setup-"]').selectOption(String(setupIds[i]))
      }
    }
    await page.getByTestId('inbox-assign').click()
    await page.getByText('4 files were added as pulls of their setups.').waitFor({ timeout: 20_000 })

    const { pulls } = await (await page.request.get(`/api/bench-tests/${benchTestId}/pulls`)).json() as { pulls: { setupId: number, fileName: string }[] }
    for (const [i, s] of SETUPS.entries()) {
      expect(pulls.filter(p => p.setupId === setupIds[i]).map(p => p.fileName).sort()).toEqual(s.pulls.map(p => p.name).sort())
    }
  })

  it('the writer adds a photo with its caption and alt text', async () => {
    const { page } = writer
    await gotoReady(page, `/bench-tests/${benchTestId}/photos`)
    await page.getByTestId('photo-file-input').setInputFiles({ name: `headers-fitted-${RUN}.jpg`, mimeType: 'image/jpeg', buffer: await makeJpeg(1200, 800) })
    const card = page.locator('[data-testid="photo-card"][data-status="ready"]')
    await card.waitFor({ timeout: 60_000 })
    photoId = Number(await card.getAttribute('data-photo-id'))
    await card.getByTestId('photo-caption').fill('The long-tube headers fitted to the invented V8.')
    await card.getByTestId('photo-credit').fill('Invented Test Cell')
    await card.getByTestId('photo-alt').fill('Four long steel primaries curving down from the cylinder head into a collector.')
    await card.getByTestId('photo-save').click()
    await expect.poll(() => card.getByTestId('photo-saved').textContent()).toBe('Saved.')
  })

  it('the writer writes the story with a graph, an inline value and the photo, and sends it to the desk', async () => {
    const { page } = writer
    await gotoReady(page, '/my-stories')
    await page.getByTestId('story-create-bench-test').selectOption(String(benchTestId))
    await page.getByTestId('story-create-headline').fill(HEADLINE)
    await page.getByTestId('story-create-submit').click()
    await page.waitForURL(/\/stories\/\d+\/edit$/)
    storyId = Number(/\/stories\/(\d+)\/edit$/.exec(page.url())![1])

    const [baseline, headers] = setupIds as [number, number]
    await page.getByTestId('editor-deck').fill('Longer primaries, on the dyno. Invented data for the demo.')
    await typeInBody(page, 'We swapped the cast manifolds for long-tube headers.\n\n')
    await pick(page, async (picker) => {
      await picker.getByTestId('picker-kind').selectOption('pull-graph')
      await picker.getByTestId(`picker-setup-${baseline}`).check()
      await picker.getByTestId(`picker-setup-${headers}`).check()
    })
    await typeInBody(page, 'At the peak the headers gained ')
    await pick(page, async (picker) => {
      await picker.getByTestId('picker-kind').selectOption('value')
      await picker.getByTestId('picker-value-of').selectOption('peak-power-gain')
      await picker.getByTestId('picker-value-setup').selectOption(String(headers))
    })
    await typeInBody(page, '.\n\n')
    await pick(page, async (picker) => {
      await picker.getByTestId('picker-kind').selectOption('photo')
      await picker.getByTestId('picker-photo').selectOption(String(photoId))
    })
    const body = await page.getByTestId('editor-body').inputValue()
    expect(body).toContain(`::pull-graph{setups="${baseline},${headers}"}`)
    expect(body).toContain(`:figure-value{of="peak-power-gain" setup=${headers}}`)
    expect(body).toContain(`::photo{id=${photoId}}`)
    await saveStateIs(page, 'saved')

    // The value reads as the headers' peak minus the baseline's, to the whole hp,
    // unless the difference is within the pulls' repeatability (brief).
    const rows = (await figuresOf(writerAccount.client, storyId)).analysis!.table.rows
    const row = (id: number) => rows.find(r => r.setupId === id)!
    valueText = row(headers).vsBaseline!.withinRepeatability.peakPower
      ? 'within repeatability'
      : `${reportRound(row(headers).peakPower.value - row(baseline).peakPower.value, 0)} hp`
    const preview = page.getByTestId('editor-preview')
    await expect.poll(() => preview.getByTestId('figure-value').textContent(), { timeout: 10_000 }).toBe(valueText)
    await preview.getByTestId('figure-graph').waitFor()
    await preview.getByTestId('figure-photo').waitFor()
    expect(await preview.getByTestId('figure-photo').textContent()).toContain('The long-tube headers fitted')

    await page.getByTestId('action-submit').click()
    await page.getByTestId('action-confirm').click()
    await page.locator('[data-testid="story-state"][data-state="in_review"]').waitFor()
    await page.getByTestId('editor-readonly').waitFor()
  })

  it('the editor leaves a note, approves and schedules it seconds ahead, and it goes live', async () => {
    const { page } = editor
    await gotoReady(page, '/desk')
    await page.locator(`[data-testid="desk-queue-row"][data-story-id="${storyId}"]`).waitFor()
    await page.getByTestId(`desk-open-${storyId}`).click()
    await page.waitForURL(new RegExp(`/desk/${storyId}$`))
    await page.getByTestId('story-article').waitFor()

    await page.getByTestId('note-form-anchor').fill('the headers gained')
    await page.getByTestId('note-form-body').fill(NOTE)
    await page.getByTestId('note-form-submit').click()
    await page.getByTestId('note-thread').filter({ hasText: NOTE }).waitFor()

    // Approval needs the number check seen for the version being approved.
    await page.reload()
    await page.getByTestId('number-check').getByTestId('number-check-summary').waitFor()
    await expect.poll(async () => {
      const s = (await writerAccount.client.get(`/api/stories/${storyId}`)).body.story
      return s.numberCheckSeenVersion === s.version
    }, { timeout: 15_000 }).toBe(true)
    await page.getByTestId('action-approve').click()
    await page.getByTestId('action-note').fill(APPROVAL)
    await page.getByTestId('action-confirm').click()
    await page.locator('[data-testid="story-state"][data-state="approved"]').waitFor()

    await page.getByTestId('action-schedule').click()
    const at = new Date(Math.ceil((Date.now() + 12_000) / 1000) * 1000)
    scheduledAt = at.toISOString()
    await page.getByTestId('schedule-zone-site').check()
    await page.getByTestId('schedule-local').fill(toZonedInput(scheduledAt, SITE_TIME_ZONE, true))
    await page.getByTestId('action-confirm').click()
    await page.locator('[data-testid="story-state"][data-state="scheduled"]').waitFor()
    const story = expectOk(await writerAccount.client.get(`/api/stories/${storyId}`)).story
    expect(story.scheduledAt).toBe(scheduledAt)
    slug = story.slug

    // Not there for readers before its time; there once the publishing job has run.
    expect((await fetch(`${BASE_URL}/stories/${slug}`)).status).toBe(404)
    const liveAt = await poll('the story page going live', async () => {
      const res = await fetch(`${BASE_URL}/stories/${slug}`)
      return res.status === 200 ? Date.now() : undefined
    }, 60_000)
    expect(liveAt).toBeGreaterThanOrEqual(at.getTime() - 1000)
    const published = expectOk(await writerAccount.client.get(`/api/stories/${storyId}`)).story
    expect(published.state).toBe('published')
  })

  it('a reader finds it from the home page, reads the graph, and downloads data that agrees with the pulls', async () => {
    // The home page's cache lets go of the old list within a few seconds of a change.
    await poll('the story on the home page', async () => {
      const html = await (await fetch(`${BASE_URL}/`)).text()
      return html.includes(`data-testid="story-card-${slug}"`) ? true : undefined
    }, 30_000)
    const reader = await openBrowser()
    try {
      const { page } = reader
      await gotoReady(page, '/')
      const card = page.getByTestId(`story-card-${slug}`).first()
      await card.getByRole('link', { name: HEADLINE }).click()
      await page.waitForURL(new RegExp(`/stories/${slug}$`))
      expect(await page.getByTestId('story-headline').textContent()).toContain(HEADLINE)
      expect(await page.getByTestId('figure-value').first().textContent()).toBe(valueText)
      const photo = page.getByTestId('figure-photo')
      await photo.scrollIntoViewIfNeeded()
      await expect.poll(() => photo.locator('img').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0), { timeout: 15_000 }).toBe(true)

      const curves = SETUPS.map(expectedCurve)
      const graph = page.getByTestId('figure-graph').first()
      await graph.scrollIntoViewIfNeeded()
      await page.locator('[data-testid="figure-graph"][data-live="true"]').first().waitFor({ timeout: 20_000 })

      // Hovering the left of the graph moves the readout down the rev range.
      const at = graph.getByTestId('figure-readout-at')
      const rpmOf = async () => figure(await at.textContent())
      const middle = await rpmOf()
      const box = (await graph.getByTestId('figure-live').boundingBox())!
      await page.mouse.move(box.x + box.width * 0.3, box.y + box.height * 0.5, { steps: 4 })
      await expect.poll(rpmOf, { timeout: 5000 }).toBeLessThan(middle)
      const rows = graph.getByTestId('figure-readout-row')
      await expect.poll(() => rows.count()).toBe(2)

      // The graph in kW: each setup's readout is its mean curve at that rpm (within 1 %:
      // the curve drawn is thinned for display).
      await page.getByTestId('story-data').getByTestId('units-switch').selectOption('kw-nm')
      await expect.poll(() => rows.first().getByTestId('figure-readout-power').textContent()).toMatch(/ kW$/)
      const rpm = await rpmOf()
      for (const [i, id] of setupIds.entries()) {
        const shown = figure(await graph.locator(`[data-testid="figure-readout-row"][data-setup-id="${id}"]`).getByTestId('figure-readout-power').textContent())
        const want = hpToKw(valueAt(curves[i]!, rpm, 'powerHp')!)
        expect(Math.abs(shown - want) / want, `setup ${id} at ${rpm} rpm: ${shown} kW shown, ${want} kW computed`).toBeLessThan(0.01)
      }

      // Toggling the headers off leaves the baseline alone in the readout.
      await graph.getByTestId(`figure-toggle-${setupIds[1]}`).uncheck()
      await expect.poll(() => rows.count()).toBe(1)
      expect(await rows.first().getAttribute('data-setup-id')).toBe(String(setupIds[0]))
      await graph.getByTestId(`figure-toggle-${setupIds[1]}`).check()
      await expect.poll(() => rows.count()).toBe(2)

      // The data in kW and N-m, downloaded: the peaks are those of the pulls' mean curves.
      const data = page.getByTestId('story-data')
      await data.getByTestId('units-switch').selectOption('kw-nm')
      await expect.poll(() => data.getByTestId('story-results').getAttribute('data-units')).toBe('kw-nm')
      const [download] = await Promise.all([page.waitForEvent('download'), data.getByTestId('download-data').click()])
      expect(download.suggestedFilename()).toBe(`${slug}-data.csv`)
      // The download holds the edition's pulls and curves first; the results table follows its title row.
      const lines = csvRows(readFileSync((await download.path())!, 'utf8')).filter(r => r.some(c => c !== ''))
      const results = lines.findIndex(r => r[0] === 'Results')
      expect(results, 'a "Results" section in the download').toBeGreaterThan(0)
      const [header, ...body] = lines.slice(results + 1)
      const col = (name: string) => {
        const i = header!.indexOf(name)
        expect(i, `column "${name}" in ${header!.join(' | ')}`).toBeGreaterThanOrEqual(0)
        return i
      }
      expect(body.map(r => r[col('Setup')])).toEqual(SETUPS.map(s => s.label))
      const peaks = curves.map(c => ({ power: peakOf(c, 'powerHp'), torque: peakOf(c, 'torqueLbFt') }))
      for (const [i, r] of body.entries()) {
        const want = peaks[i]!
        expect(r[col('Corrected to')]).toBe(correctionStandardInfo(STANDARD).label)
        // Figures rounded as on the page (peaks whole), half away from zero (brief), written as numbers.
        expect(Number(r[col('Peak power (kW)')])).toBe(reportRound(hpToKw(want.power.value), 0))
        expect(Number(r[col('Peak power at (rpm)')])).toBe(reportRound(want.power.rpm, 0))
        expect(Number(r[col('Peak torque (N-m)')])).toBe(reportRound(lbFtToNm(want.torque.value), 0))
        expect(Number(r[col('Peak torque at (rpm)')])).toBe(reportRound(want.torque.rpm, 0))
      }
      // The headers' gain over the baseline, in kW, from the same mean curves.
      expect(figure(body[1]![col('Peak power gain vs baseline (kW)')]!)).toBeCloseTo(hpToKw(peaks[1]!.power.value - peaks[0]!.power.value), 0)
    }
    finally { await reader.close() }
  })

  it('sent the e-mails of each step to the right people', async () => {
    const writerEmail = writerAccount.email
    const submitted = await waitForMail(EDITOR, subject('Story sent for review'), 30_000)
    expect(submitted.text).toContain(`"${HEADLINE}" from Draft to In review`)
    expect(submitted.text).toContain(STORY_PATHS.deskStory(storyId))

    const note = await waitForMail(writerEmail, new RegExp(`^New note on: ${escape(HEADLINE)}$`), 30_000)
    expect(note.text).toContain(NOTE)
    expect(note.text).toContain(STORY_PATHS.editor(storyId))

    const approved = await waitForMail(writerEmail, subject('Story approved'), 30_000)
    expect(approved.text).toContain(`Note: ${APPROVAL}`)
    const scheduled = await waitForMail(writerEmail, subject('Story scheduled'), 30_000)
    expect(scheduled.text).toContain(`It goes live at ${formatTime(scheduledAt, SITE_TIME_ZONE)}.`)
    const published = await waitForMail(writerEmail, subject('Story published'), 30_000)
    expect(published.text).toContain('The publishing schedule moved')
    // The public page, not the editor (issue 15 item 10).
    expect(published.text).toContain(`Read the published story: `)
    expect(published.text).toContain(STORY_PATHS.public(slug))
    expect(published.text).not.toContain(STORY_PATHS.editor(storyId))

    // Nobody hears of what they did themselves, and the other side's mails stay theirs.
    const about = caughtMail().filter(m => m.subject.endsWith(HEADLINE))
    expect(about.filter(m => m.to.includes(writerEmail)).map(m => m.subject.split(':')[0]).sort())
      .toEqual(['New note on', 'Story approved', 'Story published', 'Story scheduled'])
    expect(about.filter(m => m.to.includes(EDITOR)).map(m => m.subject.split(':')[0])).toEqual(['Story sent for review'])
  })
})
