// Accept-Encoding as RFC 9110 section 12.5.3 defines it: q-values, q=0 refuses, "*" for the rest.
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { describe, expect, it } from 'vitest'
import { chooseEncoding, compress, compressibleType, withVaryAcceptEncoding } from '../../../server/utils/compression'

describe('chooseEncoding', () => {
  it.each([
    ['gzip, deflate, br, zstd', 'br'],
    ['gzip, deflate', 'gzip'],
    ['br;q=0, gzip;q=0.5', 'gzip'],
    ['*', 'br'],
    ['*;q=0, gzip', 'gzip'],
    ['identity', null],
    ['br;q=0, gzip;q=0', null],
    ['', null],
    [undefined, null],
  ])('%s -> %s', (header, expected) => {
    expect(chooseEncoding(header)).toBe(expected)
  })
})

describe('compress', () => {
  it('round-trips with zlib at both levels', async () => {
    const body = Buffer.from('<p>Peak power 412 hp at 6,300 rpm.</p>'.repeat(200))
    for (const level of ['stored', 'live'] as const) {
      expect(brotliDecompressSync(await compress(body, 'br', level)).equals(body)).toBe(true)
      expect(gunzipSync(await compress(body, 'gzip', level)).equals(body)).toBe(true)
    }
    expect((await compress(body, 'br', 'stored')).byteLength).toBeLessThan(body.byteLength / 20)
  })

  it('takes text types only', () => {
    expect(compressibleType('text/html; charset=utf-8')).toBe(true)
    expect(compressibleType('application/json')).toBe(true)
    expect(compressibleType('text/csv')).toBe(true)
    expect(compressibleType('application/rss+xml')).toBe(true)
    expect(compressibleType('image/jpeg')).toBe(false)
    expect(compressibleType(undefined)).toBe(false)
  })

  it('adds Accept-Encoding to Vary once', () => {
    expect(withVaryAcceptEncoding(undefined)).toBe('Accept-Encoding')
    expect(withVaryAcceptEncoding('Cookie')).toBe('Cookie, Accept-Encoding')
    expect(withVaryAcceptEncoding('accept-encoding')).toBe('accept-encoding')
  })
})
