// The page cache shared by several app servers: one copy of each page in Redis,
// through Nitro's storage layer (unstorage's Redis driver, on ioredis). An entry is
// one value: a length-prefixed JSON head, then the plain, Brotli and gzip bodies.
import { createHash } from 'node:crypto'
import type { Storage } from 'unstorage'
import { PAGE_CACHE_TTL_MS, type CachedPage, type PageStore } from './page-cache'

interface Head extends Omit<CachedPage, 'identity' | 'encoded'> {
  lengths: [identity: number, br: number, gzip: number]
}

export function packPage(page: CachedPage): Buffer {
  const { identity, encoded, ...rest } = page
  const bodies = [identity, encoded.br ?? Buffer.alloc(0), encoded.gzip ?? Buffer.alloc(0)]
  const head: Head = { ...rest, lengths: [bodies[0]!.byteLength, bodies[1]!.byteLength, bodies[2]!.byteLength] }
  const json = Buffer.from(JSON.stringify(head))
  const size = Buffer.alloc(4)
  size.writeUInt32BE(json.byteLength)
  return Buffer.concat([size, json, ...bodies])
}

export function unpackPage(packed: Buffer): CachedPage {
  const headEnd = 4 + packed.readUInt32BE(0)
  const { lengths, ...rest } = JSON.parse(packed.subarray(4, headEnd).toString()) as Head
  let at = headEnd
  const [identity, br, gzip] = lengths.map((n) => {
    const body = packed.subarray(at, at + n)
    at += n
    return body
  }) as [Buffer, Buffer, Buffer]
  return { ...rest, identity, encoded: { ...(br.byteLength ? { br } : {}), ...(gzip.byteLength ? { gzip } : {}) } }
}

// unstorage's keys are path-like (it drops what follows a "?"): the request's key is hashed.
const LISTS = 'lists'
const groupOf = (slug: string | null) => (slug ? `story:${slug}` : LISTS)
const itemKey = (key: string, slug: string | null) => `${groupOf(slug)}:${createHash('sha1').update(key).digest('hex')}`

export class RedisPageStore implements PageStore {
  /** storage: Nitro's storage with the Redis driver mounted at "pages" (server/plugins/page-cache.ts). */
  constructor(private storage: Storage) {}

  async get(key: string, slug: string | null): Promise<CachedPage | undefined> {
    try {
      const raw = await this.storage.getItemRaw<Buffer | Uint8Array>(`pages:${itemKey(key, slug)}`)
      if (!raw) return undefined
      const page = unpackPage(Buffer.from(raw.buffer, raw.byteOffset, raw.byteLength))
      return Date.now() - page.storedAt > PAGE_CACHE_TTL_MS ? undefined : page
    }
    catch {
      // Redis away: render the page, as on a miss.
      return undefined
    }
  }

  async set(key: string, page: CachedPage): Promise<void> {
    try {
      await this.storage.setItemRaw(`pages:${itemKey(key, page.slug)}`, packPage(page))
    }
    catch { /* a page not kept is rendered again */ }
  }

  async drop(slug?: string): Promise<void> {
    if (!slug) return this.storage.clear('pages')
    await Promise.all([this.storage.clear(`pages:${LISTS}`), this.storage.clear(`pages:${groupOf(slug)}`)])
  }
}
