// The per-server cap on concurrent pull checks (issue 14, item 2): when the check pool's
// threads are busy and its queue is full (PULL_CHECK_THREADS, PULL_CHECK_QUEUE), the
// inbox's "check again" (POST .../inbox/<file>/preview) answers 503 with a message
// saying so and Retry-After, as the other check routes do, and checks again once the
// queue has room.
import { afterAll, describe, expect, it } from 'vitest'
import { sleep } from '../../scripts/lib/proc'
import { signedIn } from '../support/http'
import { closeTestDb } from '../support/db'
import { DEMO, createBenchTest, expectOk, newWriter, pullCsv, uploadFiles } from '../support/workspace'

afterAll(closeTestDb)

describe('the cap on concurrent pull checks', () => {
  it('answers the inbox preview 503 with Retry-After while the pool is full, and 200 after', async () => {
    const writer = (await newWriter()).client
    const admin = await signedIn(DEMO.admin)
    const benchTestId = (await createBenchTest(writer, 'Check cap bench test')).id
    const token = expectOk(await writer.post(`/api/bench-tests/${benchTestId}/operator-links`, { expiresInHours: 2 }), 201).token as string
    expectOk(await uploadFiles(token, [{ name: 'waiting.csv', text: pullCsv({ seed: 41 }).csv }]), 201)
    const file = expectOk(await writer.get(`/api/bench-tests/${benchTestId}/inbox`)).files[0] as { id: number }
    const checkAgain = () => writer.post(`/api/bench-tests/${benchTestId}/inbox/${file.id}/preview`, {})
    expect((await checkAgain()).status).toBe(200)

    // Twenty slow checks at once: one runs, eight wait (the default queue), the rest are refused.
    const text = `${pullCsv({ seed: 42 }).csv}${'# padding line for a slower check\n'.repeat(100_000)}`
    let settled = 0
    const slow = Array.from({ length: 20 }, (_, i) => writer.post(`/api/bench-tests/${benchTestId}/pulls/preview`, { files: [{ name: `slow-${i}.csv`, text }] }).finally(() => { settled++ }))
    const until = Date.now() + 60_000
    let queued = 0
    while (settled < 20 && Date.now() < until) {
      queued = expectOk(await admin.get('/api/admin/runtime')).pullChecks.queued as number
      if (queued >= 8) break
      await sleep(20)
    }
    expect(queued).toBe(8)

    // The queue drains as the one thread finishes checks: a check asked the moment a place
    // came free is taken (200). Ask until one meets the full queue, while the slow ones last.
    let busy = await checkAgain()
    for (let i = 0; i < 40 && busy.status !== 503 && settled < 20; i++) {
      await sleep(25)
      busy = await checkAgain()
    }
    expect(busy.status).toBe(503)
    expect(busy.body.message).toMatch(/checking as many files as it can right now\. Try again in a few seconds/)
    expect(Number(busy.headers.get('retry-after'))).toBeGreaterThan(0)

    expect((await Promise.all(slow)).every(r => r.status === 200 || r.status === 503)).toBe(true)
    expect(expectOk(await checkAgain()).preview).toMatchObject({ name: 'waiting.csv', ok: true })
  }, 120_000)
})
