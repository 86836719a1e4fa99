// One reader for every request body: bytes are counted as they arrive (chunked bodies
// included, whatever Content-Length claims), and the body is refused with 413 the
// moment it passes its route's limit, before anything past the limit is held.
// server/middleware/02.body-limit.ts hands h3's own readers (readRawBody, and through
// it readBody, readValidatedBody, readMultipartFormData, readFormData) to it; the
// streaming routes (photo and operator uploads) call limitedBody() themselves, and the
// pull checks' large bodies go straight to the worker (readLimitedBodyInto).
import { Transform, type Readable } from 'node:stream'
import type { IncomingMessage } from 'node:http'
import type { MessagePort } from 'node:worker_threads'
import { createError, getRequestHeader, type H3Event } from 'h3'
import { OPERATOR_LINK_LIMITS, PULL_LIMITS } from '../../shared/types/workspace'
import { PHOTO_MAX_BYTES } from '../../shared/types/photos'
import { moveToPort } from './port-bytes'

const KB = 1024
const MB = 1024 * KB

/** Largest JSON body an import takes: 20 files of 5 MB, with room for JSON escaping. */
export const MAX_IMPORT_BODY_BYTES = 60 * MB

/** What any route takes when it says nothing else: forms and JSON of the desk and the workspace. */
export const DEFAULT_BODY_BYTES = MB

/** Multipart boundaries and part headers around the files of one upload. */
const MULTIPART_OVERHEAD = 256 * KB

/**
 * Routes that take another amount than the default, first match wins. The account
 * routes are reached without a session (or with a token in the body), so they take
 * only what their small forms need.
 */
const ROUTE_LIMITS: readonly { path: RegExp, maxBytes: number }[] = [
  { path: /^\/api\/bench-tests\/\d+\/pulls\/(?:preview|import)$/, maxBytes: MAX_IMPORT_BODY_BYTES },
  { path: /^\/api\/bench-tests\/\d+\/photos$/, maxBytes: PHOTO_MAX_BYTES + MULTIPART_OVERHEAD },
  { path: /^\/api\/upload\/[^/]+$/, maxBytes: PULL_LIMITS.maxFilesPerBatch * OPERATOR_LINK_LIMITS.maxFileBytes + MULTIPART_OVERHEAD },
  { path: /^\/api\/(?:auth|_auth)\//, maxBytes: 16 * KB },
]

export function bodyLimitFor(path: string): number {
  const bare = path.split('?')[0]!
  return ROUTE_LIMITS.find(r => r.path.test(bare))?.maxBytes ?? DEFAULT_BODY_BYTES
}

function sizeText(bytes: number): string {
  return bytes >= MB ? `${Math.round(bytes / MB)} MB` : `${Math.round(bytes / KB)} KB`
}

export function bodyTooLarge(maxBytes: number, what = 'The request'): Error {
  return createError({ statusCode: 413, statusMessage: 'Content Too Large', message: `${what} is larger than ${sizeText(maxBytes)}, the most this address takes. Send less at once.` })
}

// After an answer given before the body ended (a refusal, a route that never reads
// it) the client may still be sending. Closing a socket with unread data makes the
// kernel answer with a reset, which can reach the client before it has read the
// answer; so the rest is read and dropped (as web servers' lingering close does),
// bounded in time and bytes, and only then is the connection closed.
const LINGER_MS = 30_000
const LINGER_BYTES = 64 * MB

const taken = new WeakSet<IncomingMessage>()
const lingering = new WeakSet<IncomingMessage>()

/** Drops what is left of the body once the answer is out; closes the connection past the bounds. */
export function lingerAfterAnswer(event: H3Event): void {
  const { req, res } = event.node
  if (lingering.has(req)) return
  lingering.add(req)
  const linger = () => {
    if (req.complete || req.destroyed) return
    // Node keeps the connection open for the next request; this one's body is not worth waiting for.
    let dropped = 0
    const close = () => req.socket?.destroy()
    const timer = setTimeout(close, LINGER_MS)
    timer.unref()
    req.unpipe()
    req.on('data', (chunk: Buffer) => {
      dropped += chunk.length
      if (dropped > LINGER_BYTES) {
        clearTimeout(timer)
        close()
      }
    })
    req.once('end', () => clearTimeout(timer))
    req.once('close', () => clearTimeout(timer))
    req.resume()
  }
  if (res.writableFinished) linger()
  else res.once('finish', linger)
}

/** Stops taking the body in: nothing more is kept; the rest is dropped after the answer. */
export function stopReadingBody(event: H3Event): void {
  const req = event.node.req
  req.unpipe()
  // Paused, the socket stops reading and TCP pushes back on the sender until the answer is out.
  req.pause()
  lingerAfterAnswer(event)
}

/**
 * The request body as a stream that fails with 413 once more than maxBytes have
 * arrived (at once when Content-Length already says so). A body is read once.
 */
export function limitedBody(event: H3Event, maxBytes = bodyLimitFor(event.path)): Readable {
  const req = event.node.req
  if (taken.has(req)) throw new Error('The request body was already taken by another reader.')
  taken.add(req)
  const declared = Number(getRequestHeader(event, 'content-length'))
  if (Number.isFinite(declared) && declared > maxBytes) {
    stopReadingBody(event)
    throw bodyTooLarge(maxBytes)
  }
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
  const cutOff = () => {
    if (!req.complete) counted.destroy(createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The request was cut off before its body ended.' }))
  }
  req.once('aborted', cutOff)
  req.once('error', error => counted.destroy(error))
  req.pipe(counted)
  return counted
}

/** The whole body in one Buffer, at most maxBytes of it (413 past that). */
export async function readLimitedBody(event: H3Event, maxBytes = bodyLimitFor(event.path)): Promise<Buffer> {
  const chunks: Buffer[] = []
  let size = 0
  for await (const chunk of limitedBody(event, maxBytes)) {
    chunks.push(chunk as Buffer)
    size += (chunk as Buffer).length
  }
  return Buffer.concat(chunks, size)
}

/**
 * The whole body, at most maxBytes (413 past that), moved chunk by chunk as it arrives
 * into `port`'s queue (moveToPort, server/utils/port-bytes.ts): the other end of the
 * channel goes to a worker thread, which takes and joins the chunks there. Nothing of
 * the body is copied, joined or kept on this thread; keeping 60 MB of pieces here until
 * the body ended made the garbage collector stop the event loop for over 100 ms.
 * Returns the number of bytes received.
 */
export async function readLimitedBodyInto(event: H3Event, port: MessagePort, maxBytes = bodyLimitFor(event.path)): Promise<number> {
  let size = 0
  for await (const chunk of limitedBody(event, maxBytes)) {
    size += (chunk as Buffer).length
    moveToPort(port, chunk as Buffer)
  }
  return size
}

/** True when nothing of this request's body was read by the limited reader. */
export function bodyUntouched(event: H3Event): boolean {
  return !taken.has(event.node.req)
}
