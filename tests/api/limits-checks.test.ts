// Pull checks run in a bounded worker pool: the built server ships the worker, one
// request's rows are capped, and a full pool answers 503 with Retry-After instead of
// queueing without end.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Client } from '../support/http'
import { closeTestDb } from '../support/db'
import { signedIn } from '../support/http'
import { createBenchTest, DEMO, expectOk, newWriter, pullCsv } from '../support/workspace'

afterAll(closeTestDb)

let writer: Client
let benchTestId: number

beforeAll(async () => {
  writer = (await newWriter()).client
  benchTestId = (await createBenchTest(writer, 'Check pool bench test')).id
})

const preview = (files: unknown[]) => writer.post(`/api/bench-tests/${benchTestId}/pulls/preview`, { files })

describe('pull checks in the worker pool', () => {
  it('checks in a worker thread of the built server, with the same answers', async () => {
    const res = await preview([{ name: 'a.csv', text: pullCsv({ seed: 21 }).csv }, { name: 'b.csv', text: 'RPM\n' }])
    expect(res.status).toBe(200)
    expect(res.body.files[0]).toMatchObject({ name: 'a.csv', ok: true, rpmFrom: 3000, rpmTo: 6000 })
    expect(res.body.files[1]).toMatchObject({ name: 'b.csv', ok: false })
    const admin = await signedIn(DEMO.admin)
    expect(expectOk(await admin.get('/api/admin/runtime')).pullChecks.threads).toBeGreaterThanOrEqual(1)
  })

  it('answers a bad body as before: 400 naming the field', async () => {
    const res = await preview([{ name: '', text: 1 }])
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(['files.0.text']))
    const notJson = await writer.request('POST', `/api/bench-tests/${benchTestId}/pulls/preview`, { headers: { 'content-type': 'application/json' }, body: '{"files": [' })
    expect(notJson.status).toBe(400)
  })

  it('caps the rows of one request across its files', async () => {
    const lines = `RPM,Torque (lb-ft)\n${'3000,400\n'.repeat(199_000)}`
    const res = await preview(Array.from({ length: 5 }, (_, i) => ({ name: `rows-${i}.csv`, text: lines })))
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/lines together; one check takes up to 800,000/)
  })

  it('answers 503 with Retry-After when the pool and its queue are full, and recovers', async () => {
    const big = pullCsv({ seed: 22 }).csv
    const text = `${big}${'# padding line for a slower check\n'.repeat(50_000)}`
    const replies = await Promise.all(Array.from({ length: 20 }, (_, i) => preview([{ name: `big-${i}.csv`, text }])))
    const statuses = replies.map(r => r.status)
    expect(statuses.every(s => s === 200 || s === 503)).toBe(true)
    const busy = replies.filter(r => r.status === 503)
    expect(busy.length).toBeGreaterThan(0)
    expect(Number(busy[0]!.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(statuses.filter(s => s === 200).length).toBeGreaterThan(0)
    expect((await preview([{ name: 'after.csv', text: pullCsv({ seed: 23 }).csv }])).status).toBe(200)
  })
})
