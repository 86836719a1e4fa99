// Page-cache hits answered before anything else runs. An anonymous reader's cached
// page is bytes already made, in every encoding (server/utils/page-cache.ts), so a
// hit needs none of Nitro's or h3's machinery: no H3Event, no request hooks, no route
// rules, no middleware chain, no response hooks, each of them objects and promises.
// The server's entry (server/node-server.ts) calls this from Node's own 'request'
// listener and hands everything it does not answer to Nitro's listener: it answers a
// hit from the in-process store with one writeHead of headers prepared once per page
// and encoding, and one end() of the stored bytes.
//
// It answers exactly what the middleware path answers (tests/api/*cache*, *delivery*,
// headers): the base security headers, the kept headers, ETag, Vary and a 304 for a
// current copy. Everything else (a miss, a signed-in reader, any other method or
// address, the shared Redis store, whose reads are asynchronous) goes on through the
// app as before: server/middleware/05.page-cache.ts serves Redis hits and marks misses,
// and serves the in-process hits too where this entry is not used (`nuxi dev`) or
// PAGE_CACHE_EARLY_HITS=off.
import type { IncomingMessage, ServerResponse } from 'node:http'
import { baseSecurityHeaders } from './csp'
import { chooseEncoding, type Encoding } from './compression'
import { etagMatches, hasSession, MemoryPageStore, pageCacheKeyFor, PUBLIC_CACHE_CONTROL, usePageStore, type CachedPage } from './page-cache'

type Variant = Encoding | 'identity'
interface Prepared {
  /** Flat [name, value, ...] lists for writeHead, per variant sent. */
  ok: Partial<Record<Variant, string[]>>
  notModified: string[]
}

const prepared = new WeakMap<CachedPage, Prepared>()

function prepare(page: CachedPage, pathname: string): Prepared {
  const common: Record<string, string> = {
    ...baseSecurityHeaders(pathname),
    'X-Page-Cache': 'hit',
    'ETag': page.etag,
    'Vary': 'Accept-Encoding',
    'Cache-Control': page.headers['cache-control'] ?? PUBLIC_CACHE_CONTROL,
  }
  const flat = (headers: Record<string, string>) => Object.entries(headers).flat()
  const kept = Object.fromEntries(Object.entries(page.headers).filter(([name]) => name !== 'cache-control'))
  const ok: Prepared['ok'] = {}
  for (const variant of ['br', 'gzip', 'identity'] as const) {
    const body = variant === 'identity' ? page.identity : page.encoded[variant]
    if (!body) continue
    ok[variant] = flat({ ...common, ...kept, ...(variant === 'identity' ? {} : { 'Content-Encoding': variant }), 'Content-Length': String(body.byteLength) })
  }
  return { ok, notModified: flat(common) }
}

// Browsers word Accept-Encoding a handful of ways: each wording is parsed once.
const encodings = new Map<string, Encoding | null>()
function encodingFor(header: string | undefined): Encoding | null {
  if (!header) return null
  let encoding = encodings.get(header)
  if (encoding === undefined) {
    encoding = chooseEncoding(header)
    if (encodings.size < 256) encodings.set(header, encoding)
  }
  return encoding
}

// Readers ask for a few addresses many times: each address's key is worked out once
// (pageCacheKeyFor parses the URL, tries the eligible patterns and sorts the query),
// for addresses of ordinary length, in a bounded map that starts again when full.
const keys = new Map<string, string | null>()
const MEMO_URL_CHARS = 512
function keyFor(url: string): string | null {
  let key = keys.get(url)
  if (key === undefined) {
    key = pageCacheKeyFor('GET', url, '')?.key ?? null
    if (url.length > MEMO_URL_CHARS) return key
    if (keys.size >= 1024) keys.clear()
    keys.set(url, key)
  }
  return key
}

/** True when the request was answered from the page cache. */
export function answerPageCacheHit(req: IncomingMessage, res: ServerResponse): boolean {
  const method = req.method
  if (method !== 'GET' && method !== 'HEAD') return false
  const store = usePageStore()
  if (!(store instanceof MemoryPageStore) || store.size === 0) return false
  const headers = req.headers
  if (headers.cookie && hasSession(headers.cookie)) return false
  const key = keyFor(req.url ?? '/')
  if (!key) return false
  const page = store.peek(key)
  if (!page || page.status !== 200) return false
  let ready = prepared.get(page)
  if (!ready) {
    ready = prepare(page, key.slice(0, key.indexOf('?')))
    prepared.set(page, ready)
  }
  if (etagMatches(headers['if-none-match'], page.etag)) {
    res.writeHead(304, ready.notModified)
    res.end()
    return true
  }
  const encoding = encodingFor(headers['accept-encoding'])
  const variant: Variant = encoding && ready.ok[encoding] ? encoding : 'identity'
  res.writeHead(200, ready.ok[variant]!)
  res.end(variant === 'identity' ? page.identity : page.encoded[variant])
  return true
}
