import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import type { Photo } from '#shared/types/photos'
import { closeTestDb, testDb } from '../support/db'
import { carriesExif, jpegSegments, withExif } from '../support/exif'
import { type Client, signedIn } from '../support/http'
import { bucketKeys, createBenchTest, decode, fetchImage, makeJpeg, makePng, makeWebp, photoTestTimeouts, pixel, replaceObject, uploadPhoto, userId, waitForPhoto } from '../support/photos'

// Waits for photo sizing: timeouts from the one bound for a loaded machine (tests/support/photos.ts).
vi.setConfig(photoTestTimeouts(2))

// Against the built server, the real MariaDB and the real s3rver (scripts/test.ts).
let writer: Client
let benchTestId: number

beforeAll(async () => {
  writer = await signedIn('writer@example.com')
  benchTestId = await createBenchTest(await userId(writer), 'Fictional cam swap, photo tests')
})
afterAll(closeTestDb)

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex')

describe('upload and sizing', () => {
  it('answers at once with a pending photo, then makes every web size with the right dimensions', async () => {
    const jpeg = await makeJpeg(2600, 1800)
    const res = await uploadPhoto(writer, benchTestId, jpeg, 'install-overview.jpg')
    expect(res.status).toBe(201)
    expect(res.body.duplicate).toBe(false)
    const uploaded = res.body.photo
    expect(['pending', 'processing']).toContain(uploaded.status)
    expect(uploaded).toMatchObject({ mime: 'image/jpeg', width: 2600, height: 1800, bytes: jpeg.length, sha256: sha256(jpeg), originalName: 'install-overview.jpg', variants: [] })

    const ready = await waitForPhoto(writer, benchTestId, uploaded.id)
    expect(ready.status).toBe('ready')
    // Height = round(width x 1800 / 2600), never wider than the photo.
    expect(ready.variants.map(v => [v.width, v.height])).toEqual([[480, 332], [960, 665], [1600, 1108], [2400, 1662]])
    for (const variant of ready.variants) {
      const image = await fetchImage(writer, variant.url)
      expect(image.status).toBe(200)
      expect(image.headers.get('content-type')).toBe('image/jpeg')
      expect(image.headers.get('x-content-type-options')).toBe('nosniff')
      expect(image.bytes.length).toBe(variant.bytes)
      const decoded = await decode(image.bytes)
      expect([decoded.width, decoded.height]).toEqual([variant.width, variant.height])
    }

    const row = await testDb()('photos').where({ id: uploaded.id }).first()
    expect(row.storage_prefix).toMatch(new RegExp(`^photos/${benchTestId}/[0-9a-f-]{36}$`))
    expect(row.original_key).not.toContain('install-overview') // keys never come from the name
    const keys = await bucketKeys(`${row.storage_prefix}/`)
    expect(keys.sort()).toEqual([`${row.storage_prefix}/original`, ...[1600, 2400, 480, 960].map(w => `${row.storage_prefix}/w${w}.jpg`)].sort())
  })

  it('takes PNG and WebP too, sized to JPEG', async () => {
    for (const [bytes, name, mime] of [[await makePng(700, 500), 'gasket.png', 'image/png'], [await makeWebp(700, 500), 'headers.webp', 'image/webp']] as const) {
      const res = await uploadPhoto(writer, benchTestId, bytes, name, 'application/octet-stream')
      expect(res.status).toBe(201)
      expect(res.body.photo.mime).toBe(mime)
      const ready = await waitForPhoto(writer, benchTestId, res.body.photo.id)
      expect(ready.variants.map(v => [v.width, v.height])).toEqual([[480, 343], [700, 500]])
    }
  })

  it('strips GPS and every other EXIF from each size, while the private original keeps what was uploaded', async () => {
    const jpeg = withExif(await makeJpeg(1700, 1000), { orientation: 1, gps: { latitude: 42.36, longitude: -83.07 } })
    expect(carriesExif(jpeg)).toBe(true) // the fixture really carries it
    const res = await uploadPhoto(writer, benchTestId, jpeg, 'with-gps.jpg')
    const ready = await waitForPhoto(writer, benchTestId, res.body.photo.id)
    expect(ready.variants.map(v => v.width)).toEqual([480, 960, 1600, 1700])
    for (const variant of ready.variants) {
      const image = await fetchImage(writer, variant.url)
      expect(carriesExif(image.bytes)).toBe(false)
      expect(jpegSegments(image.bytes).map(s => s.marker).filter(m => m >= 0xE1 && m <= 0xEF)).toEqual([]) // no APP1-APP15 at all
    }
    const original = await fetchImage(writer, ready.originalUrl)
    expect(original.status).toBe(200)
    expect(original.headers.get('content-disposition')).toMatch(/^attachment/)
    expect(sha256(original.bytes)).toBe(sha256(jpeg))
  })

  it('applies the EXIF orientation: a photo tagged 6 comes out turned, width and height swapped', async () => {
    // Stored left half red, right half blue; orientation 6 (CIPA DC-008: 0th row is
    // the visual right-hand side) shows the stored left edge at the top.
    const jpeg = withExif(await makeJpeg(1200, 800, x => (x < 600 ? [230, 20, 20] : [20, 20, 230])), { orientation: 6 })
    const res = await uploadPhoto(writer, benchTestId, jpeg, 'turned.jpg')
    expect(res.body.photo).toMatchObject({ width: 1200, height: 800 }) // as in the header, before sizing
    const ready = await waitForPhoto(writer, benchTestId, res.body.photo.id)
    expect([ready.width, ready.height]).toEqual([800, 1200])
    expect(ready.variants.map(v => [v.width, v.height])).toEqual([[480, 720], [800, 1200]])
    const image = await decode((await fetchImage(writer, ready.variants[1]!.url)).bytes)
    expect([image.width, image.height]).toEqual([800, 1200])
    const [topR, , topB] = pixel(image, 400, 100)
    const [bottomR, , bottomB] = pixel(image, 400, 1100)
    expect(topR).toBeGreaterThan(200)
    expect(topB).toBeLessThan(60)
    expect(bottomB).toBeGreaterThan(200)
    expect(bottomR).toBeLessThan(60)
  })

  it('notices the same photo uploaded twice to one bench test and keeps one', async () => {
    const jpeg = await makeJpeg(640, 480, (x, y) => [x & 255, y & 255, 77])
    const first = await uploadPhoto(writer, benchTestId, jpeg, 'carb.jpg')
    const again = await uploadPhoto(writer, benchTestId, jpeg, 'carb-copy.jpg')
    expect(first.status).toBe(201)
    expect(again.status).toBe(200)
    expect(again.body.duplicate).toBe(true)
    expect(again.body.photo.id).toBe(first.body.photo.id)
    expect(await testDb()('photos').where({ bench_test_id: benchTestId, sha256: sha256(jpeg) }).count({ n: '*' }).first()).toMatchObject({ n: 1 })
    // Another bench test may have the same file as its own photo.
    const other = await createBenchTest(await userId(writer))
    const elsewhere = await uploadPhoto(writer, other, jpeg, 'carb.jpg')
    expect(elsewhere.status).toBe(201)
    expect(elsewhere.body.photo.id).not.toBe(first.body.photo.id)
  })
})

