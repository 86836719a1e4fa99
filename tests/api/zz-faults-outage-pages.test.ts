// Issue 14 item 5: a page rendered while the database is away is not the page. It
// answers 503 (never 500, never a 200 with nothing in it), says so to caches
// (no-store, Retry-After), and neither the page cache nor a proxy keeps it: once
// the database is back, the same addresses show the stories again at once.
import { afterAll, describe, expect, it } from 'vitest'
import { localEnv } from '../../scripts/lib/env'
import { mariadbAlive, startMariadb, stopMariadb } from '../../scripts/lib/mariadb'
import { Client, signedIn } from '../support/http'
import { closeTestDb } from '../support/db'
import { createStory, publishStory, storyBench, storyBody } from '../support/stories'
import { DEMO, expectOk } from '../support/workspace'

const env = localEnv('test')

afterAll(async () => {
  await startMariadb(env.db)
  await closeTestDb()
})

async function page(path: string) {
  const res = await fetch(new Client().base + path, { headers: { accept: 'text/html' } })
  return { status: res.status, headers: res.headers, html: await res.text() }
}

describe('pages during a database outage', () => {
  it('answer 503, are never kept, and are whole again once the database is back', async () => {
    const editor = await signedIn(DEMO.editor)
    const bench = await storyBench(editor)
    const headline = `Outage drill ${Date.now().toString(36)}`
    const story = await createStory(editor, bench.benchTestId, { headline, body: storyBody(bench), deck: 'Published before the outage.' })
    await publishStory(editor, story.id)

    // Addresses nobody asked for yet, so nothing good is in the cache for them.
    const fresh = `outage-${Date.now().toString(36)}`
    const pages = [`/?${fresh}`, `/stories?${fresh}`, `/stories/${story.slug}?${fresh}`, `/browse/engine/pushrod-v8?${fresh}`]
    const data = [`/api/magazine/home?${fresh}`, `/api/magazine/stories/${story.slug}?${fresh}`]

    await stopMariadb(env.db)
    expect(await mariadbAlive(env.db)).toBe(false)
    try {
      for (const path of pages) {
        for (const attempt of [1, 2]) {
          const res = await page(path)
          expect(res.status, `${path} (${attempt})`).toBe(503)
          expect(res.headers.get('cache-control'), path).toMatch(/no-store/)
          expect(res.headers.get('x-page-cache'), path).not.toBe('hit')
          expect(res.html, path).not.toContain(headline)
        }
      }
      for (const path of data) {
        const res = await new Client().get(path)
        expect(res.status, path).toBe(503)
        expect(res.headers.get('cache-control'), path).toMatch(/no-store/)
      }
    }
    finally {
      await startMariadb(env.db)
    }

    // Back: the very addresses rendered during the outage show the stories.
    await expect.poll(async () => (await page(pages[0]!)).status, { timeout: 20_000 }).toBe(200)
    for (const path of pages) {
      const res = await page(path)
      expect(res.status, path).toBe(200)
      expect(res.headers.get('cache-control'), path).toMatch(/^public/)
      if (path !== pages[3]) expect(res.html, path).toContain(headline)
    }
    for (const path of data) expectOk(await new Client().get(path))
  }, 120_000)
})
