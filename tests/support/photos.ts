// Photo fixtures made in the test (jimp writes JPEG and PNG, the WebP codec
// writes WebP), plus helpers for the photo API and the bucket.
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { DeleteObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { Jimp, type JimpInstance } from 'jimp'
import type { Photo } from '#shared/types/photos'
import type { Client } from './http'
import { testDb } from './db'

export type Paint = (x: number, y: number) => [number, number, number, number?]

/** A smooth gradient with a little deterministic noise: compresses like a photo, not like a flat card. */
export const gradient: Paint = (x, y) => [(x * 7 + ((x * y) % 13)) & 255, (y * 5 + ((x + y) % 11)) & 255, ((x ^ y) * 3) & 255]

function bitmap(width: number, height: number, paint: Paint): JimpInstance {
  const image = new Jimp({ width, height })
  const d = image.bitmap.data
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const [r, g, b, a = 255] = paint(x, y)
      const i = (y * width + x) * 4
      d[i] = r
      d[i + 1] = g
      d[i + 2] = b
      d[i + 3] = a
    }
  }
  return image
}

export async function makeJpeg(width: number, height: number, paint: Paint = gradient, quality = 90): Promise<Buffer> {
  return bitmap(width, height, paint).getBuffer('image/jpeg', { quality })
}

export async function makePng(width: number, height: number, paint: Paint = gradient): Promise<Buffer> {
  return bitmap(width, height, paint).getBuffer('image/png')
}

let webpReady: Promise<(data: { data: Uint8ClampedArray, width: number, height: number }) => Promise<ArrayBuffer>> | undefined

export async function makeWebp(width: number, height: number, paint: Paint = gradient, options: { lossless?: boolean } = {}): Promise<Buffer> {
  webpReady ??= (async () => {
    const { default: encode, init } = await import('@jsquash/webp/encode.js')
    const require = createRequire(import.meta.url)
    await init(await WebAssembly.compile(readFileSync(require.resolve('@jsquash/webp/codec/enc/webp_enc.wasm'))))
    return (image: { data: Uint8ClampedArray, width: number, height: number }) => encode({ ...image, colorSpace: 'srgb' } as ImageData, options.lossless ? { lossless: 1 } : { quality: 85 })
  })()
  const encode = await webpReady
  const data = new Uint8ClampedArray(bitmap(width, height, paint).bitmap.data)
  return Buffer.from(await encode({ data, width, height }))
}

/** Decodes a produced JPEG for dimension and pixel checks. */
export async function decode(bytes: Uint8Array) {
  return Jimp.fromBuffer(Buffer.from(bytes))
}

export function pixel(image: { bitmap: { width: number, data: Uint8Array } }, x: number, y: number): [number, number, number] {
  const i = (y * image.bitmap.width + x) * 4
  const d = image.bitmap.data
  return [d[i]!, d[i + 1]!, d[i + 2]!]
}

// ---------- arranging ----------

let benchCounter = 0

/** A bench test row owned by the user (the bench test API belongs to another issue; rows are enough here). */
export async function createBenchTest(ownerId: number, title = 'Photo test bench'): Promise<number> {
  const slug = `photos-${Date.now().toString(36)}-${++benchCounter}-${Math.random().toString(36).slice(2, 6)}`
  const [id] = await testDb()('bench_tests').insert({ slug, title, engine_family: 'pushrod-v8', part_type: 'camshaft', owner_id: ownerId, notes: 'Fictional bench test for photo tests.' })
  return Number(id)
}

export async function userId(client: Client): Promise<number> {
  return (await client.get('/api/auth/me')).body.user.id as number
}

export async function uploadPhoto(client: Client, benchTestId: number, bytes: Uint8Array, filename = 'photo.jpg', type = 'image/jpeg') {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(bytes)], { type }), filename)
  const send = () => client.request<{ photo: Photo, duplicate: boolean } & { message?: string }>('POST', `/api/bench-tests/${benchTestId}/photos`, { body: form })
  try {
    return await send()
  }
  catch (error) {
    // A keep-alive connection the server closed while this process was busy (making a
    // large JPEG blocks it for seconds) fails on its first write, before the server has
    // the request: send it once more on a fresh connection.
    if ((error as { cause?: { code?: string } }).cause?.code !== 'EPIPE') throw error
    return send()
  }
}

/**
 * How long a test gives one photo to be sized. The worker runs at nice 10, so on a
 * 2-core machine shared with builds and other test runs (load average 17-24) a photo
 * that takes a second or two on a quiet one has taken over a minute. Every file that
 * waits for photos takes its timeouts from here (`photoTestTimeouts`), so a slow machine
 * fails with the wait's own message (the photo's last state), never a bare vitest timeout.
 */
export const PHOTO_WAIT_MS = 150_000

/** Test and hook timeouts for a file whose tests wait for up to `photos` photos one after another. */
export function photoTestTimeouts(photos = 2): { testTimeout: number, hookTimeout: number } {
  const ms = photos * PHOTO_WAIT_MS + 60_000
  return { testTimeout: ms, hookTimeout: ms }
}

export async function waitForPhoto(client: Client, benchTestId: number, photoId: number, until: (p: Photo) => boolean = p => p.status === 'ready' || p.status === 'failed', timeoutMs = PHOTO_WAIT_MS): Promise<Photo> {
  const end = Date.now() + timeoutMs
  let last: Photo | undefined
  while (Date.now() < end) {
    const res = await client.get<{ photos: Photo[] }>(`/api/bench-tests/${benchTestId}/photos`)
    last = res.body.photos?.find(p => p.id === photoId)
    if (last && until(last)) return last
    await new Promise(r => setTimeout(r, 250))
  }
  throw new Error(`photo ${photoId} did not reach the wanted state within ${timeoutMs} ms (last: ${JSON.stringify(last)})`)
}

/** The bytes of a photo route, with its headers. */
export async function fetchImage(client: Client, url: string) {
  const res = await fetch(client.base + url, { headers: client.cookie ? { cookie: client.cookie } : {} })
  return { status: res.status, headers: res.headers, bytes: new Uint8Array(await res.arrayBuffer()) }
}

// ---------- the bucket ----------

let s3: S3Client | undefined

function bucketClient(): S3Client {
  s3 ??= new S3Client({
    region: process.env.S3_REGION ?? 'us-east-1',
    endpoint: process.env.S3_ENDPOINT,
    forcePathStyle: true,
    credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER' },
  })
  return s3
}

/** Every key under the prefix (ListObjectsV2 against the real s3rver). */
export async function bucketKeys(prefix: string): Promise<string[]> {
  const keys: string[] = []
  let token: string | undefined
  do {
    const page = await bucketClient().send(new ListObjectsV2Command({ Bucket: process.env.S3_BUCKET ?? 'pullsheet', Prefix: prefix, ContinuationToken: token }))
    keys.push(...(page.Contents ?? []).map(c => c.Key!))
    token = page.IsTruncated ? page.NextContinuationToken : undefined
  } while (token)
  return keys
}

/** Writes an object straight into the bucket, behind the app's back (for sweep and retry tests). */
export async function replaceObject(key: string, body: Uint8Array | string, contentType = 'application/octet-stream'): Promise<void> {
  await bucketClient().send(new PutObjectCommand({ Bucket: process.env.S3_BUCKET ?? 'pullsheet', Key: key, Body: body, ContentType: contentType }))
}

export async function deleteObject(key: string): Promise<void> {
  await bucketClient().send(new DeleteObjectCommand({ Bucket: process.env.S3_BUCKET ?? 'pullsheet', Key: key }))
}