describe('bad input: refused with a clear message, nothing stored', () => {
  let cleanBench: number

  beforeAll(async () => {
    cleanBench = await createBenchTest(await userId(writer), 'Refusals only')
  })

  async function expectRefused(bytes: Uint8Array, name: string, type: string, status: number, message: RegExp) {
    const res = await uploadPhoto(writer, cleanBench, bytes, name, type)
    expect(res.status).toBe(status)
    expect(res.body.message).toMatch(message)
    expect(await testDb()('photos').where({ bench_test_id: cleanBench }).count({ n: '*' }).first()).toMatchObject({ n: 0 })
    expect(await bucketKeys(`photos/${cleanBench}/`)).toEqual([])
  }

  it('zero bytes', async () => {
    await expectRefused(new Uint8Array(), 'empty.jpg', 'image/jpeg', 422, /The file is empty/)
  })

  it('a truncated JPEG', async () => {
    const jpeg = await makeJpeg(800, 600)
    await expectRefused(jpeg.subarray(0, Math.floor(jpeg.length / 2)), 'cut.jpg', 'image/jpeg', 422, /JPEG file is incomplete/)
  })

  it('a PNG claiming 50,000 x 50,000 pixels', async () => {
    const png = Buffer.from(await makePng(8, 8))
    png.writeUInt32BE(50_000, 16)
    png.writeUInt32BE(50_000, 20)
    await expectRefused(png, 'huge.png', 'image/png', 422, /50,000 x 50,000 pixels.*at most 100 megapixels/)
  })

  it('a renamed text file', async () => {
    await expectRefused(Buffer.from('rpm,torque\n3000,410\n3500,428\n'), 'dyno-sheet.jpg', 'image/jpeg', 415, /text file.*Accepted: JPEG, PNG and WebP/)
  })

  it('an SVG with a script, named as a PNG', async () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><script>fetch("/api/auth/me")</script></svg>'
    await expectRefused(Buffer.from(svg), 'logo.png', 'image/png', 415, /SVG drawings are not accepted.*Accepted: JPEG, PNG and WebP/)
  })

  it('a HEIC photo: export as JPEG', async () => {
    const heic = Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from('ftypheic'), Buffer.alloc(64)])
    await expectRefused(heic, 'IMG_0001.HEIC', 'image/heic', 415, /export the photo as JPEG/)
  })

  it('a file over 40 MB', async () => {
    const big = Buffer.alloc(40 * 1024 * 1024 + 1024)
    big.set([0xFF, 0xD8, 0xFF, 0xE0])
    await expectRefused(big, 'big.jpg', 'image/jpeg', 413, /larger than 40 MB/)
  })

  it('a request without a file part', async () => {
    const form = new FormData()
    form.append('caption', 'no photo here')
    const res = await writer.request('POST', `/api/bench-tests/${cleanBench}/photos`, { body: form })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/No file in the upload/)
  })
})

