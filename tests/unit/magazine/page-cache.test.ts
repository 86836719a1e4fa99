// What the page cache may keep: anonymous GETs of the reader's own routes only,
// keyed with a normalised query; invalidation drops one story and every list.
import { describe, expect, it } from 'vitest'
import { cachedPage, invalidateStoryCache, pageCacheKeyFor, storePage } from '../../../server/utils/page-cache'

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

describe('storePage and invalidateStoryCache', () => {
  it('keeps 200s only, and drops the story and the lists but not other stories', () => {
    storePage('/stories/a?', 'a', 200, { 'content-type': 'text/html' }, '<p>a</p>')
    storePage('/stories/b?', 'b', 200, { 'content-type': 'text/html' }, '<p>b</p>')
    storePage('/?', null, 200, { 'content-type': 'text/html' }, '<p>home</p>')
    storePage('/stories/c?', 'c', 404, {}, 'gone')
    expect(cachedPage('/stories/a?')?.body.toString()).toBe('<p>a</p>')
    expect(cachedPage('/stories/a?')?.headers).toEqual({ 'content-type': 'text/html' })
    expect(cachedPage('/stories/c?')).toBeUndefined()
    invalidateStoryCache('a')
    expect(cachedPage('/stories/a?')).toBeUndefined()
    expect(cachedPage('/?')).toBeUndefined()
    expect(cachedPage('/stories/b?')).toBeDefined()
    invalidateStoryCache()
    expect(cachedPage('/stories/b?')).toBeUndefined()
  })

  it('forgets an entry after its lifetime', () => {
    storePage('/stories/old?', 'old', 200, {}, 'x')
    expect(cachedPage('/stories/old?', Date.now() + 11 * 60 * 1000)).toBeUndefined()
  })
})
