import { Readable } from 'node:stream'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { PHOTO_JPEG_QUALITY, PHOTO_WIDTHS } from '#shared/types/photos'
import { PhotoTaskError, runPhotoTask, type SizedPhoto, stopPhotoWorkers } from '../../../server/services/photos/pool'
import { carriesExif, withExif } from '../../support/exif'
import { decode, makeJpeg, makePng, pixel, type Paint } from '../../support/photos'

// server/workers/photo-worker.mjs through the real pool, as a child process (the
// default) and as a worker thread (PHOTO_WORKER_MODE=thread).
// Every test waits for worker processes at nice 10: on a shared 2-core machine under
// load a test that takes a second on a quiet one has taken over 5 s (vitest's default).
vi.setConfig({ testTimeout: 120_000 })

interface Result { ok: boolean, message?: string, permanent?: boolean, result?: SizedPhoto }

async function size(bytes: Uint8Array, mime: string, width: number, height: number, orientation = 1): Promise<Result> {
  const copy = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer
  try {
    const result = await runPhotoTask({ bytes: copy, mime, width, height, orientation, widths: PHOTO_WIDTHS, quality: PHOTO_JPEG_QUALITY, attempt: 1 })
    return { ok: true, result }
  }
  catch (error) {
    if (error instanceof PhotoTaskError) return { ok: false, message: error.message, permanent: error.permanent }
    throw error
  }
}

type Colour = 'red' | 'green' | 'blue' | 'yellow'
const QUADRANTS: Record<Colour, [number, number, number]> = { red: [230, 20, 20], green: [20, 200, 20], blue: [20, 20, 230], yellow: [230, 230, 20] }
/** Stored image: top-left red, top-right green, bottom-left blue, bottom-right yellow. */
const quadrants = (w: number, h: number): Paint => (x, y) => QUADRANTS[y < h / 2 ? (x < w / 2 ? 'red' : 'green') : (x < w / 2 ? 'blue' : 'yellow')]

function nearest([r, g, b]: [number, number, number]): Colour {
  const distance = (c: [number, number, number]) => (c[0] - r) ** 2 + (c[1] - g) ** 2 + (c[2] - b) ** 2
  return (Object.keys(QUADRANTS) as Colour[]).sort((a, z) => distance(QUADRANTS[a]) - distance(QUADRANTS[z]))[0]!
}

// EXIF 2.32 (CIPA DC-008), tag 0x0112: which stored corner is shown top-left, and
// whether rows and columns swap (5-8). E.g. 6: "the 0th row is the visual
// right-hand side, the 0th column the visual top" -> stored bottom-left shows top-left.
const SHOWN_TOP_LEFT: Record<number, Colour> = { 1: 'red', 2: 'green', 3: 'yellow', 4: 'blue', 5: 'red', 6: 'blue', 7: 'yellow', 8: 'green' }

describe.each(['process', 'thread'])('photo worker as a %s', (mode) => {
  beforeAll(() => { process.env.PHOTO_WORKER_MODE = mode })
  afterAll(() => { delete process.env.PHOTO_WORKER_MODE })

  it('makes the web sizes, never upscaling, with the right dimensions', async () => {
    const jpeg = await makeJpeg(2600, 1300)
    const answer = await size(jpeg, 'image/jpeg', 2600, 1300)
    expect(answer.ok).toBe(true)
    expect(answer.result!.variants.map(v => [v.width, v.height])).toEqual([[480, 240], [960, 480], [1600, 800], [2400, 1200]])
    for (const v of answer.result!.variants) {
      const image = await decode(new Uint8Array(v.bytes))
      expect([image.width, image.height]).toEqual([v.width, v.height])
    }
    const small = await size(await makeJpeg(300, 200), 'image/jpeg', 300, 200)
    expect(small.result!.variants.map(v => [v.width, v.height])).toEqual([[300, 200]])
  })

  it.each(Object.entries(SHOWN_TOP_LEFT))('JPEG orientation %s: turned and mirrored as EXIF says, no EXIF left', async (o, topLeft) => {
    const orientation = Number(o)
    const jpeg = withExif(await makeJpeg(64, 32, quadrants(64, 32)), { orientation, gps: { latitude: 44.25, longitude: -71.5 } })
    const answer = await size(jpeg, 'image/jpeg', 64, 32, orientation)
    const [out] = answer.result!.variants
    const image = await decode(new Uint8Array(out!.bytes))
    expect([image.width, image.height]).toEqual(orientation >= 5 ? [32, 64] : [64, 32])
    expect(nearest(pixel(image, 3, 3))).toBe(topLeft)
    expect(carriesExif(new Uint8Array(out!.bytes))).toBe(false)
  })

  it.each(Object.entries(SHOWN_TOP_LEFT))('PNG orientation %s (read at upload, applied by the worker)', async (o, topLeft) => {
    const orientation = Number(o)
    const answer = await size(await makePng(64, 32, quadrants(64, 32)), 'image/png', 64, 32, orientation)
    const image = await decode(new Uint8Array(answer.result!.variants[0]!.bytes))
    expect([image.width, image.height]).toEqual(orientation >= 5 ? [32, 64] : [64, 32])
    expect(nearest(pixel(image, 3, 3))).toBe(topLeft)
  })

  it('puts transparent parts on white (JPEG has no transparency)', async () => {
    const png = await makePng(40, 20, x => (x < 20 ? [0, 0, 0, 0] : [20, 20, 230, 255]))
    const answer = await size(png, 'image/png', 40, 20)
    const image = await decode(new Uint8Array(answer.result!.variants[0]!.bytes))
    expect(pixel(image, 5, 10).every(c => c > 245)).toBe(true)
    expect(nearest(pixel(image, 35, 10))).toBe('blue')
  })

  it('takes the original as a stream (as from storage), and tells a cut-off stream from a broken file', async () => {
    const jpeg = await makeJpeg(700, 300)
    const chunks = Array.from({ length: Math.ceil(jpeg.length / 4096) }, (_, i) => jpeg.subarray(i * 4096, (i + 1) * 4096))
    const task = { mime: 'image/jpeg', width: 700, height: 300, orientation: 1, widths: PHOTO_WIDTHS, quality: PHOTO_JPEG_QUALITY, attempt: 1 }
    const sized = await runPhotoTask({ ...task, bytes: Readable.from(chunks), length: jpeg.length })
    expect(sized.variants.map(v => [v.width, v.height])).toEqual([[480, 206], [700, 300]])
    if (mode === 'process') {
      const cut = runPhotoTask({ ...task, bytes: Readable.from(chunks.slice(0, 2)), length: jpeg.length })
      await expect(cut).rejects.toMatchObject({ permanent: false, message: expect.stringMatching(/arrived incomplete from storage/) })
      // The child that got a cut stream is not asked again: the next photo is whole.
      const after = await runPhotoTask({ ...task, bytes: Readable.from(chunks), length: jpeg.length })
      expect(after.variants.map(v => [v.width, v.height])).toEqual([[480, 206], [700, 300]])
    }
  })

  it('gives up for good on a file whose header is fine but whose data does not decode', async () => {
    const png = Buffer.from(await makePng(50, 50))
    const idat = png.indexOf('IDAT')
    png.fill(0x55, idat + 8, idat + 40) // damages the compressed data; the structure stays whole
    const answer = await size(png, 'image/png', 50, 50)
    expect(answer.ok).toBe(false)
    expect(answer.permanent).toBe(true)
    expect(answer.message).toMatch(/could not be decoded/)
  })
})