describe('failures and retry', () => {
  it('a photo whose data does not decode fails with its reason; retry runs it again', async () => {
    const png = Buffer.from(await makePng(300, 200))
    const idat = png.indexOf('IDAT')
    const damaged = Buffer.from(png)
    damaged.fill(0x55, idat + 8, idat + 60) // the header and structure stay whole: only decoding can tell
    const res = await uploadPhoto(writer, benchTestId, damaged, 'damaged.png', 'image/png')
    expect(res.status).toBe(201)
    const failed = await waitForPhoto(writer, benchTestId, res.body.photo.id)
    expect(failed.status).toBe('failed')
    expect(failed.failureReason).toMatch(/could not be decoded/)
    const job = await testDb()('jobs').where('kind', 'photo.process').whereRaw('JSON_VALUE(payload, \'$.photoId\') = ?', [failed.id]).first()
    expect(job).toMatchObject({ status: 'failed', attempts: 1 }) // not tried three times: it cannot get better by itself

    // Put a whole file where the damaged one was, then try again.
    const row = await testDb()('photos').where({ id: failed.id }).first()
    await replaceObject(row.original_key, png, 'image/png')
    const retry = await writer.post(`/api/photos/${failed.id}/retry`)
    expect(retry.status).toBe(200)
    expect(retry.body.photo.status).toBe('pending')
    expect(retry.body.photo.failureReason).toBeNull()
    const ready = await waitForPhoto(writer, benchTestId, failed.id)
    expect(ready.status).toBe('ready')
    expect(ready.variants.map(v => v.width)).toEqual([300])

    const notFailed = await writer.post(`/api/photos/${failed.id}/retry`)
    expect(notFailed.status).toBe(409)
  })
})

