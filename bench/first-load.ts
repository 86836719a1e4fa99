// The JavaScript a story page makes the browser fetch before it is interactive:
// every module script and modulepreload the server-rendered HTML references,
// each gzip-compressed (level 9, as a static server would send it).
import { gzipSync } from 'node:zlib'

export interface FirstLoad { files: { url: string, bytes: number, gzip: number }[], totalGzip: number, totalBytes: number }

export function moduleUrls(html: string): string[] {
  const urls = new Set<string>()
  for (const m of html.matchAll(/<script\b[^>]*\btype="module"[^>]*\bsrc="([^"]+)"/g)) urls.add(m[1]!)
  for (const m of html.matchAll(/<link\b[^>]*\brel="modulepreload"[^>]*\bhref="([^"]+)"/g)) urls.add(m[1]!)
  for (const m of html.matchAll(/<link\b[^>]*\bhref="([^"]+)"[^>]*\brel="modulepreload"/g)) urls.add(m[1]!)
  return [...urls]
}

export async function firstLoad(pageUrl: string): Promise<FirstLoad> {
  const html = await (await fetch(pageUrl)).text()
  const files = await Promise.all(moduleUrls(html).map(async (src) => {
    const url = new URL(src, pageUrl).toString()
    const body = Buffer.from(await (await fetch(url)).arrayBuffer())
    return { url, bytes: body.byteLength, gzip: gzipSync(body, { level: 9 }).byteLength }
  }))
  return { files, totalGzip: files.reduce((s, f) => s + f.gzip, 0), totalBytes: files.reduce((s, f) => s + f.bytes, 0) }
}
