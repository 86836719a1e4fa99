// The story page on the wire (issue 19): at most 40 KB as a reader's browser gets it
// (Brotli, else gzip), with three figures drawn. The sizes are printed for the record.
import { get } from 'node:http'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { beforeAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { DEMO, expectOk } from '../support/workspace'
import { publishedFullStory } from '../support/stories'

let slug = ''

beforeAll(async () => {
  slug = (await publishedFullStory(await signedIn(DEMO.editor))).slug
}, 120_000)

/** The page's bytes as they cross the wire (node:http: fetch would decompress them). */
function page(encoding: string): Promise<{ wire: number, html: string }> {
  return new Promise((resolve, reject) => {
    get(`${new Client().base}/stories/${slug}`, { headers: { 'accept-encoding': encoding } }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => {
        const bytes = Buffer.concat(chunks)
        const used = res.headers['content-encoding']
        if (res.statusCode !== 200) return reject(new Error(`status ${res.statusCode}`))
        resolve({ wire: bytes.byteLength, html: (used === 'br' ? brotliDecompressSync(bytes) : used === 'gzip' ? gunzipSync(bytes) : bytes).toString('utf8') })
      })
    }).on('error', reject)
  })
}

/** Curve points the page's payload carries ({"rpm":...} objects, escaped inside the payload's JSON string). */
const pointsIn = (text: string) => (text.match(/\\?"rpm\\?":/g) ?? []).length

describe('the story page on the wire', () => {
  it('is at most 40 KB compressed', async () => {
    const br = await page('br')
    const gzip = await page('gzip')
    const identity = await page('identity')
    const view = JSON.stringify(expectOk(await new Client().get(`/api/magazine/stories/${slug}`)))
    console.log(`story page: ${(br.wire / 1024).toFixed(1)} KB Brotli, ${(gzip.wire / 1024).toFixed(1)} KB gzip, ${(identity.wire / 1024).toFixed(1)} KB uncompressed; curve points in the page ${pointsIn(identity.html)}, in the API's view ${pointsIn(view)}`)
    // Curves once: the page carries each curve every 50 rpm (the API's view: every 10 rpm).
    expect(pointsIn(identity.html) * 3).toBeLessThan(pointsIn(view))
    expect(br.wire).toBeLessThanOrEqual(40 * 1024)
    expect(gzip.wire).toBeLessThanOrEqual(40 * 1024)
  })
})