describe('metadata', () => {
  let photos: Photo[]

  beforeAll(async () => {
    const bench = await createBenchTest(await userId(writer), 'Metadata')
    photos = []
    for (const shade of [40, 120, 200]) {
      const res = await uploadPhoto(writer, bench, await makeJpeg(320, 200, () => [shade, shade, shade]), `shade-${shade}.jpg`)
      photos.push(res.body.photo)
    }
  })

  it('sets caption, credit and alt text with the version read; a stale version gets 409 with the current photo', async () => {
    const photo = photos[0]!
    const saved = await writer.patch(`/api/photos/${photo.id}`, { version: photo.version, caption: '  The intake before the swap. ', credit: 'Fictional Speed Shop', altText: 'Dual-plane intake manifold on the engine' })
    expect(saved.status).toBe(200)
    expect(saved.body.photo).toMatchObject({ caption: 'The intake before the swap.', credit: 'Fictional Speed Shop', altText: 'Dual-plane intake manifold on the engine', version: photo.version + 1 })

    const stale = await writer.patch(`/api/photos/${photo.id}`, { version: photo.version, caption: 'Overwriting blindly' })
    expect(stale.status).toBe(409)
    expect(stale.body.data.currentVersion).toBe(photo.version + 1)
    expect(stale.body.data.current.caption).toBe('The intake before the swap.')
  })

  it('refuses a caption that is too long, naming the field', async () => {
    const res = await writer.patch(`/api/photos/${photos[1]!.id}`, { version: 1, caption: 'x'.repeat(1001) })
    expect(res.status).toBe(400)
    expect(res.body.data.issues).toEqual([{ path: 'caption', message: 'Use at most 1000 characters' }])
  })

  it('keeps one hero per bench test and moves a photo in the order', async () => {
    const [a, b, c] = photos
    const current = async () => (await writer.get<{ photos: Photo[], missingAltText: { id: number }[] }>(`/api/bench-tests/${a!.benchTestId}/photos`)).body
    const version = async (id: number) => (await current()).photos.find(p => p.id === id)!.version
    expect((await writer.patch(`/api/photos/${a!.id}`, { version: await version(a!.id), isHero: true })).status).toBe(200)
    expect((await writer.patch(`/api/photos/${c!.id}`, { version: await version(c!.id), isHero: true })).status).toBe(200)
    let gallery = await current()
    expect(gallery.photos.filter(p => p.isHero).map(p => p.id)).toEqual([c!.id])

    expect((await writer.patch(`/api/photos/${c!.id}`, { version: await version(c!.id), position: 0 })).status).toBe(200)
    gallery = await current()
    expect(gallery.photos.map(p => p.id)).toEqual([c!.id, a!.id, b!.id])
    expect(gallery.photos.map(p => p.position)).toEqual([0, 1, 2])
    // Only the first one has alt text so far (set in the test above).
    expect(gallery.missingAltText.map(m => m.id).sort()).toEqual([b!.id, c!.id].sort())
  })

  it('deletes a photo with all its objects', async () => {
    const photo = photos[1]!
    await waitForPhoto(writer, photo.benchTestId, photo.id)
    const row = await testDb()('photos').where({ id: photo.id }).first()
    expect((await bucketKeys(`${row.storage_prefix}/`)).length).toBeGreaterThan(1)
    expect((await writer.delete(`/api/photos/${photo.id}`)).status).toBe(200)
    expect(await testDb()('photos').where({ id: photo.id }).first()).toBeUndefined()
    expect(await bucketKeys(`${row.storage_prefix}/`)).toEqual([])
    expect((await writer.delete(`/api/photos/${photo.id}`)).status).toBe(404)
  })
})