describe('child workers sizing photos in a row', () => {
  afterAll(() => {
    delete process.env.PHOTO_WORKER_TASKS
    delete process.env.PHOTO_WORKER_IDLE_SECONDS
    delete process.env.PHOTO_WORKER_KEEP_MB
    stopPhotoWorkers()
  })
  const pidOf = async (bytes: Uint8Array, w: number, h: number) => (await size(bytes, 'image/jpeg', w, h)).result!.workerPid

  it('keeps one child for several photos, each streamed whole, and retires it after PHOTO_WORKER_TASKS', async () => {
    process.env.PHOTO_WORKER_TASKS = '3'
    stopPhotoWorkers()
    const photos = [await makeJpeg(700, 300), await makeJpeg(500, 400), await makeJpeg(640, 480), await makeJpeg(300, 200)]
    const sized: SizedPhoto[] = []
    for (const jpeg of photos) {
      const task = { mime: 'image/jpeg', orientation: 1, widths: PHOTO_WIDTHS, quality: PHOTO_JPEG_QUALITY, attempt: 1 }
      // Odd-sized pieces, so a photo's bytes never line up with the pipe's chunks.
      const chunks = Array.from({ length: Math.ceil(jpeg.length / 3001) }, (_, i) => jpeg.subarray(i * 3001, (i + 1) * 3001))
      const [width, height] = [[700, 300], [500, 400], [640, 480], [300, 200]][sized.length]!
      sized.push(await runPhotoTask({ ...task, width: width!, height: height!, bytes: Readable.from(chunks), length: jpeg.length }))
    }
    expect(sized.map(s => [s.width, s.height])).toEqual([[700, 300], [500, 400], [640, 480], [300, 200]])
    const pids = sized.map(s => s.workerPid)
    expect(pids[1]).toBe(pids[0])
    expect(pids[2]).toBe(pids[0])
    expect(pids[3]).not.toBe(pids[0])
    // Every size of the third photo decodes to its own dimensions: nothing of the photos before it was mixed in.
    for (const v of sized[2]!.variants) {
      const image = await decode(new Uint8Array(v.bytes))
      expect([image.width, image.height]).toEqual([v.width, v.height])
    }
  })

  it('retires a child that stays idle longer than PHOTO_WORKER_IDLE_SECONDS', async () => {
    process.env.PHOTO_WORKER_TASKS = '20'
    process.env.PHOTO_WORKER_IDLE_SECONDS = '0.3'
    stopPhotoWorkers()
    const jpeg = await makeJpeg(300, 200)
    const first = await pidOf(jpeg, 300, 200)
    expect(await pidOf(jpeg, 300, 200)).toBe(first) // at once: the same child
    await new Promise(r => setTimeout(r, 800))
    expect(await pidOf(jpeg, 300, 200)).not.toBe(first)
  })

  it('retires a child whose memory after a photo is over PHOTO_WORKER_KEEP_MB', async () => {
    process.env.PHOTO_WORKER_IDLE_SECONDS = '10'
    process.env.PHOTO_WORKER_KEEP_MB = '1'
    stopPhotoWorkers()
    const jpeg = await makeJpeg(300, 200)
    const first = await size(jpeg, 'image/jpeg', 300, 200)
    expect(first.result!.rssMb).toBeGreaterThan(1)
    expect(await pidOf(jpeg, 300, 200)).not.toBe(first.result!.workerPid)
  })
})
