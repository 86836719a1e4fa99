// One reader for every request body: bytes are counted as they arrive (chunked bodies
// included, whatever Content-Length claims), and the body is refused with 413 the
// moment it passes its route's limit, before anything past the limit is held.
// server/middleware/02.body-limit.ts hands h3's own body readers (readBody,
// readValidatedBody, readMultipartFormData) to it; streaming routes call it directly.
import { Transform, type Readable } from 'node:stream'
import { createError, getRequestHeader, type H3Event } from 'h3'

/** Largest JSON body an import takes: 20 files of 5 MB, with room for JSON escaping. */
export const MAX_IMPORT_BODY_BYTES = 60 * 1024 * 1024

/** What any route takes when it says nothing else: forms and JSON of the desk and the workspace. */
export const DEFAULT_BODY_BYTES = 1024 * 1024

/** Routes that take more than the default; streaming routes pass their own limit. */
const LARGER_BODIES: readonly { path: RegExp, maxBytes: number }[] = [
  { path: /^\/api\/bench-tests\/\d+\/pulls\/(?:preview|import)$/, maxBytes: MAX_IMPORT_BODY_BYTES },
]

export function bodyLimitFor(path: string): number {
  const bare = path.split('?')[0]!
  return LARGER_BODIES.find(r => r.path.test(bare))?.maxBytes ?? DEFAULT_BODY_BYTES
}

function megabytes(bytes: number): string {
  return bytes >= 1024 * 1024 ? `${Math.round(bytes / 1024 / 1024)} MB` : `${Math.round(bytes / 1024)} KB`
}

export function bodyTooLarge(maxBytes: number, what = 'The request'): Error {
  return createError({ statusCode: 413, statusMessage: 'Content Too Large', message: `${what} is larger than ${megabytes(maxBytes)}, the most this address takes. Send less at once.` })
}

// After a refusal the client may still be sending. Closing a socket with unread data
// makes the kernel answer with a reset, which can reach the client before it has read
// our 413, so the rest is read and dropped for a short while (as web servers' lingering
// close does), bounded in time and bytes, and the connection closed after that.
const LINGER_MS = 10_000
const LINGER_BYTES = 64 * 1024 * 1024
const stopped = new WeakSet<object>()

/** Stops taking the body in: nothing more is kept, and the sender is cut off soon after the answer. */
export function stopReadingBody(event: H3Event): void {
  const { req, res } = event.node
  if (stopped.has(req)) return
  stopped.add(req)
  req.unpipe()
  // Paused, the socket stops reading and TCP pushes back on the sender until the answer is out.
  req.pause()
  const linger = () => {
    if (req.complete) return
    let dropped = 0
    const close = () => req.socket?.destroy()
    const timer = setTimeout(close, LINGER_MS)
    timer.unref()
    req.on('data', (chunk: Buffer) => {
      dropped += chunk.length
      if (dropped > LINGER_BYTES) {
        clearTimeout(timer)
        close()
      }
    })
    req.once('end', () => clearTimeout(timer))
    req.resume()
  }
  if (res.writableFinished) linger()
  else res.once('finish', linger)
}

/** The request body as a stream that fails with 413 once more than maxBytes have arrived. */
export function limitedBody(event: H3Event, maxBytes: number): Readable {
  const declared = Number(getRequestHeader(event, 'content-length'))
  if (Number.isFinite(declared) && declared > maxBytes) {
    stopReadingBody(event)
    throw bodyTooLarge(maxBytes)
  }
  const req = event.node.req
  let received = 0
  const counted = new Transform({
    transform(chunk: Buffer, _encoding, done) {
      received += chunk.length
      if (received > maxBytes) {
        stopReadingBody(event)
        done(bodyTooLarge(maxBytes))
        return
      }
      done(null, chunk)
    },
  })
  req.once('aborted', () => counted.destroy(createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The request was cut off before its body ended.' })))
  req.once('error', error => counted.destroy(error))
  req.pipe(counted)
  return counted
}

/** The whole body in one Buffer, at most maxBytes of it (413 past that). */
export async function readLimitedBody(event: H3Event, maxBytes: number): Promise<Buffer> {
  const chunks: Buffer[] = []
  let size = 0
  for await (const chunk of limitedBody(event, maxBytes)) {
    chunks.push(chunk as Buffer)
    size += (chunk as Buffer).length
  }
  return Buffer.concat(chunks, size)
}
