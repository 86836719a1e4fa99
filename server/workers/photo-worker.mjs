// Sizes photos (see server/services/photos/pool.ts): decode, apply the camera's
// orientation, flatten transparency, make the web sizes as JPEG. As a child process
// (the default) it sizes one photo after another until the server retires it (after
// some photos, when idle, or when its memory stays high: the server decides), so
// process start, jimp's loading and the JIT's warm-up are paid once for several
// photos; its memory goes back to the system when it exits. As a worker thread
// (PHOTO_WORKER_MODE=thread) it is ended after each photo.
//
// Plain ESM on purpose: the build copies this file into .output/server/workers/
// (nuxt.config.ts) and it imports jimp and @jsquash/webp from the traced
// node_modules beside it. Nothing of the original's metadata survives: every
// output is encoded from bare pixels.
import { readFile } from 'node:fs/promises'
import { createRequire } from 'node:module'
import { parentPort, workerData } from 'node:worker_threads'
import { createJimp } from '@jimp/core'
import jpeg from '@jimp/js-jpeg'
import png from '@jimp/js-png'
import { methods as resize } from '@jimp/plugin-resize'

// Only what sizing needs (JPEG and PNG in and out, resize): the full 'jimp' package
// loads every format and plugin, which cost about 0.6 s of each photo's short-lived
// process (measured here; WebP is decoded by @jsquash below).
const Jimp = createJimp({ formats: [jpeg, png], plugins: [resize] })
const jpegFormat = jpeg()

const require = createRequire(import.meta.url)

/** Raised for a file that will never decode: retrying cannot help. */
class Unprocessable extends Error {}

async function decodeWebp(bytes) {
  const { default: decode, init } = await import('@jsquash/webp/decode.js')
  // Emscripten would fetch() the wasm by URL, which Node cannot do for file: URLs.
  const wasm = await readFile(require.resolve('@jsquash/webp/codec/dec/webp_dec.wasm'))
  await init(await WebAssembly.compile(wasm))
  const copy = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength)
  const image = await decode(copy)
  const data = Buffer.from(image.data.buffer, image.data.byteOffset, image.data.byteLength)
  return { width: image.width, height: image.height, data }
}

async function decode(task) {
  const bytes = Buffer.from(task.bytes)
  try {
    if (task.mime === 'image/webp') return { bitmap: await decodeWebp(bytes), oriented: false }
    // jpeg-js refuses big frames unless allowed; 2 GB covers 50 MP (stack notes),
    // and the 100 MP upload cap needs about twice that.
    const megapixels = (task.width * task.height) / 1e6
    const image = await Jimp.fromBuffer(bytes, { 'image/jpeg': { maxMemoryUsageInMB: megapixels > 50 ? 4096 : 2048 } })
    // jimp 1.6 reads EXIF orientation of JPEGs itself and rotates on read, leaving
    // Orientation = 1 behind; when its parser failed, the upload's reading is used.
    const oriented = task.mime === 'image/jpeg' && image._exif?.tags?.Orientation === 1
    return { bitmap: { width: image.bitmap.width, height: image.bitmap.height, data: image.bitmap.data }, oriented }
  }
  catch (error) {
    throw new Unprocessable(`The image could not be decoded (${String(error?.message ?? error).slice(0, 200)}). Export it again as JPEG and upload that.`)
  }
}

/** Pixel moves for EXIF orientations 2-8: for each target pixel, the source pixel. */
function orient(bitmap, orientation) {
  if (!(orientation >= 2 && orientation <= 8)) return bitmap
  const { width: w, height: h } = bitmap
  const swap = orientation >= 5
  const nw = swap ? h : w
  const nh = swap ? w : h
  const aligned = bitmap.data.byteOffset % 4 === 0 ? bitmap.data : Buffer.from(bitmap.data)
  const src = new Uint32Array(aligned.buffer, aligned.byteOffset, w * h)
  const out = Buffer.alloc(w * h * 4)
  const dst = new Uint32Array(out.buffer, out.byteOffset, w * h)
  for (let y = 0; y < nh; y++) {
    for (let x = 0; x < nw; x++) {
      let sx, sy
      switch (orientation) {
        case 2: sx = w - x - 1; sy = y; break
        case 3: sx = w - x - 1; sy = h - y - 1; break
        case 4: sx = x; sy = h - y - 1; break
        case 5: sx = y; sy = x; break
        case 6: sx = y; sy = h - x - 1; break
        case 7: sx = w - y - 1; sy = h - x - 1; break
        default: sx = w - y - 1; sy = x
      }
      dst[y * nw + x] = src[sy * w + sx]
    }
  }
  return { width: nw, height: nh, data: out }
}

/** JPEG has no transparency: transparent parts go onto white, as on a page. */
function flattenOnWhite(bitmap) {
  const d = bitmap.data
  for (let i = 3; i < d.length; i += 4) {
    const a = d[i]
    if (a === 255) continue
    const k = a / 255
    d[i - 3] = Math.round(d[i - 3] * k + 255 * (1 - k))
    d[i - 2] = Math.round(d[i - 2] * k + 255 * (1 - k))
    d[i - 1] = Math.round(d[i - 1] * k + 255 * (1 - k))
    d[i] = 255
  }
}

/** The widths to make: the standard ones below the photo's width, and the photo's own width when it is smaller than the largest. */
function targetWidths(width, widths) {
  const below = widths.filter(w => w < width)
  if (width <= Math.max(...widths)) below.push(width)
  return [...new Set(below)].sort((a, b) => b - a)
}

