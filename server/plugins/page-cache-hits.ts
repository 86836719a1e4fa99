// Page-cache hits answered before anything else runs. An anonymous reader's cached
// page is bytes already made, in every encoding (server/utils/page-cache.ts), so a
// hit needs none of h3's machinery: no request hooks, no route rules, no middleware
// chain, no response hooks, each of them a few promises. This wraps the app's one
// request handler (the one Nitro's HTTP server and its internal fetches call) and
// answers a hit from the in-process store with one writeHead of headers prepared
// once per page and encoding, and one end() of the stored bytes.
//
// It answers exactly what the middleware path answers (tests/api/*cache*, *delivery*):
// the base security headers, the kept headers, ETag, Vary and a 304 for a current
// copy. Everything else (a miss, a signed-in reader, any other method or address,
// the shared Redis store, whose reads are asynchronous) goes on through the app as
// before: server/middleware/05.page-cache.ts serves Redis hits and marks misses.
import type { IncomingMessage, ServerResponse } from 'node:http'
import type { H3Event } from 'h3'
import { baseSecurityHeaders } from '../utils/csp'
import type { Encoding } from '../utils/compression'

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

/** True when the request was answered from the page cache. */
export function answerPageCacheHit(req: IncomingMessage, res: ServerResponse): boolean {
  const method = req.method
  if (method !== 'GET' && method !== 'HEAD') return false
  // Nitro's requests to itself (a $fetch inside a render) carry stand-ins for req and
  // res that take no list of raw headers: they go the long way, through the middleware.
  if ('__unenv__' in req) return false
  const store = usePageStore()
  if (!(store instanceof MemoryPageStore) || store.size === 0) return false
  const target = pageCacheKeyFor(method, req.url ?? '/', req.headers.cookie ?? '')
  if (!target) return false
  const page = store.peek(target.key)
  if (!page || page.status !== 200) return false
  let ready = prepared.get(page)
  if (!ready) {
    ready = prepare(page, target.key.slice(0, target.key.indexOf('?')))
    prepared.set(page, ready)
  }
  if (etagMatches(req.headers['if-none-match'], page.etag)) {
    res.writeHead(304, ready.notModified)
    res.end()
    return true
  }
  const encoding = encodingFor(req.headers['accept-encoding'] as string | undefined)
  const variant: Variant = encoding && ready.ok[encoding] ? encoding : 'identity'
  res.writeHead(200, ready.ok[variant]!)
  res.end(variant === 'identity' ? page.identity : page.encoded[variant])
  return true
}

export default defineNitroPlugin((nitroApp) => {
  // PAGE_CACHE_EARLY_HITS=off leaves hits to the middleware, for measuring what this saves
  // (docs/bench/reader.md); the answers are the same either way.
  if (process.env.PAGE_CACHE_EARLY_HITS === 'off') return
  const app = nitroApp.h3App
  const next = app.handler
  const handler = ((event: H3Event) => {
    if (answerPageCacheHit(event.node.req, event.node.res)) return Promise.resolve()
    return next(event)
  }) as typeof next
  // h3 keeps its resolver on the handler (used for route lookups): keep it on the wrapper.
  Object.assign(handler, next)
  app.handler = handler
})
