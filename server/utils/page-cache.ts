// Whole responses for readers who are not signed in, kept with their Brotli and gzip
// variants so a hit costs no compression. Only the reader's own routes are eligible,
// only without a session cookie, only 200s: drafts, previews, signed-in views and
// pages rendered during an outage never enter.
//
// Where they are kept (PAGE_CACHE): "memory" (the default) holds Buffers in this
// process, and each app server polls the stories to drop its own copy
// (server/plugins/page-cache.ts); "redis" keeps one copy for every app server in a
// shared Redis (REDIS_URL) through Nitro's storage layer, so dropping it once drops
// it everywhere (page-cache-redis.ts).
import { createHash } from 'node:crypto'
import type { Encoding } from './compression'
import { dropInSiblings } from './sibling-processes'

export interface CachedPage {
  status: number
  headers: Record<string, string>
  /** Weak validator of the page's bytes, the same for every encoding of them. */
  etag: string
  storedAt: number
  /** The story slug this response shows, when it is about one story. */
  slug: string | null
  identity: Buffer
  /** Absent when the body is too small or not text. */
  encoded: Partial<Record<Encoding, Buffer>>
}

export interface PageStore {
  /** slug: as pageCacheKeyFor named it (a shared store groups keys by story). */
  get(key: string, slug: string | null): Promise<CachedPage | undefined>
  set(key: string, page: CachedPage): Promise<void>
  /** Drop one story's pages and every list, or everything when no slug is given. */
  drop(slug?: string): Promise<void>
}

export const PAGE_CACHE_TTL_MS = 10 * 60 * 1000
export const KEPT_HEADERS = ['content-type', 'content-security-policy', 'cache-control', 'content-disposition', 'x-robots-tag']

// What a shared cache (nginx, a CDN) may do with a reader's page: keep it a minute,
// then serve the old copy for up to ten more while one request fetches the new one.
// Browsers revalidate every time (max-age=0) and get a 304 when nothing changed.
export const PUBLIC_CACHE_CONTROL = 'public, max-age=0, s-maxage=60, stale-while-revalidate=600'
export const PRIVATE_CACHE_CONTROL = 'private, no-store'

export function etagOf(body: Buffer): string {
  return `W/"${createHash('sha1').update(body).digest('base64url').slice(0, 22)}"`
}

