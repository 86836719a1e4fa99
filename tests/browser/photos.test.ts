import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { gotoReady, openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { closeTestDb, testDb } from '../support/db'
import { DEMO_PASSWORD, signedIn } from '../support/http'
import { createBenchTest, makeJpeg, userId, type Paint } from '../support/photos'

// Noise compresses badly: files of a few MB, so a throttled upload shows its progress.
function noise(seed: number): Paint {
  let s = seed
  return () => {
    s = (s * 1103515245 + 12345) & 0x7FFFFFFF
    return [s & 255, (s >> 8) & 255, (s >> 16) & 255]
  }
}

describe('photo gallery in the browser', () => {
  let browser: BrowserSession
  let benchTestId: number

  beforeAll(async () => {
    const writer = await signedIn('writer@example.com')
    benchTestId = await createBenchTest(await userId(writer), 'Fictional header swap')
    browser = await openBrowser()
  })
  afterAll(async () => {
    await browser?.close()
    await closeTestDb()
  })

  it('uploads two photos with a progress bar each, shows them sized, and keeps a caption', async () => {
    const { page, context } = browser
    await signInThroughPage(page, 'writer@example.com', DEMO_PASSWORD)
    await gotoReady(page, `/bench-tests/${benchTestId}/photos`)
    await page.getByTestId('photo-drop-zone').waitFor()

    // About 1 MB/s up, so each file takes a second or two and its bar moves.
    const cdp = await context.newCDPSession(page)
    await cdp.send('Network.enable')
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 5, downloadThroughput: -1, uploadThroughput: 1024 * 1024 })
    // Every value each bar shows, recorded in the page as it changes.
    await page.evaluate(() => {
      const seen: Record<string, number[]> = {}
      ;(window as unknown as { progressSeen: typeof seen }).progressSeen = seen
      new MutationObserver(() => {
        document.querySelectorAll('[data-testid="photo-upload-progress"]').forEach((bar, i) => {
          const value = Number(bar.getAttribute('aria-valuenow'))
          const list = (seen[i] ??= [])
          if (list.at(-1) !== value) list.push(value)
        })
      }).observe(document.body, { subtree: true, childList: true, attributes: true, attributeFilter: ['aria-valuenow'] })
    })

    const files = [
      { name: 'block-on-stand.jpg', mimeType: 'image/jpeg', buffer: await makeJpeg(1100, 800, noise(1)) },
      { name: 'headers-installed.jpg', mimeType: 'image/jpeg', buffer: await makeJpeg(1100, 800, noise(2)) },
    ]
    expect(files.every(f => f.buffer.length > 1_000_000)).toBe(true)
    await page.getByTestId('photo-file-input').setInputFiles(files)

    const rows = page.getByTestId('photo-upload-row')
    await expect.poll(() => rows.count()).toBe(2)
    await expect.poll(() => page.locator('[data-testid="photo-upload-row"][data-state="stored"]').count(), { timeout: 30_000 }).toBe(2)
    for (const bar of await page.getByTestId('photo-upload-progress').all()) expect(await bar.getAttribute('aria-valuenow')).toBe('100')
    const seen = await page.evaluate(() => (window as unknown as { progressSeen: Record<string, number[]> }).progressSeen)
    for (const key of ['0', '1']) {
      expect(seen[key]!.some(v => v > 0 && v < 100), `bar ${key} showed ${seen[key]}`).toBe(true)
      expect(seen[key]!.at(-1)).toBe(100)
    }
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 })

    // Processing shows live: the cards turn ready without a reload.
    const cards = page.getByTestId('photo-card')
    await expect.poll(() => cards.count()).toBe(2)
    await expect.poll(() => page.locator('[data-testid="photo-card"][data-status="ready"]').count(), { timeout: 60_000 }).toBe(2)
    // The upload list follows as well, instead of saying "being made" for ever (issue 15 item 7).
    await expect.poll(() => page.locator('[data-testid="photo-upload-row"][data-sizes="ready"]').count(), { timeout: 10_000 }).toBe(2)
    expect(await page.getByTestId('photo-upload-message').first().textContent()).toContain('web sizes are ready')
    const first = cards.first()
    const firstId = Number(await first.getAttribute('data-photo-id'))
    const srcset = await first.getByTestId('photo-image').getAttribute('srcset')
    expect(srcset).toMatch(/\/photos\/\d+\/480\?v=\w+ 480w, \/photos\/\d+\/960\?v=\w+ 960w, \/photos\/\d+\/1100\?v=\w+ 1100w/)
    expect(await first.getByTestId('photo-image').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true)

    await first.getByTestId('photo-caption').fill('The short-block on its stand before the headers went on.')
    await first.getByTestId('photo-credit').fill('Fictional Speed Shop')
    await first.getByTestId('photo-save').click()
    await expect.poll(() => first.getByTestId('photo-saved').textContent()).toBe('Saved.')

    await page.reload()
    await page.getByTestId('photo-card').first().waitFor()
    expect(await page.getByTestId('photo-caption').first().inputValue()).toBe('The short-block on its stand before the headers went on.')
    const row = await testDb()('photos').where({ id: firstId, bench_test_id: benchTestId }).first()
    expect(row).toMatchObject({ caption: 'The short-block on its stand before the headers went on.', credit: 'Fictional Speed Shop' })
  }, 150_000) // its own waits add up to 100 s (upload 30, sizing 60, list 10): the project's 60 s would cut them short on a loaded machine
})
