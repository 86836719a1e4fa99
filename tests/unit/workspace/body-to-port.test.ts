// readLimitedBodyInto (server/utils/body-limit.ts) and the port helpers
// (server/utils/port-bytes.ts): a pull check's body is moved, chunk by chunk as it
// arrives, into a MessagePort's queue for the worker, which takes it whole; nothing of
// it stays with the server's thread (issue 14, item 2).
import { IncomingMessage, ServerResponse } from 'node:http'
import { Socket } from 'node:net'
import { MessageChannel } from 'node:worker_threads'
import { createEvent } from 'h3'
import { describe, expect, it } from 'vitest'
import { readLimitedBodyInto } from '../../../server/utils/body-limit'
import { moveToPort, takeFromPort } from '../../../server/utils/port-bytes'

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

/** A chunk on an ArrayBuffer of its own, as Node's HTTP parser gives each body chunk. */
const own = (size: number, fill: number) => Buffer.from(new Uint8Array(size).fill(fill).buffer)

describe('readLimitedBodyInto', () => {
  it('moves every byte in order into the port, leaving the chunks here empty', async () => {
    const chunks = [own(700_000, 1), own(700_000, 2), own(4, 3)]
    const expected = Buffer.concat(chunks)
    const { port1, port2 } = new MessageChannel()
    expect(await readLimitedBodyInto(requestWith(chunks), port1, 4_000_000)).toBe(1_400_004)
    // Moved, not copied: the server's chunks are detached.
    expect(chunks.map(c => c.length)).toEqual([0, 0, 0])
    port1.close()
    expect(Buffer.concat(takeFromPort(port2)).equals(expected)).toBe(true)
  })

  it('answers 413 once the bytes received pass the limit, whatever the headers say', async () => {
    const { port1 } = new MessageChannel()
    await expect(readLimitedBodyInto(requestWith([own(600_000, 1), own(600_000, 2)]), port1, 1_000_000)).rejects.toMatchObject({ statusCode: 413 })
    port1.close()
  })

  it('moves nothing for an empty body', async () => {
    const { port1, port2 } = new MessageChannel()
    expect(await readLimitedBodyInto(requestWith([]), port1, 1000)).toBe(0)
    expect(takeFromPort(port2)).toEqual([])
    port1.close()
  })
})

describe('moveToPort', () => {
  it('copies a view into a larger buffer, leaving the rest of that buffer alone', () => {
    const whole = Buffer.from(new Uint8Array([1, 2, 3, 4, 5, 6]).buffer)
    const { port1, port2 } = new MessageChannel()
    moveToPort(port1, whole.subarray(2, 4))
    expect([...whole]).toEqual([1, 2, 3, 4, 5, 6])
    expect(takeFromPort(port2).map(p => [...p])).toEqual([[3, 4]])
    port1.close()
  })
})
