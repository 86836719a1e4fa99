import { describe, expect, it } from 'vitest'
import { sharedProbe } from '../../../server/utils/shared-probe'

function countingProbe(answers: boolean[]) {
  let calls = 0
  let release: () => void = () => {}
  const probe = () => new Promise<boolean>((resolve) => {
    const answer = answers[calls++] ?? true
    release = () => resolve(answer)
  })
  return { probe, calls: () => calls, release: () => release() }
}

describe('sharedProbe (the health endpoint\'s storage and mail probes)', () => {
  it('runs one probe for callers that arrive while it runs', async () => {
    const counting = countingProbe([true])
    const shared = sharedProbe(counting.probe, 5000)
    const waiting = Array.from({ length: 20 }, () => shared())
    expect(counting.calls()).toBe(1)
    counting.release()
    const results = await Promise.all(waiting)
    expect(new Set(results.map(r => r.checkedAt)).size).toBe(1)
    expect(results.every(r => r.ok)).toBe(true)
  })

  it('keeps an answer for maxAge, then asks again and reports the new one', async () => {
    let clock = 1_000_000
    const counting = countingProbe([true, false])
    const shared = sharedProbe(counting.probe, 5000, () => clock)
    const first = shared()
    counting.release()
    expect(await first).toEqual({ ok: true, checkedAt: new Date(1_000_000).toISOString() })
    clock += 4999
    expect((await shared()).ok).toBe(true)
    expect(counting.calls()).toBe(1)
    clock += 1
    const second = shared()
    expect(counting.calls()).toBe(2)
    counting.release()
    expect(await second).toEqual({ ok: false, checkedAt: new Date(1_005_000).toISOString() })
  })

  it('turns a probe that throws into a down part instead of an error', async () => {
    const shared = sharedProbe(() => Promise.reject(new Error('refused')), 5000)
    expect((await shared()).ok).toBe(false)
  })
})
