// Reset requests and registrations answer before any work that depends on the address
// (issue 14, item 3): afterAnswer (server/services/accounts/after-answer.ts) starts the work only
// once the response has finished. tests/api/limits-accounts.test.ts checks the routes.
import { EventEmitter } from 'node:events'
import type { H3Event } from 'h3'
import { describe, expect, it, vi } from 'vitest'
import { AFTER_ANSWER_FALLBACK_MS, afterAnswer } from '../../../server/services/accounts/after-answer'

function fakeEvent(finished = false) {
  const res = Object.assign(new EventEmitter(), { writableFinished: finished })
  const waited: Promise<unknown>[] = []
  const event = { node: { res }, waitUntil: (p: Promise<unknown>) => waited.push(p) } as unknown as H3Event
  return { event, res, waited }
}

const ticks = async (n = 5) => {
  for (let i = 0; i < n; i++) await new Promise(r => setImmediate(r))
}

describe('afterAnswer', () => {
  it('does not start the work until the response has finished, and keeps the server waiting for it', async () => {
    const { event, res, waited } = fakeEvent()
    const work = vi.fn(async () => {})
    afterAnswer(event, 'test', work)
    await ticks()
    expect(work).not.toHaveBeenCalled()
    expect(waited).toHaveLength(1)
    res.emit('finish')
    await waited[0]
    expect(work).toHaveBeenCalledTimes(1)
  })

  it('starts when the asker hung up, or at once when the answer is already out', async () => {
    const closed = fakeEvent()
    const a = vi.fn(async () => {})
    afterAnswer(closed.event, 'test', a)
    closed.res.emit('close')
    closed.res.emit('finish')
    await closed.waited[0]
    expect(a).toHaveBeenCalledTimes(1)

    const done = fakeEvent(true)
    const b = vi.fn(async () => {})
    afterAnswer(done.event, 'test', b)
    await done.waited[0]
    expect(b).toHaveBeenCalledTimes(1)
  })

  it('starts after the fallback when a response never reports its end, and logs a failure instead of throwing', async () => {
    vi.useFakeTimers()
    try {
      const { event, waited } = fakeEvent()
      const log = vi.spyOn(console, 'error').mockImplementation(() => {})
      const work = vi.fn(async () => { throw new Error('mail down') })
      afterAnswer(event, 'test', work)
      await vi.advanceTimersByTimeAsync(AFTER_ANSWER_FALLBACK_MS - 1)
      expect(work).not.toHaveBeenCalled()
      await vi.advanceTimersByTimeAsync(1)
      await waited[0]
      expect(work).toHaveBeenCalledTimes(1)
      expect(log).toHaveBeenCalledWith(expect.stringMatching(/test failed: mail down/))
      log.mockRestore()
    }
    finally { vi.useRealTimers() }
  })
})
