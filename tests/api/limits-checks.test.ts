// Pull checks run in a bounded worker pool: the built server ships the worker, one
// request's rows are capped, and a full pool answers 503 with Retry-After instead of
// queueing without end.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { signedIn } from '../support/http'
import { createBenchTest, createSetup, DEMO, expectOk, newWriter, pullCsv, uploadFiles } from '../support/workspace'

afterAll(closeTestDb)

let writer: Client
let benchTestId: number
let setupId: number

beforeAll(async () => {
  writer = (await newWriter()).client
  benchTestId = (await createBenchTest(writer, 'Check pool bench test')).id
  setupId = (await createSetup(writer, benchTestId, 'Pool baseline')).id
})

const preview = (files: unknown[]) => writer.post(`/api/bench-tests/${benchTestId}/pulls/preview`, { files })
const importing = (files: { name: string, text: string }[]) => writer.post(`/api/bench-tests/${benchTestId}/pulls/import`, { files: files.map(f => ({ ...f, setupId, weather: null, dynoCorrected: true })) })
const savedPulls = async () => Number((await testDb()('pulls').where({ bench_test_id: benchTestId }).count({ n: '*' }).first())!.n)

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

  it('imports through the pool: saved pulls, the same 400 and 422 answers, the rows cap', async () => {
    const pull = pullCsv({ seed: 24 })
    const saved = expectOk(await importing([{ name: 'pooled.csv', text: pull.csv }]), 201)
    expect(saved.pulls[0]).toMatchObject({ fileName: 'pooled.csv' })
    const row = await testDb()('pulls').where({ id: saved.pulls[0].id }).first('point_count', 'points', 'original_text')
    expect(row.point_count).toBe(pull.points.length)
    expect(JSON.parse(row.points).rpm).toHaveLength(pull.points.length)
    expect(row.original_text).toBe(pull.csv)
    const before = await savedPulls()
    const bad = await writer.post(`/api/bench-tests/${benchTestId}/pulls/import`, { files: [{ name: 'nameless-setup.csv', text: pull.csv, weather: null, dynoCorrected: true }] })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues).toContainEqual(expect.objectContaining({ path: 'files.0.setupId', message: expect.stringMatching(/^nameless-setup\.csv: /) }))
    const broken = await importing([{ name: 'broken.csv', text: 'RPM,Torque (lb-ft)\n3000,400\n\u0000' }])
    expect(broken.status).toBe(422)
    expect(broken.body.message).toMatch(/Nothing was saved: 1 of 1 file has errors\. broken\.csv, line 3: the file holds NUL bytes/)
    expect(broken.body.data.files[0]).toMatchObject({ name: 'broken.csv', ok: false })
    const lines = `RPM,Torque (lb-ft)\n${'3000,400\n'.repeat(199_000)}`
    const many = await importing(Array.from({ length: 5 }, (_, i) => ({ name: `rows-${i}.csv`, text: lines })))
    expect(many.status).toBe(413)
    expect(await savedPulls()).toBe(before)
  })

  it('answers an import 503 with Retry-After when the pool is full, saving nothing for it', async () => {
    const text = `${pullCsv({ seed: 25 }).csv}${'# padding line for a slower check\n'.repeat(50_000)}`
    const before = await savedPulls()
    const replies = await Promise.all(Array.from({ length: 20 }, (_, i) => importing([{ name: `busy-${i}.csv`, text }])))
    const statuses = replies.map(r => r.status)
    expect(statuses.every(s => s === 201 || s === 503)).toBe(true)
    const busy = replies.filter(r => r.status === 503)
    expect(busy.length).toBeGreaterThan(0)
    expect(Number(busy[0]!.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(await savedPulls()).toBe(before + statuses.filter(s => s === 201).length)
  })

  it('checks stored files in the pool too: the operator\'s upload, the inbox assignment and the dyno day\'s filing, with the rows cap', async () => {
    const admin = await signedIn(DEMO.admin)
    const sent = async () => expectOk(await admin.get('/api/admin/runtime')).pullChecks.sent as Record<string, number>
    const token = expectOk(await writer.post(`/api/bench-tests/${benchTestId}/operator-links`, { expiresInHours: 2 }), 201).token as string
    const before = await sent()

    expectOk(await uploadFiles(token, [{ name: 'inbox-1.csv', text: pullCsv({ seed: 26 }).csv }]), 201)
    const entry = expectOk(await writer.get(`/api/bench-tests/${benchTestId}/inbox`)).files.find((f: { fileName: string }) => f.fileName === 'inbox-1.csv')
    const assigned = expectOk(await writer.post(`/api/bench-tests/${benchTestId}/inbox/assign`, { items: [{ fileId: entry.id, setupId, weather: null, dynoCorrected: true }] }), 201)
    expect(assigned.pulls[0]).toMatchObject({ fileName: 'inbox-1.csv', setupId })
    const afterAssign = await sent()
    // The upload's files go to the worker as they arrive and are joined there ('upload-files').
    expect(afterAssign['upload-files']).toBe(before['upload-files']! + 1)
    expect(afterAssign['batch-files']).toBe(before['batch-files']! + 1)

    // A running day files a good file with its weather straight into the current step, checked in the pool.
    const plan = `/api/bench-tests/${benchTestId}/plan`
    const saved = expectOk(await writer.request('PUT', plan, { json: { version: 0, acceptance: { rpmFrom: 3000, rpmTo: 6000, coolantF: null, oilF: null, airTempF: null, baroInHg: null, repeatPct: 1 }, steps: [{ setupId, partsChange: '', swapMinutes: null, plannedPulls: 2, checklist: [] }] } })).plan
    expectOk(await writer.post(`${plan}/day`, { action: 'start', stepId: saved.steps[0].id }))
    const filed = expectOk(await uploadFiles(token, [{ name: 'day-1.csv', text: pullCsv({ seed: 27 }).csv }]), 201)
    expect(filed.received[0].filedTo).toBe('Pool baseline')
    const afterDay = await sent()
    expect(afterDay['upload-files']).toBe(afterAssign['upload-files']! + 1)
    expect(afterDay['batch-files']).toBe(afterAssign['batch-files']! + 1)

    // The operator's upload has the same rows cap as a writer's check.
    const lines = `RPM,Torque (lb-ft)\n${'3000,400\n'.repeat(199_000)}`
    const many = await uploadFiles(token, Array.from({ length: 5 }, (_, i) => ({ name: `op-rows-${i}.csv`, text: lines })))
    expect(many.status).toBe(413)
    expect(many.body.message).toMatch(/lines together; one check takes up to 800,000/)
  })
})
