import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { contentSecurityPolicy, inlineScriptBodies } from '../../../server/utils/csp'

// Source: W3C Content Security Policy Level 3, hash-source (published): the hash is
// base64 of the SHA-256 of the script element's text, exactly as written.
describe('inline script hashes', () => {
  const html = `<html><head>
    <script type="module" src="/_nuxt/entry.js"></script>
    <script>window.__NUXT__={};window.__NUXT__.config={public:{}}</script>
    <script type="application/json" id="__NUXT_DATA__">[{"a":1}]</script>
    <script type="application/ld+json">{"@type":"Article"}</script>
  </head></html>`

  it('keeps only scripts a browser would run', () => {
    expect(inlineScriptBodies(html)).toEqual(['window.__NUXT__={};window.__NUXT__.config={public:{}}'])
  })

  it('takes every script in order, upper-case tags and empty ones included, up to its own end tag', () => {
    const page = `<SCRIPT>first()</SCRIPT><script type="application/json">{"s":"</scr"}</script>`
      + `<script></script><script type="text/javascript">\nsecond()\n</script>`
    expect(inlineScriptBodies(page)).toEqual(['first()', '\nsecond()\n'])
    // An unterminated script is not one a browser would run as written: nothing after it.
    expect(inlineScriptBodies('<script>a()</script><script>b()')).toEqual(['a()'])
  })

  it('names each hash in script-src and forbids framing and plugins', () => {
    const hash = createHash('sha256').update('alert(1)').digest('base64')
    const csp = contentSecurityPolicy([hash])
    expect(csp).toContain(`script-src 'self' 'sha256-${hash}'`)
    expect(csp).toContain(`frame-ancestors 'none'`)
    expect(csp).toContain(`object-src 'none'`)
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/)
  })
})

describe('image origins', () => {
  it('adds photo storage origins to img-src only', () => {
    const csp = contentSecurityPolicy([], ['http://127.0.0.1:4569'])
    expect(csp).toContain(`img-src 'self' data: blob: http://127.0.0.1:4569`)
    expect(csp).toContain(`connect-src 'self';`)
  })
})