/** True when an If-None-Match header names this validator (or "*"). */
export function etagMatches(ifNoneMatch: string | undefined, etag: string): boolean {
  if (!ifNoneMatch) return false
  const bare = (tag: string) => tag.trim().replace(/^W\//, '')
  return ifNoneMatch.split(',').some(tag => tag.trim() === '*' || bare(tag) === bare(etag))
}

const MAX_BYTES = 64 * 1024 * 1024

const bytesOf = (page: CachedPage) => page.identity.byteLength + (page.encoded.br?.byteLength ?? 0) + (page.encoded.gzip?.byteLength ?? 0)

/** One process's copy; insertion order is age order, the oldest go first past the bound. */
export class MemoryPageStore implements PageStore {
  private pages = new Map<string, CachedPage>()
  private heldBytes = 0

  // Synchronous on purpose: a hit is served without a trip through the microtask queue.
  peek(key: string, now = Date.now()): CachedPage | undefined {
    const page = this.pages.get(key)
    if (page && now - page.storedAt > PAGE_CACHE_TTL_MS) {
      this.forget(key)
      return undefined
    }
    return page
  }

  async get(key: string): Promise<CachedPage | undefined> {
    return this.peek(key)
  }

  async set(key: string, page: CachedPage): Promise<void> {
    const bytes = bytesOf(page)
    if (bytes > MAX_BYTES / 16) return
    this.forget(key)
    this.pages.set(key, page)
    this.heldBytes += bytes
    for (const oldest of this.pages.keys()) {
      if (this.heldBytes <= MAX_BYTES) break
      this.forget(oldest)
    }
  }

  async drop(slug?: string): Promise<void> {
    // Lists are few and cheap to render again; one story's pages are the ones worth keeping.
    for (const [key, page] of [...this.pages]) {
      if (!slug || page.slug === null || page.slug === slug) this.forget(key)
    }
  }

  get size(): number {
    return this.pages.size
  }

  private forget(key: string): void {
    const page = this.pages.get(key)
    if (!page) return
    this.pages.delete(key)
    this.heldBytes -= bytesOf(page)
  }
}

let store: PageStore = new MemoryPageStore()

/** Where pages are kept; server/plugins/page-cache.ts switches to Redis when configured. */
export function usePageStore(): PageStore {
  return store
}

export function setPageStore(next: PageStore): void {
  store = next
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
  // The site's own pages from content/ (the staff collection is not among them).
  { pattern: /^\/(how-we-test|cautions|about)\/?$/ },
  // Not the social card: it has its own caches and answers If-None-Match (figure-export/social-card.ts).
  { pattern: /^\/api\/magazine\/stories\/([a-z0-9-]+)(\/(?!card\.png$)[a-z.-]+)?$/, slug: 1 },
  { pattern: /^\/api\/magazine\/(home|latest|search|engine\/[^/]+|part\/[^/]+|tags\/[^/]+)$/ },
]

export function hasSession(cookie: string): boolean {
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

/** Only the headers that describe the body; the rest are set per answer. */
export function keptHeaders(headers: Record<string, unknown>): Record<string, string> {
  const kept: Record<string, string> = {}
  for (const name of KEPT_HEADERS) {
    const value = headers[name]
    if (typeof value === 'string') kept[name] = value
  }
  return kept
}

/** /api/stories/<id>, then what under it was written. */
const STORY_WRITE = /^\/api\/stories\/(\d+)(\/[^?]*)?/

/** What a written story row says of its readers: enough to tell whether they can see it. */
export interface StoryVisibility { state: string, published_edition_id: number | null }

/**
 * Whether a successful write to `path` (under /api/stories) can change what readers
 * see: creating a draft, or saving, noting or locking a story no reader can see, cannot.
 * Dropping every cached page on each draft autosave let 30 autosaves a second cut the
 * readers' rate from about 16,000 to 99 requests a second (bench/load/run.ts). A
 * workflow step, a deleted story, and anything done to a story that is or was live
 * (it has a published edition, or is published or withdrawn) drops the cache.
 */
export function writeReachesReaders(path: string, story: StoryVisibility | undefined): boolean {
  const m = STORY_WRITE.exec(path)
  if (!m) return false
  if (m[2]?.startsWith('/transitions')) return true
  if (!story) return true
  return story.published_edition_id !== null || story.state === 'published' || story.state === 'withdrawn'
}

/** The story a write under /api/stories/<id> touched, if any. */
export function storyIdOfWrite(path: string): number | null {
  const m = STORY_WRITE.exec(path)
  return m ? Number(m[1]) : null
}

/**
 * Drop what shows this story, and every list (home, browse, tags, search, feeds),
 * since a publish, withdraw or edit can change them all, in this process and in the
 * other processes of this host (server/cluster.mjs). Call it after the transaction
 * that changed the story has committed.
 */
export async function invalidateStoryCache(slug?: string): Promise<void> {
  await Promise.all([dropStoryCacheHere(slug), dropInSiblings('story-cache', slug)])
}

/** The same in this process only: a sibling's drop, or a change this process's poll saw. */
export async function dropStoryCacheHere(slug?: string): Promise<void> {
  for (const listener of droppedListeners) listener(slug)
  await store.drop(slug)
}

const droppedListeners = new Set<(slug?: string) => void>()

/** Other per-process caches of story data (the reader's view) are dropped with the pages. */
export function onStoryCacheDropped(listener: (slug?: string) => void): void {
  droppedListeners.add(listener)
}
