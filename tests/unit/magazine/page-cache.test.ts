// What the page cache may keep: anonymous GETs of the reader's own routes only,
// keyed with a normalised query; invalidation drops one story and every list.
import { describe, expect, it } from 'vitest'
import { type CachedPage, MemoryPageStore, etagMatches, etagOf, pageCacheKeyFor, storyIdOfWrite, writeReachesReaders } from '../../../server/utils/page-cache'
import { packPage, unpackPage } from '../../../server/utils/page-cache-redis'

describe('pageCacheKeyFor', () => {
  it.each([
    ['/', '/?'],
    ['/stories/cam-swap', '/stories/cam-swap?'],
    ['/stories/cam-swap?b=2&a=1', '/stories/cam-swap?a=1&b=2'],
    ['/browse/engine/pushrod-v8?page=2', '/browse/engine/pushrod-v8?page=2'],
    ['/feed.xml', '/feed.xml?'],
    ['/api/magazine/stories/cam-swap/data.csv', '/api/magazine/stories/cam-swap/data.csv?'],
  ])('keeps an anonymous GET of %s', (path, key) => {
    expect(pageCacheKeyFor('GET', path, '')?.key).toBe(key)
  })

  it('names the story a key is about', () => {
    expect(pageCacheKeyFor('GET', '/api/magazine/stories/cam-swap/analysis?units=kw-nm', '')?.slug).toBe('cam-swap')
    expect(pageCacheKeyFor('GET', '/browse/part/camshaft', '')?.slug).toBeNull()
  })

  it.each([
    ['POST', '/stories/cam-swap', ''],
    ['GET', '/stories/cam-swap', 'theme=dark; pullsheet-session=Fe26.2**abc'],
    ['GET', '/preview/abcdef', ''],
    ['GET', '/desk', ''],
    ['GET', '/api/stories/12', ''],
    ['GET', '/api/preferences', ''],
    ['GET', '/_nuxt/entry.js', ''],
  ])('never keeps %s %s (cookie "%s")', (method, path, cookie) => {
    expect(pageCacheKeyFor(method, path, cookie)).toBeNull()
  })

  it('keeps a request whose session cookie is empty (signed out)', () => {
    expect(pageCacheKeyFor('GET', '/stories/x', 'pullsheet-session=')).not.toBeNull()
  })
})

const page = (slug: string | null, body: string, storedAt = Date.now()): CachedPage => ({
  status: 200, headers: { 'content-type': 'text/html' }, etag: etagOf(Buffer.from(body)), storedAt, slug, identity: Buffer.from(body), encoded: {},
})

describe('MemoryPageStore', () => {
  it('drops the story and the lists but not other stories', async () => {
    const store = new MemoryPageStore()
    await store.set('/stories/a?', page('a', '<p>a</p>'))
    await store.set('/stories/b?', page('b', '<p>b</p>'))
    await store.set('/?', page(null, '<p>home</p>'))
    expect(store.peek('/stories/a?')?.identity.toString()).toBe('<p>a</p>')
    await store.drop('a')
    expect(store.peek('/stories/a?')).toBeUndefined()
    expect(store.peek('/?')).toBeUndefined()
    expect(store.peek('/stories/b?')).toBeDefined()
    await store.drop()
    expect(store.size).toBe(0)
  })

  it('forgets an entry after its lifetime', async () => {
    const store = new MemoryPageStore()
    await store.set('/stories/old?', page('old', 'x'))
    expect(store.peek('/stories/old?', Date.now() + 11 * 60 * 1000)).toBeUndefined()
  })
})

describe('packPage (the shared store\'s value)', () => {
  it('gives back the same head and bodies', () => {
    const original = { ...page('a', '<p>ä</p>'), encoded: { br: Buffer.from([1, 2, 3]), gzip: Buffer.from([4, 5]) } }
    const back = unpackPage(packPage(original))
    expect(back).toEqual(original)
    expect(unpackPage(packPage(page(null, 'plain'))).encoded).toEqual({})
  })
})

describe('ETags', () => {
  it('match a copy of the same bytes, weak or not, and not other bytes', () => {
    const tag = etagOf(Buffer.from('<p>a</p>'))
    expect(tag).toMatch(/^W\/"[\w-]{22}"$/)
    expect(etagMatches(tag, tag)).toBe(true)
    expect(etagMatches(`"x", ${tag.slice(2)}`, tag)).toBe(true)
    expect(etagMatches('*', tag)).toBe(true)
    expect(etagMatches(etagOf(Buffer.from('<p>b</p>')), tag)).toBe(false)
    expect(etagMatches(undefined, tag)).toBe(false)
  })
})

describe('writeReachesReaders: which story writes drop the readers\' cached pages', () => {
  const draft = { state: 'draft', published_edition_id: null }
  const inReview = { state: 'in_review', published_edition_id: null }
  const live = { state: 'published', published_edition_id: 7 }
  const correcting = { state: 'in_review', published_edition_id: 7 }
  const withdrawn = { state: 'withdrawn', published_edition_id: 7 }

  it('leaves them for what no reader can see: a new draft, and a draft\'s saves, notes and locks', () => {
    expect(writeReachesReaders('/api/stories', undefined)).toBe(false)
    for (const path of ['/api/stories/12', '/api/stories/12/notes', '/api/stories/12/lock', '/api/stories/12/preview-links'])
      for (const story of [draft, inReview]) expect(writeReachesReaders(path, story), `${path} ${story.state}`).toBe(false)
  })

  it('drops them for a workflow step, a deleted story, and any write to a story that is or was live', () => {
    expect(writeReachesReaders('/api/stories/12/transitions', draft)).toBe(true)
    expect(writeReachesReaders('/api/stories/12', undefined)).toBe(true)
    for (const story of [live, correcting, withdrawn]) expect(writeReachesReaders('/api/stories/12', story), story.state).toBe(true)
  })

  it('reads the story id from the path only under /api/stories/<id>', () => {
    expect(storyIdOfWrite('/api/stories/42/notes?x=1')).toBe(42)
    expect(storyIdOfWrite('/api/stories')).toBeNull()
    expect(storyIdOfWrite('/api/stories/abc')).toBeNull()
  })
})
