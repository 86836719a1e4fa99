// readLimitedBodySegments (server/utils/body-limit.ts): a body is copied into pieces of
// their own as it arrives, so the pull-check worker can take them without one long
// join on the server's thread (issue 14, item 2).
import { IncomingMessage, ServerResponse } from 'node:http'
import { Socket } from 'node:net'
import { createEvent } from 'h3'
import { describe, expect, it } from 'vitest'
import { BODY_SEGMENT_BYTES, readLimitedBodySegments } from '../../../server/utils/body-limit'

function requestWith(chunks: Buffer[]) {
  const req = new IncomingMessage(new Socket())
  req.method = 'POST'
  req.url = '/api/bench-tests/1/pulls/preview'
  req.headers = { 'content-type': 'application/json', 'transfer-encoding': 'chunked' }
  setImmediate(() => {
    for (const c of chunks) req.push(c)
    req.complete = true // as Node's HTTP parser marks a body that ended
    req.push(null)
  })
  return createEvent(req, new ServerResponse(req))
}

describe('readLimitedBodySegments', () => {
  it('keeps every byte in order, in pieces of their own no larger than a segment', async () => {
    const chunks = [Buffer.alloc(700_000, 1), Buffer.alloc(700_000, 2), Buffer.from('tail')]
    const pieces = await readLimitedBodySegments(requestWith(chunks), 4 * BODY_SEGMENT_BYTES)
    expect(pieces.map(p => p.length)).toEqual([BODY_SEGMENT_BYTES, 1_400_004 - BODY_SEGMENT_BYTES])
    for (const p of pieces) {
      // Each piece owns its whole buffer, so it can be moved to a worker without touching another.
      expect([p.byteOffset, p.buffer.byteLength]).toEqual([0, p.length])
    }
    expect(Buffer.concat(pieces).equals(Buffer.concat(chunks))).toBe(true)
  })

  it('answers 413 once the bytes received pass the limit, whatever the headers say', async () => {
    await expect(readLimitedBodySegments(requestWith([Buffer.alloc(600_000), Buffer.alloc(600_000)]), 1_000_000)).rejects.toMatchObject({ statusCode: 413 })
  })

  it('gives no pieces for an empty body', async () => {
    expect(await readLimitedBodySegments(requestWith([]), 1000)).toEqual([])
  })
})
