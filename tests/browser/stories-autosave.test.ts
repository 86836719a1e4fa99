// Nothing typed is lost: autosave while typing, a copy in the browser when the
// network drops a save (offered back on the next visit), a stale save that opens
// the conflict dialog instead of overwriting, revisions compared and restored.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { signedIn } from '../support/http'
import { expectOk } from '../support/workspace'
import { formatTime } from '#shared/utils/time-text'
import { acceptLeaving, benchWithPulls, createStoryFor, saveStateIs, typeInBody, type StoryBench } from './stories-fixtures'

describe('saving a story without losing a word', () => {
  let bench: StoryBench
  let session: BrowserSession
  let storyId = 0
  const story = async () => expectOk(await bench.writer.client.get(`/api/stories/${storyId}`)).story

  beforeAll(async () => {
    bench = await benchWithPulls()
    storyId = (await createStoryFor(bench.writer.client, bench.benchTestId, 'Autosave on the cam test', 'First paragraph.')).id
    session = await openBrowser({ width: 1440, height: 1000 })
    acceptLeaving(session.page)
    await signInThroughPage(session.page, bench.writer.email, bench.writer.password)
  })
  afterAll(async () => { await session?.close() })

  it('autosaves while typing: after a reload the text is there', async () => {
    const { page } = session
    await gotoReady(page, `/stories/${storyId}/edit`)
    await typeInBody(page, '\n\nTyped and never saved by hand.')
    await saveStateIs(page, 'saved')
    expect((await story()).body).toContain('Typed and never saved by hand.')
    await page.reload()
    expect(await page.getByTestId('editor-body').inputValue()).toContain('Typed and never saved by hand.')
  })

  it('keeps a copy in the browser when the network fails, and offers it back', async () => {
    const { page, context } = session
    const block = (route: import('playwright-core').Route) => (route.request().method() === 'PATCH' ? route.abort('internetdisconnected') : route.continue())
    await context.route(`**/api/stories/${storyId}`, block)
    try {
      await typeInBody(page, '\n\nWritten while the network was down.')
      await saveStateIs(page, 'offline')
      expect((await story()).body).not.toContain('Written while the network was down.')
      await page.reload()
      const offer = page.getByTestId('restore-offer')
      await offer.waitFor()
      expect(await offer.textContent()).toContain('never reached the server')
      expect(await page.getByTestId('editor-body').inputValue()).not.toContain('Written while the network was down.')
    }
    finally {
      await context.unroute(`**/api/stories/${storyId}`, block)
    }
    await page.getByTestId('restore-copy').click()
    expect(await page.getByTestId('editor-body').inputValue()).toContain('Written while the network was down.')
    await saveStateIs(page, 'saved')
    expect((await story()).body).toContain('Written while the network was down.')
    await page.reload()
    expect(await page.getByTestId('restore-offer').count()).toBe(0)
  })

  it('stops a stale save and keeps the writer\'s changes over the newer version, and theirs elsewhere', async () => {
    const { page } = session
    await gotoReady(page, `/stories/${storyId}/edit`)
    await page.getByTestId('editor-body').waitFor()
    // Someone else saves meanwhile (another tab, an editor).
    const now = await story()
    expectOk(await bench.writer.client.patch(`/api/stories/${storyId}`, { version: now.version, deck: 'A deck saved elsewhere.' }))
    await typeInBody(page, '\n\nMy paragraph, typed on an old version.')
    const dialog = page.getByTestId('conflict-dialog')
    await dialog.waitFor()
    expect(await dialog.textContent()).toContain('Deck')
    expect(await page.getByTestId('save-state').getAttribute('data-state')).toBe('conflict')
    await page.getByTestId('conflict-keep-mine').click()
    await saveStateIs(page, 'saved')
    const after = await story()
    expect(after.body).toContain('My paragraph, typed on an old version.')
    // The other person's deck was not touched by this writer, so it stays.
    expect(after.deck).toBe('A deck saved elsewhere.')
    expect(await page.getByTestId('editor-deck').inputValue()).toBe('A deck saved elsewhere.')
    expect(after.version).toBeGreaterThan(now.version + 1)
  })

  it('can take theirs instead, after copying mine aside', async () => {
    const { page, context } = session
    await context.grantPermissions(['clipboard-read', 'clipboard-write'])
    const now = await story()
    expectOk(await bench.writer.client.patch(`/api/stories/${storyId}`, { version: now.version, body: 'Their text replaces everything.' }))
    await typeInBody(page, '\n\nA sentence of mine to copy aside.')
    await page.getByTestId('conflict-dialog').waitFor()
    await page.getByTestId('conflict-copy-aside').click()
    await expect.poll(() => page.getByTestId('editor-body').inputValue()).toBe('Their text replaces everything.')
    const clip = await page.evaluate(() => navigator.clipboard.readText())
    expect(clip).toContain('A sentence of mine to copy aside.')
    const aside = await page.evaluate(id => localStorage.getItem(`pullsheet:story-aside:${id}`), storyId)
    expect(aside).toContain('A sentence of mine to copy aside.')
  })

  it('compares two revisions side by side and restores one', async () => {
    const { page } = session
    await page.reload()
    await page.getByTestId('editor-save').click()
    await saveStateIs(page, 'saved')
    const rows = page.getByTestId('revision-row')
    await expect.poll(() => rows.count()).toBeGreaterThan(2)
    // The first explicit save held "First paragraph."; compare it with the newest.
    const newest = Number(await rows.first().getAttribute('data-revision-id'))
    const oldest = Number(await page.locator('[data-testid="revision-row"][data-kind="save"]').last().getAttribute('data-revision-id'))
    await page.getByTestId(`revision-pick-${newest}`).check()
    await page.getByTestId(`revision-pick-${oldest}`).check()
    await page.getByTestId('revisions-compare').click()
    const diff = page.getByTestId('revision-comparison')
    await diff.waitFor()
    expect(await diff.locator('[data-kind="removed"]').first().textContent()).toContain('First paragraph.')
    expect(await diff.locator('[data-kind="added"]').first().textContent()).toContain('Their text replaces everything.')

    await page.getByTestId(`revision-restore-${oldest}`).click()
    await expect.poll(() => page.getByTestId('editor-body').inputValue()).toBe('First paragraph.')
    expect((await story()).body).toBe('First paragraph.')
  })

  it('tells the writer who else has the story open, and since when', async () => {
    const editor = await signedIn('editor@example.com')
    // The writer's own tab still holds it from the steps before: the editor takes it over.
    const lock = expectOk(await editor.post(`/api/stories/${storyId}/lock`, { takeOver: true }))
    expect(lock.heldByMe).toBe(true)
    const { page } = session
    await gotoReady(page, `/stories/${storyId}/edit`)
    const banner = page.getByTestId('lock-banner')
    await banner.waitFor()
    // Times read in the magazine's zone (a site setting an earlier test may have changed).
    const admin = await signedIn('admin@example.com')
    const zone = expectOk(await admin.get<{ settings: { timeZone: string } }>('/api/admin/settings')).settings.timeZone
    const since = formatTime(lock.lock.since, zone)
    expect(await banner.textContent()).toContain(`${lock.lock.displayName} is editing since ${since}`)
    // The lock warns; it never stops a save.
    await typeInBody(page, '\n\nWritten while someone else had it open.')
    await saveStateIs(page, 'saved')
    await editor.delete(`/api/stories/${storyId}/lock`)
  })
})
