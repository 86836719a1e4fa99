// Every text answer leaves compressed (Brotli or gzip, as the reader accepts) with
// cache headers that say who may keep it; eligible answers for anonymous readers
// (marked by server/middleware/05.page-cache.ts) are kept with both encodings.
// The cache is dropped when the stories change: a write through the stories API
// drops it before its answer goes out, and polling one small aggregate catches the
// rest (the scheduled publisher, another app server's writes in memory mode).
import type { H3Event } from 'h3'
import redisDriver from 'unstorage/drivers/redis'
import type { Encoding } from '../utils/compression'
import { storyIdOfWrite, writeReachesReaders, type StoryVisibility } from '../utils/page-cache'

// PAGE_CACHE_POLL_MS: tests set it long to show the shared store needs no polling.
const POLL_MS = Number(process.env.PAGE_CACHE_POLL_MS) || 2000

function textBody(body: unknown): string | Buffer | null {
  if (typeof body === 'string' || Buffer.isBuffer(body)) return body
  if (body && typeof body === 'object' && Object.getPrototypeOf(body) === Object.prototype) return JSON.stringify(body)
  if (Array.isArray(body)) return JSON.stringify(body)
  return null
}

const isWrite = (method: string) => method !== 'GET' && method !== 'HEAD' && method !== 'OPTIONS'

async function readersSee(path: string): Promise<boolean> {
  const id = storyIdOfWrite(path)
  if (id === null) return false
  try {
    const story = await useDb()('stories').where('id', id).first('state', 'published_edition_id') as StoryVisibility | undefined
    return writeReachesReaders(path, story)
  }
  catch {
    return true // unsure: drop, as before
  }
}

// The poll's fingerprint covers only stories readers can see (or saw): a writer's
// draft autosaves move MAX(updated_at) of the whole table every second.
const PUBLIC_ROWS = 'state IN (\'published\', \'withdrawn\') OR published_edition_id IS NOT NULL'

async function keepAndSend(event: H3Event, target: { key: string, slug: string | null }, identity: Buffer, encoding: Encoding | null): Promise<Buffer> {
  const res = event.node.res
  const text = compressibleType(String(res.getHeader('content-type') ?? '')) && identity.byteLength >= MIN_COMPRESS_BYTES
  const [br, gzip] = text ? await Promise.all([compress(identity, 'br', 'stored'), compress(identity, 'gzip', 'stored')]) : []
  const page: CachedPage = {
    status: 200,
    headers: keptHeaders(res.getHeaders() as Record<string, unknown>),
    etag: etagOf(identity),
    storedAt: Date.now(),
    slug: target.slug,
    identity,
    encoded: br && gzip ? { br, gzip } : {},
  }
  await usePageStore().set(target.key, page)
  res.setHeader('ETag', page.etag)
  if (etagMatches(getRequestHeader(event, 'if-none-match'), page.etag)) {
    res.statusCode = 304
    return Buffer.alloc(0)
  }
  const encoded = encoding ? page.encoded[encoding] : undefined
  if (encoding && encoded) res.setHeader('Content-Encoding', encoding)
  return encoded ?? identity
}

export default defineNitroPlugin((nitroApp) => {
  const redisUrl = process.env.REDIS_URL
  if (process.env.PAGE_CACHE === 'redis') {
    if (!redisUrl) throw new Error('PAGE_CACHE=redis needs REDIS_URL (for example redis://127.0.0.1:6379).')
    const storage = useStorage()
    storage.mount('pages', redisDriver({ url: redisUrl, base: 'pullsheet:pages', ttl: Math.ceil(PAGE_CACHE_TTL_MS / 1000), maxRetriesPerRequest: 1 }))
    setPageStore(new RedisPageStore(storage))
  }

  onSiblingDrop('story-cache', slug => dropStoryCacheHere(slug))

  nitroApp.hooks.hook('beforeResponse', async (event, response) => {
    if (event.context.pageCacheServed) return
    const res = event.node.res
    if (res.headersSent) return
    // A change through the stories API that readers can see reaches their next answers on every server.
    if (isWrite(event.method) && event.path.startsWith('/api/stories') && res.statusCode < 400 && await readersSee(event.path)) await invalidateStoryCache()

    const raw = textBody(response.body)
    if (raw === null) return
    if (!res.getHeader('content-type')) res.setHeader('content-type', typeof response.body === 'string' ? 'text/html; charset=utf-8' : 'application/json')
    const contentType = String(res.getHeader('content-type'))
    const cacheControl = String(res.getHeader('cache-control') ?? '')
    const target = event.context.pageCache
    const keepable = target && res.statusCode === 200 && !event.context.currentUser && !res.getHeader('set-cookie') && !/private/.test(cacheControl) // a desk preview says private
    if (target) res.setHeader('Cache-Control', keepable ? PUBLIC_CACHE_CONTROL : PRIVATE_CACHE_CONTROL)
    // A page, or anything answered to a session (the reader's JSON, CSV and feed included),
    // is nobody else's to keep unless its route said more than the /api default (no-store).
    else if ((!cacheControl || cacheControl === 'no-store') && (contentType.startsWith('text/html') || hasSession(getRequestHeader(event, 'cookie') ?? ''))) res.setHeader('Cache-Control', PRIVATE_CACHE_CONTROL)

    const identity = typeof raw === 'string' ? Buffer.from(raw) : raw
    // Nuxt renders its error page through an internal request and reads the text back.
    const internal = event.path.startsWith('/__nuxt_error') || !!getRequestHeader(event, 'x-nuxt-error')
    if (internal || !compressibleType(contentType)) {
      if (keepable) response.body = await keepAndSend(event, target, identity, null)
      return
    }
    res.setHeader('Vary', withVaryAcceptEncoding(res.getHeader('vary') as string | undefined))
    const encoding = chooseEncoding(getRequestHeader(event, 'accept-encoding'))
    if (keepable) {
      response.body = await keepAndSend(event, target, identity, encoding)
      return
    }
    if (!encoding || identity.byteLength < MIN_COMPRESS_BYTES || res.getHeader('content-encoding')) {
      response.body = identity
      return
    }
    response.body = await compress(identity, encoding, 'live')
    res.setHeader('Content-Encoding', encoding)
    res.removeHeader('content-length')
  })

  // An error answer (an outage's 503, a bug's 500) is never kept, here or by a proxy.
  nitroApp.hooks.hook('error', (error, { event }) => {
    if (!event) return
    const status = (error as { statusCode?: number }).statusCode ?? 500
    if (status < 500 && !isDatabaseOutage(error)) return
    event.context.pageCache = undefined
    if (!event.node.res.headersSent) setResponseHeader(event, 'Cache-Control', 'no-store')
  })

  let fingerprint: string | null = null
  const check = async () => {
    try {
      const row = await useDb()('stories').whereRaw(PUBLIC_ROWS).first(useDb().raw('COUNT(*) AS n, MAX(updated_at) AS changed, MAX(published_at) AS published, SUM(published_edition_id) AS editions')) as { n: number, changed: Date | null, published: Date | null, editions: number | null } | undefined
      const next = JSON.stringify(row ?? null)
      // Every process polls, so each drops only its own copy.
      if (fingerprint !== null && next !== fingerprint) await dropStoryCacheHere()
      fingerprint = next
    }
    catch {
      // The database being away is reported elsewhere; keep what we have until it is back.
    }
  }
  const timer = setInterval(check, POLL_MS)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
