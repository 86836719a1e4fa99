import { describe, expect, it } from 'vitest'
import { LruCache } from '../../../shared/utils/lru-cache'
import { slugify } from '../../../server/services/workspace/bench-test-core'
import { cleanFileName, hashToken } from '../../../server/services/workspace/operator-links'
import { isoDay, parseJsonColumn } from '../../../server/utils/rows'

describe('LruCache', () => {
  it('peeks without changing which entry goes first', () => {
    const cache = new LruCache<string>(2)
    cache.set('a', 'first')
    cache.set('b', 'second')
    expect(cache.peek('a')).toBe('first')
    expect(cache.keys()).toEqual(['a', 'b'])
    cache.set('c', 'third')
    // 'a' was only peeked at, so it is still the oldest and is the one dropped.
    expect(cache.keys()).toEqual(['b', 'c'])
    expect(cache.get('b')).toBe('second')
    expect(cache.keys()).toEqual(['c', 'b'])
  })

  it('drops the least recently used entries past its weight', () => {
    const cache = new LruCache<number[]>(5, v => v.length)
    cache.set('a', [1, 2])
    cache.set('b', [1, 2])
    expect(cache.get('a')).toEqual([1, 2])
    cache.set('c', [1, 2])
    expect(cache.get('b')).toBeUndefined()
    expect(cache.get('a')).toEqual([1, 2])
    expect(cache.get('c')).toEqual([1, 2])
    cache.set('huge', [1, 2, 3, 4, 5, 6])
    expect(cache.get('huge')).toBeUndefined()
    expect(cache.size).toBe(2)
  })
})

describe('small helpers', () => {
  it('slugs titles', () => {
    expect(slugify('Long-tube headers on a 6.3 L V8')).toBe('long-tube-headers-on-a-6-3-l-v8')
    expect(slugify('Café   racer!!')).toBe('cafe-racer')
    expect(slugify('***')).toBe('bench-test')
    expect(slugify('x'.repeat(300))).toHaveLength(100)
  })

  it('cleans uploaded file names from any operating system', () => {
    expect(cleanFileName('C:\\dyno\\runs\\pull 1.csv', 'f')).toBe('pull 1.csv')
    expect(cleanFileName('/home/op/pull\u0000.csv', 'f')).toBe('pull.csv')
    expect(cleanFileName('', 'upload-1.csv')).toBe('upload-1.csv')
  })

  it('hashes tokens with SHA-256 (FIPS 180-4 test vector "abc", published)', () => {
    expect(hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad')
  })

  it('reads columns defensively', () => {
    expect(parseJsonColumn('[1]', [])).toEqual([1])
    expect(parseJsonColumn('{bad', 'fallback')).toBe('fallback')
    expect(isoDay(new Date('2026-03-10T00:00:00Z'))).toBe('2026-03-10')
    expect(isoDay('2026-03-10')).toBe('2026-03-10')
  })
})
