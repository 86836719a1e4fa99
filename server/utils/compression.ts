// The app compresses its own text answers (HTML, JSON, CSV, XML), so a reader on a
// phone gets a story page of a few tens of KB whether or not a proxy sits in front.
// zlib's async calls run on libuv's thread pool: the event loop keeps answering.
import { promisify } from 'node:util'
import { brotliCompress, constants, gzip } from 'node:zlib'

export type Encoding = 'br' | 'gzip'

const brotli = promisify(brotliCompress)
const gzipAsync = promisify(gzip)

/** Below this a compressed answer saves less than its headers and the work cost. */
export const MIN_COMPRESS_BYTES = 1024

const COMPRESSIBLE = /^(text\/|application\/(json|xml|rss\+xml|atom\+xml|javascript|manifest\+json)|image\/svg\+xml)/i

export function compressibleType(contentType: string | undefined): boolean {
  return !!contentType && COMPRESSIBLE.test(contentType)
}

/**
 * The encoding to send for an Accept-Encoding header: Brotli when accepted, then
 * gzip, else none. q=0 refuses one; "*" accepts any not named.
 */
export function chooseEncoding(acceptEncoding: string | undefined): Encoding | null {
  if (!acceptEncoding) return null
  const q = new Map<string, number>()
  for (const part of acceptEncoding.toLowerCase().split(',')) {
    const [name, ...params] = part.trim().split(';')
    if (!name) continue
    const weight = params.map(p => /^\s*q=([\d.]+)\s*$/.exec(p)).find(Boolean)
    q.set(name.trim(), weight ? Number(weight[1]) : 1)
  }
  const accepted = (name: Encoding) => (q.get(name) ?? q.get('*') ?? 0) > 0
  if (accepted('br')) return 'br'
  if (accepted('gzip')) return 'gzip'
  return null
}

/**
 * Level "stored": for page-cache entries, made once and sent many times (Brotli 9
 * is within a few % of 11 on our pages at a fraction of its time). Level "live":
 * for answers made per request (signed-in pages, data downloads).
 */
export function compress(body: Buffer, encoding: Encoding, level: 'stored' | 'live'): Promise<Buffer> {
  if (encoding === 'br') {
    return brotli(body, {
      params: {
        [constants.BROTLI_PARAM_QUALITY]: level === 'stored' ? 9 : 4,
        [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT,
        [constants.BROTLI_PARAM_SIZE_HINT]: body.byteLength,
      },
    })
  }
  return gzipAsync(body, { level: level === 'stored' ? 9 : 6 })
}

/** "Accept-Encoding" joined to a Vary header that may already name others. */
export function withVaryAcceptEncoding(vary: string | undefined): string {
  if (!vary) return 'Accept-Encoding'
  return /\baccept-encoding\b/i.test(vary) ? vary : `${vary}, Accept-Encoding`
}
