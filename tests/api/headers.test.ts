import { beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO_PASSWORD, signedIn } from '../support/http'
import { DEMO } from '../support/workspace'
import { createStory, publishStory, storyBench, storyBody } from '../support/stories'

describe('security headers', () => {
  it('pages carry a CSP without unsafe-inline scripts, nosniff, a referrer policy and no framing', async () => {
    const res = await new Client().request('GET', '/', { headers: { accept: 'text/html' } })
    expect(res.status).toBe(200)
    const csp = res.headers.get('content-security-policy') ?? ''
    expect(csp).toContain(`frame-ancestors 'none'`)
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin')
    expect(res.headers.get('x-frame-options')).toBe('DENY')
  })

  it('the session cookie is HttpOnly and SameSite', async () => {
    const res = await new Client().post('/api/auth/login', { email: 'reader@example.com', password: DEMO_PASSWORD })
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('pullsheet-session='))!
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
  })

  it('error answers carry no stack trace', async () => {
    const res = await new Client().get('/api/users/not-a-number')
    expect(res.status).toBeGreaterThanOrEqual(400)
    expect(JSON.stringify(res.body)).not.toMatch(/\bat .+\.(m?js|ts):\d+|node_modules/)
  })
})

describe('cache headers of the reader\'s answers', () => {
  let slug = ''
  beforeAll(async () => {
    const editor = await signedIn(DEMO.editor)
    const bench = await storyBench(editor)
    const story = await createStory(editor, bench.benchTestId, { body: storyBody(bench) })
    await publishStory(editor, story.id)
    slug = story.slug
    // Every app server polls the stories for changes every 2 s and drops its cache on
    // one: let that happen before the pairs of requests below.
    await new Promise(r => setTimeout(r, 2500))
  }, 120_000)

  const paths = () => ['/', `/stories/${slug}`, '/feed.xml', `/api/magazine/stories/${slug}`, `/api/magazine/stories/${slug}/data.csv`, `/api/magazine/stories/${slug}/figures`]

  it('anonymous: public with s-maxage and an ETag; a cache hit answers 304 to If-None-Match', async () => {
    const base = new Client().base
    for (const path of paths()) {
      const first = await fetch(base + path, { headers: { 'accept-encoding': 'br' } })
      expect(first.status, path).toBe(200)
      expect(first.headers.get('cache-control'), path).toMatch(/^public, .*s-maxage=\d+.*stale-while-revalidate=\d+/)
      const etag = first.headers.get('etag')
      expect(etag, path).toBeTruthy()
      await first.arrayBuffer()
      const again = await fetch(base + path, { headers: { 'accept-encoding': 'br', 'if-none-match': etag! } })
      expect(again.status, path).toBe(304)
      expect(again.headers.get('x-page-cache'), path).toBe('hit')
      expect(again.headers.get('etag'), path).toBe(etag)
    }
  })

  // Hits are answered before Nitro and the app's middleware (server/utils/page-cache-hits.ts):
  // they must say exactly what the answer that filled the cache said.
  it('a page-cache hit carries the headers and bytes of the answer that filled the cache, in every encoding and for HEAD', async () => {
    const base = new Client().base
    const SAME = ['content-type', 'content-security-policy', 'cache-control', 'content-disposition', 'x-robots-tag', 'x-content-type-options', 'referrer-policy', 'x-frame-options', 'vary', 'etag', 'content-encoding']
    const pick = (res: Response) => Object.fromEntries(SAME.map(name => [name, res.headers.get(name)]))
    for (const path of [...paths(), `/embed/${slug}/1`]) {
      for (const encoding of ['br', 'gzip', 'identity']) {
        const headers = { 'accept-encoding': encoding }
        // A fresh query string is a fresh cache entry: the first answer fills it.
        const url = `${base}${path}?hit-test=${encoding}`
        const filled = await fetch(url, { headers })
        expect(filled.status, path).toBe(200)
        expect(filled.headers.get('x-page-cache'), path).toBe('miss')
        const filledBody = Buffer.from(await filled.arrayBuffer())
        const hit = await fetch(url, { headers })
        expect(hit.headers.get('x-page-cache'), path).toBe('hit')
        expect(pick(hit), `${path} ${encoding}`).toEqual(pick(filled))
        expect(Buffer.from(await hit.arrayBuffer()).equals(filledBody), `${path} ${encoding}`).toBe(true)
        const head = await fetch(url, { method: 'HEAD', headers })
        expect(head.status, path).toBe(200)
        expect(pick(head), `${path} ${encoding} HEAD`).toEqual(pick(filled))
      }
    }
    // Only the embed page may be framed by other sites, from the cache too.
    const embed = await fetch(`${base}/embed/${slug}/1?hit-test=br`, { headers: { 'accept-encoding': 'br' } })
    expect(embed.headers.get('x-page-cache')).toBe('hit')
    expect(embed.headers.get('x-frame-options')).toBeNull()
    expect((await fetch(`${base}/stories/${slug}?hit-test=br`)).headers.get('x-frame-options')).toBe('DENY')
    // A render's own requests to the app (the home page reads /api/magazine/home, cached
    // by now) are not answered early: they still come back whole.
    const home = await fetch(`${base}/?hit-test=render`, { headers: { 'accept-encoding': 'br' } })
    expect(home.status).toBe(200)
    expect(await home.text()).toMatch(/href="\/stories\/[a-z0-9-]+"/)
  })

  it('signed in: private, no-store, never from the page cache', async () => {
    const reader = await signedIn(DEMO.reader)
    for (const path of paths()) {
      const res = await fetch(reader.base + path, { headers: { cookie: reader.cookie } })
      expect(res.status, path).toBe(200)
      expect(res.headers.get('cache-control'), path).toBe('private, no-store')
      expect(res.headers.get('x-page-cache'), path).toBeNull()
      await res.arrayBuffer()
    }
  })
})
