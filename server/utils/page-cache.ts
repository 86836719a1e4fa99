// Whole responses for readers who are not signed in, held as Buffers (a string
// with non-ASCII characters is re-encoded on every send). Only the reader's own
// routes are eligible, only without a session cookie, only 200s: drafts, previews
// and signed-in views never enter. Each app server keeps its own; they all drop
// it when the stories table changes (server/plugins/page-cache.ts polls for that),
// so publish, withdraw and edit reach every server within a few seconds.
export interface CachedPage {
  body: Buffer
  status: number
  headers: Record<string, string>
  storedAt: number
  /** The story slug this response shows, when it is about one story. */
  slug: string | null
}

export const PAGE_CACHE_TTL_MS = 10 * 60 * 1000
const KEPT_HEADERS = ['content-type', 'content-security-policy', 'cache-control', 'content-disposition', 'x-robots-tag']

const MAX_BYTES = 64 * 1024 * 1024
// Insertion order is age order: the oldest entries go first when the bound is reached.
const pages = new Map<string, CachedPage>()
let heldBytes = 0

function forget(key: string): void {
  const page = pages.get(key)
  if (!page) return
  pages.delete(key)
  heldBytes -= page.body.byteLength
}

// Paths whose answer is the same for every anonymous reader.
const ELIGIBLE: { pattern: RegExp, slug?: number }[] = [
  { pattern: /^\/$/ },
  { pattern: /^\/stories\/?$/ },
  { pattern: /^\/stories\/([a-z0-9-]+)\/?$/, slug: 1 },
  { pattern: /^\/embed\/([a-z0-9-]+)\/\d+$/, slug: 1 },
  { pattern: /^\/(browse\/(engine|part)|tags)\/[^/]+\/?$/ },
  { pattern: /^\/search\/?$/ },
  { pattern: /^\/(feed|sitemap)\.xml$/ },
  // Not the social card: it has its own caches and answers If-None-Match (figure-export/social-card.ts).
  { pattern: /^\/api\/magazine\/stories\/([a-z0-9-]+)(\/(?!card\.png$)[a-z.-]+)?$/, slug: 1 },
  { pattern: /^\/api\/magazine\/(home|latest|search|engine\/[^/]+|part\/[^/]+|tags\/[^/]+)$/ },
]

function hasSession(cookie: string): boolean {
  return cookie.split(';').some(part => /^\s*pullsheet-session=[^;\s]/.test(part))
}

/** The cache key of a request that may be served from the cache, or null. */
export function pageCacheKeyFor(method: string, path: string, cookie: string): { key: string, slug: string | null } | null {
  if (method !== 'GET' && method !== 'HEAD') return null
  if (hasSession(cookie)) return null
  const url = new URL(path, 'http://x')
  // Nuxt's payload and internal routes, preview links and anything else are not ours to keep.
  for (const rule of ELIGIBLE) {
    const m = rule.pattern.exec(url.pathname)
    if (!m) continue
    const query = [...url.searchParams].sort(([a], [b]) => a.localeCompare(b)).map(([k, v]) => `${k}=${v}`).join('&')
    return { key: `${url.pathname}?${query}`, slug: rule.slug ? m[rule.slug] ?? null : null }
  }
  return null
}

export function cachedPage(key: string, now = Date.now()): CachedPage | undefined {
  const page = pages.get(key)
  if (page && now - page.storedAt > PAGE_CACHE_TTL_MS) {
    forget(key)
    return undefined
  }
  return page
}

export function storePage(key: string, slug: string | null, status: number, headers: Record<string, unknown>, body: string | Buffer): void {
  if (status !== 200) return
  const kept: Record<string, string> = {}
  for (const name of KEPT_HEADERS) {
    const value = headers[name]
    if (typeof value === 'string') kept[name] = value
  }
  const bytes = typeof body === 'string' ? Buffer.from(body) : body
  if (bytes.byteLength > MAX_BYTES / 16) return
  forget(key)
  pages.set(key, { body: bytes, status, headers: kept, storedAt: Date.now(), slug })
  heldBytes += bytes.byteLength
  for (const oldest of pages.keys()) {
    if (heldBytes <= MAX_BYTES) break
    forget(oldest)
  }
}

/**
 * Drop what shows this story, and every list (home, browse, tags, search, feeds),
 * since a publish, withdraw or edit can change them all. Call it after the
 * transaction that changed the story has committed.
 */
export function invalidateStoryCache(slug?: string): void {
  // Lists are few and cheap to render again; one story's pages are the ones worth keeping.
  for (const [key, page] of [...pages]) {
    if (!slug || page.slug === null || page.slug === slug) forget(key)
  }
  for (const listener of droppedListeners) listener(slug)
}

const droppedListeners = new Set<(slug?: string) => void>()

/** Other per-process caches of story data (the reader's view) are dropped with the pages. */
export function onStoryCacheDropped(listener: (slug?: string) => void): void {
  droppedListeners.add(listener)
}

export function pageCacheSize(): number {
  return pages.size
}