/**
 * The bytes jimp's getBuffer('image/jpeg') makes, at a fraction of the cost. Having no
 * alpha, JPEG made jimp composite the image over a transparent-black canvas first,
 * with a generic blend that builds objects for every pixel: a third of a photo's
 * sizing time and most of its garbage collection (measured on the demo's photos,
 * docs/bench/photos.md). This is the same source-over arithmetic, in the same order,
 * in one loop (so the same pixels, bit for bit), then the same encoder.
 */
function encodeJpeg(bitmap, quality) {
  const src = bitmap.data
  const out = Buffer.allocUnsafe(src.length)
  const limit255 = n => Math.min(Math.max(n, 0), 255)
  for (let i = 0; i < src.length; i += 4) {
    const a = src[i + 3] / 255
    // jimp's srcOver with a destination of 0 (colour and alpha) and opacity 1.
    out[i] = limit255((((src[i] / 255) * a + 0) / a) * 255)
    out[i + 1] = limit255((((src[i + 1] / 255) * a + 0) / a) * 255)
    out[i + 2] = limit255((((src[i + 2] / 255) * a + 0) / a) * 255)
    out[i + 3] = limit255(a * 255)
  }
  return jpegFormat.encode({ width: bitmap.width, height: bitmap.height, data: out }, { quality })
}

function toArrayBuffer(buffer) {
  return buffer.buffer.slice(buffer.byteOffset, buffer.byteOffset + buffer.byteLength)
}

async function sizePhoto(task) {
  const decoded = await decode(task)
  const bitmap = decoded.oriented ? decoded.bitmap : orient(decoded.bitmap, task.orientation)
  if (task.mime !== 'image/jpeg') flattenOnWhite(bitmap)
  const full = { width: bitmap.width, height: bitmap.height }
  // Largest first, each from the one before: fewer pixels to read at every step.
  const working = new Jimp(bitmap)
  const variants = []
  for (const width of targetWidths(full.width, task.widths)) {
    const height = Math.max(1, Math.round((width * full.height) / full.width))
    if (working.bitmap.width !== width) working.resize({ w: width, h: height })
    // Encoded from bare pixels: the decoder's EXIF and comments stay behind.
    const jpeg = encodeJpeg({ width, height, data: working.bitmap.data }, task.quality)
    variants.push({ width, height, bytes: toArrayBuffer(jpeg) })
  }
  variants.reverse()
  return { ...full, variants }
}

/**
 * The child's stdin carries the originals one after another, each exactly `length`
 * bytes long (the server sends the next only after this one's answer); without a
 * length the photo runs to the end of the stream, and that child takes no more.
 */
function stdinReader() {
  let chunks = []
  let have = 0
  let ended = false
  let wake
  process.stdin.on('data', (chunk) => { chunks.push(chunk); have += chunk.length; wake?.() })
  process.stdin.on('end', () => { ended = true; wake?.() })
  return async (length) => {
    while (!ended && !(length !== undefined && have >= length)) await new Promise((resolve) => { wake = resolve })
    wake = undefined
    const all = chunks.length === 1 ? chunks[0] : Buffer.concat(chunks)
    const n = length === undefined ? all.length : Math.min(length, all.length)
    const rest = all.subarray(n)
    chunks = rest.length ? [rest] : []
    have = rest.length
    return all.subarray(0, n)
  }
}

// The same messages either way: a worker thread's port, or a child's IPC channel.
const channel = parentPort
  ? { fault: workerData?.fault, receive: fn => parentPort.on('message', fn), send: (m, transfer) => parentPort.postMessage(m, transfer) }
  : { fault: process.env.PHOTO_WORKER_FAULT, receive: fn => process.on('message', fn), send: m => process.send(m) }
// A child whose server died stops too, instead of lingering with a photo half done.
if (!parentPort) process.once('disconnect', () => process.exit(0))
const readOriginal = parentPort ? undefined : stdinReader()

channel.receive(async (task) => {
  // Test-only faults (PULLSHEET_TEST_HOOKS=1): a worker that hangs mid-job or dies on its first try.
  if (channel.fault === 'hang') {
    setInterval(() => {}, 60_000) // stays alive, doing nothing, until it is killed
    return
  }
  if (channel.fault === 'exit-first-try' && task.attempt === 1) process.exit(70)
  try {
    if (readOriginal) {
      // A child gets the original on stdin, streamed from storage by the server.
      const bytes = await readOriginal(task.length)
      if (task.length !== undefined && bytes.length !== task.length) {
        channel.send({ ok: false, permanent: false, message: `The original arrived incomplete from storage (${bytes.length} of ${task.length} bytes). It will be tried again.` })
        return
      }
      task.bytes = toArrayBuffer(bytes)
    }
    const result = await sizePhoto(task)
    task.bytes = undefined
    // Peak memory of this process: meaningful for a child, the whole server's for a thread.
    result.maxRssMb = Math.round(process.resourceUsage().maxRSS / 1024)
    // What a child keeps now, so the server can retire one that stays large.
    result.rssMb = Math.round(process.memoryUsage.rss() / 1048576)
    result.workerPid = process.pid
    channel.send({ ok: true, result }, result.variants.map(v => v.bytes))
  }
  catch (error) {
    channel.send({ ok: false, permanent: error instanceof Unprocessable, message: String(error?.message ?? error) })
  }
})
