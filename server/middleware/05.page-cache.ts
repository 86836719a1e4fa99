// Serves anonymous readers from the page cache (server/utils/page-cache.ts); on a
// miss it marks the request so server/plugins/page-cache.ts keeps the answer.
export default defineEventHandler((event) => {
  const target = pageCacheKeyFor(event.method, event.path, getRequestHeader(event, 'cookie') ?? '')
  if (!target) return
  const hit = cachedPage(target.key)
  if (!hit) {
    event.context.pageCache = target
    setResponseHeader(event, 'X-Page-Cache', 'miss')
    return
  }
  setResponseStatus(event, hit.status)
  setResponseHeaders(event, { ...hit.headers, 'X-Page-Cache': 'hit' })
  return hit.body
})

declare module 'h3' {
  interface H3EventContext {
    pageCache?: { key: string, slug: string | null }
  }
}
