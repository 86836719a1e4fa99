// The reader's article is rendered once per edition and its HTML reused
// (app/components/story/StoryArticleKept.ts): a page built from the kept article must be
// byte for byte the page a full render makes, HTML and payload (the parsed body, the
// useId numbering in and after the article, the preload links of the figures' modules).
// Two app servers on the test database, both started after the story is published so
// both read its edition from the database alike: one keeps articles, one renders every
// page in full (PULLSHEET_KEPT_ARTICLES=off). Nothing in these pages is per request (no
// nonce, no CSRF token), so the whole answer is compared, with one allowance: the order
// of the modulepreload hints. Async components (the signed-in header's lazy parts) register
// their modules as they resolve, and a kept article, pushed at once, lets them resolve in
// another order than a full render does (seen in CI). The order of preload hints means
// nothing to a browser; the set of them must be the same, and everything else byte for byte.
import type { ChildProcess } from 'node:child_process'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp } from '../../scripts/lib/app'
import { localEnv } from '../../scripts/lib/env'
import { killGroup } from '../../scripts/lib/proc'
import { Client, signedIn, spareAppPort, testServerExtra } from '../support/http'
import { publishedFullStory } from '../support/stories'
import { DEMO, expectOk } from '../support/workspace'

const KEEPING = `http://127.0.0.1:${spareAppPort(9)}`
const FRESH = `http://127.0.0.1:${spareAppPort(10)}`
const servers: ChildProcess[] = []
let slug = ''
let headline = ''

beforeAll(async () => {
  // Every kind of thing the article's render leaves behind (ids, the parsed body, modules).
  const story = await publishedFullStory(await signedIn(DEMO.editor))
  slug = story.slug
  headline = story.headline
  servers.push(...await Promise.all([
    startApp(localEnv('test'), testServerExtra(), spareAppPort(9)),
    startApp(localEnv('test'), { ...testServerExtra(), PULLSHEET_KEPT_ARTICLES: 'off' }, spareAppPort(10)),
  ]))
}, 120_000)

afterAll(async () => {
  for (const server of servers) await killGroup(server)
})

const PRELOAD = /<link rel="modulepreload"[^>]*>/g

/** The page with its modulepreload hints in sorted order, each in the place of one of them. */
function withSortedPreloads(html: string): string {
  const sorted = (html.match(PRELOAD) ?? []).sort()
  let next = 0
  return html.replace(PRELOAD, () => sorted[next++]!)
}

async function pageText(base: string, cookie = ''): Promise<string> {
  const res = await fetch(`${base}/stories/${slug}`, { headers: { accept: 'text/html', ...(cookie ? { cookie } : {}) } })
  expect(res.status).toBe(200)
  const html = await res.text()
  expect(html.match(PRELOAD)?.length, 'preload hints').toBeGreaterThan(0)
  return withSortedPreloads(html)
}

const articleCounts = async (admin: Client) => {
  admin = Object.assign(new Client(KEEPING), { cookie: admin.cookie })
  const counts = expectOk(await admin.get('/api/admin/runtime')).keptRenders.StoryArticleKept as { rendered: number, reused: number } | undefined
  return counts ?? { rendered: 0, reused: 0 }
}

describe('the kept article of a story page', () => {
  it('gives a signed-in reader, from the second render on, the bytes a full render gives', async () => {
    const admin = await signedIn(DEMO.admin)
    const reader = await signedIn(DEMO.reader)
    const before = await articleCounts(admin)
    const first = await pageText(KEEPING, reader.cookie)
    const second = await pageText(KEEPING, reader.cookie)
    const third = await pageText(KEEPING, reader.cookie)
    const after = await articleCounts(admin)
    const full = await pageText(FRESH, reader.cookie)

    expect(after.rendered - before.rendered, 'the first render makes the article').toBe(1)
    expect(after.reused - before.reused, 'the second and third reuse it').toBe(2)
    expect(full).toContain(headline)
    expect(full.split('data-testid="story-article"').length - 1, 'one article on the page').toBe(1)
    expect(full).toContain('data-figure-svg') // the graphs are drawn
    expect(full).toContain('story-body:reader-story-') // the parsed body in the payload
    expect(second).toBe(full)
    expect(third).toBe(full)
    expect(first).toBe(full)
  })

  it('gives anonymous readers the bytes a full render gives', async () => {
    const kept = await pageText(KEEPING)
    const full = await pageText(FRESH)
    expect(kept.split('data-testid="story-article"').length - 1).toBe(1)
    expect(kept).toBe(full)
  })
})
