// Serves anonymous readers from the page cache (server/utils/page-cache.ts): the
// stored Brotli or gzip variant the reader accepts, or a 304 when the reader's copy
// is current. On a miss it marks the request so server/plugins/page-cache.ts keeps
// the answer. Hits in the in-process store have usually been answered already, before
// any middleware (server/plugins/page-cache-hits.ts); this serves the shared Redis
// store's hits, and the in-process ones when PAGE_CACHE_EARLY_HITS=off.
import type { H3Event } from 'h3'

export default defineEventHandler((event) => {
  const target = pageCacheKeyFor(event.method, event.path, getRequestHeader(event, 'cookie') ?? '')
  if (!target) return
  const store = usePageStore()
  // The default in-process store answers synchronously: a hit skips a microtask turn.
  if (store instanceof MemoryPageStore) return answer(event, target, store.peek(target.key))
  return store.get(target.key, target.slug).then(hit => answer(event, target, hit))
})

function answer(event: H3Event, target: { key: string, slug: string | null }, hit: CachedPage | undefined) {
  if (!hit) {
    event.context.pageCache = target
    setResponseHeader(event, 'X-Page-Cache', 'miss')
    return
  }
  event.context.pageCacheServed = true
  const res = event.node.res
  res.setHeader('X-Page-Cache', 'hit')
  res.setHeader('ETag', hit.etag)
  res.setHeader('Vary', 'Accept-Encoding')
  res.setHeader('Cache-Control', hit.headers['cache-control'] ?? PUBLIC_CACHE_CONTROL)
  if (etagMatches(getRequestHeader(event, 'if-none-match'), hit.etag)) {
    res.statusCode = 304
    res.end()
    return
  }
  res.statusCode = hit.status
  for (const [name, value] of Object.entries(hit.headers)) res.setHeader(name, value)
  const encoding = chooseEncoding(getRequestHeader(event, 'accept-encoding'))
  const encoded = encoding ? hit.encoded[encoding] : undefined
  if (encoding && encoded) res.setHeader('Content-Encoding', encoding)
  // Written here rather than returned: h3 would run the response hooks and wait a
  // setImmediate turn before sending bytes that need nothing more.
  res.end(encoded ?? hit.identity)
}

declare module 'h3' {
  interface H3EventContext {
    pageCache?: { key: string, slug: string | null }
    /** Answered from the page cache: already encoded, nothing more to do. */
    pageCacheServed?: boolean
  }
}
