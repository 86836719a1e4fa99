// The per-server cap on concurrent pull checks (issue 14, item 2): a server whose check
// threads are all busy and whose queue is full answers the inbox's "check again"
// (POST .../inbox/<file>/preview) 503 with a message saying so and Retry-After, as the
// account limiter's and the other check routes' refusals do, and checks again once the
// thread is free. A second server with one check thread and no queue makes "full"
// certain instead of racing many requests.
import type { ChildProcess } from 'node:child_process'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp } from '../../scripts/lib/app'
import { localEnv } from '../../scripts/lib/env'
import { killGroup, sleep } from '../../scripts/lib/proc'
import { Client, spareAppPort, testServerExtra } from '../support/http'
import { closeTestDb } from '../support/db'
import { DEMO, expectOk, pullCsv, uploadFiles } from '../support/workspace'

const PORT = spareAppPort(4)
const BASE = `http://127.0.0.1:${PORT}`
let server: ChildProcess | undefined

beforeAll(async () => {
  server = await startApp(localEnv('test'), { ...testServerExtra(), PULL_CHECK_THREADS: '1', PULL_CHECK_QUEUE: '0' }, PORT)
}, 60_000)

afterAll(async () => {
  if (server) await killGroup(server)
  await closeTestDb()
})

async function signedInThere(email: string): Promise<Client> {
  const client = new Client(BASE)
  expectOk(await client.post('/api/auth/login', { email, password: 'pullsheet-demo' }))
  return client
}

describe('the cap on concurrent pull checks', () => {
  it('answers the inbox preview 503 with Retry-After while the only check thread is busy, and 200 after', async () => {
    const writer = await signedInThere(DEMO.writer)
    const admin = await signedInThere(DEMO.admin)
    const benchTestId = expectOk(await writer.post('/api/bench-tests', { title: 'Check cap bench test (fictional)', engineFamily: 'pushrod-v8', partType: 'camshaft' }), 201).benchTest.id as number
    const token = expectOk(await writer.post(`/api/bench-tests/${benchTestId}/operator-links`, { expiresInHours: 2 }), 201).token as string
    expectOk(await uploadFiles(token, [{ name: 'waiting.csv', text: pullCsv({ seed: 41 }).csv }], BASE), 201)
    const file = expectOk(await writer.get(`/api/bench-tests/${benchTestId}/inbox`)).files[0] as { id: number }
    const checkAgain = () => writer.post(`/api/bench-tests/${benchTestId}/inbox/${file.id}/preview`, {})
    expect((await checkAgain()).status).toBe(200)

    // Four files of about 173,000 rows keep the one thread busy for seconds.
    const sentBefore = expectOk(await admin.get('/api/admin/runtime')).pullChecks.sent['preview-body'] as number
    const files = Array.from({ length: 4 }, (_, i) => ({ name: `long-${i}.csv`, text: pullCsv({ fromRpm: 2000, toRpm: 6500, stepRpm: 0.026, seed: 50 + i }).csv }))
    const long = writer.post(`/api/bench-tests/${benchTestId}/pulls/preview`, { files })
    // The long check is on the thread once the server has handed it to the pool.
    for (let i = 0; i < 200; i++) {
      if (expectOk(await admin.get('/api/admin/runtime')).pullChecks.sent['preview-body'] > sentBefore) break
      await sleep(50)
    }

    const busy = await checkAgain()
    expect(busy.status).toBe(503)
    expect(busy.body.message).toMatch(/checking as many files as it can right now\. Try again in a few seconds/)
    expect(Number(busy.headers.get('retry-after'))).toBeGreaterThan(0)

    expect((await long).status).toBe(200)
    const again = expectOk(await checkAgain())
    expect(again.preview).toMatchObject({ name: 'waiting.csv', ok: true })
  }, 120_000)
})
