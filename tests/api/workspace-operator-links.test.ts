// The operator's upload link: no account, one bench test's inbox, nothing else;
// expiring, revocable, size and rate limited. Then the writer assigns the files.
import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { createBenchTest, createSetup, expectOk, newWriter, pullCsv, uploadFiles } from '../support/workspace'

afterAll(closeTestDb)

let writer: Client
let bt: { id: number, title: string }
let setup: number

beforeAll(async () => {
  writer = (await newWriter()).client
  bt = await createBenchTest(writer, 'Operator link bench test')
  setup = (await createSetup(writer, bt.id, 'Baseline')).id
})

async function newLink(body: Record<string, unknown> = { expiresInHours: 2 }, benchTestId = bt.id) {
  return expectOk(await writer.post(`/api/bench-tests/${benchTestId}/operator-links`, body), 201)
}

const inboxCount = async (linkId: number) => Number((await testDb()('inbox_files').where({ operator_link_id: linkId }).count({ n: '*' }).first())?.n)
const good = (seed: number) => ({ name: `pull-${seed}.csv`, text: pullCsv({ seed }).csv })
const weather = { baroInHg: 29.6, airTempF: 72, humidityPct: 40 }

describe('operator links', () => {
  it('shows the token once and stores only its SHA-256', async () => {
    const created = await newLink({ label: 'Cell 2', expiresInHours: 48, maxFiles: 10 })
    expect(created.token).toMatch(/^[\w-]{43}$/)
    expect(created.url).toMatch(new RegExp(`/upload/${created.token}$`))
    expect(created.link).toMatchObject({ label: 'Cell 2', state: 'active', maxFiles: 10, maxFileBytes: 5 * 1024 * 1024, filesReceived: 0 })
    const hours = (new Date(created.link.expiresAt).getTime() - Date.now()) / 3_600_000
    expect(hours).toBeGreaterThan(47.9)
    expect(hours).toBeLessThan(48.1)
    const row = await testDb()('operator_links').where({ id: created.link.id }).first()
    expect(row.token_hash).toBe(createHash('sha256').update(created.token).digest('hex'))
    expect(JSON.stringify(row)).not.toContain(created.token)
    const list = expectOk(await writer.get(`/api/bench-tests/${bt.id}/operator-links`)).links
    expect(list.find((l: any) => l.id === created.link.id)).not.toHaveProperty('token')
  })

  it('tells the operator only the bench test title and the limits', async () => {
    const { token } = await newLink()
    const res = await new Client().get(`/api/upload/${token}`)
    expect(res.status).toBe(200)
    expect(Object.keys(res.body).sort()).toEqual(['benchTestTitle', 'expiresAt', 'filesLeft', 'maxFileBytes', 'rate'])
    expect(res.body).toMatchObject({ benchTestTitle: bt.title, filesLeft: 100, rate: { files: 30, minutes: 10 } })
    expect((await new Client().get(`/api/upload/${'x'.repeat(43)}`)).status).toBe(404)
    expect((await new Client().get('/api/upload/short')).status).toBe(404)
  })

  it('takes files without an account into the inbox, checked by the same parser', async () => {
    const { token, link } = await newLink()
    const res = await uploadFiles(token, [good(1), { name: 'C:\\dyno\\notes.csv', text: 'not a pull at all\n' }])
    expect(res.status).toBe(201)
    expect(res.body.received).toEqual([
      { name: 'pull-1.csv', sizeBytes: Buffer.byteLength(good(1).text), ok: true, problemCount: 0 },
      expect.objectContaining({ name: 'notes.csv', ok: false }),
    ])
    const inbox = expectOk(await writer.get(`/api/bench-tests/${bt.id}/inbox?state=waiting`)).files.filter((f: any) => f.link.id === link.id)
    expect(inbox.map((f: any) => f.fileName).sort()).toEqual(['notes.csv', 'pull-1.csv'])
    const notes = inbox.find((f: any) => f.fileName === 'notes.csv')
    expect(notes.preview.problems[0].text).toMatch(/^notes\.csv, line 1: /)
    expect(inbox.find((f: any) => f.fileName === 'pull-1.csv').preview).toMatchObject({ ok: true, rpmFrom: 3000, rpmTo: 6000 })
  })

  it('gives no other access: the token opens nothing else', async () => {
    const { token } = await newLink()
    const anon = new Client()
    for (const path of [`/api/bench-tests/${bt.id}`, `/api/bench-tests/${bt.id}/inbox`, `/api/bench-tests/${bt.id}/pulls`, '/api/bench-tests']) {
      expect((await anon.get(path)).status).toBe(401)
      const withToken = await anon.request('GET', path, { headers: { authorization: `Bearer ${token}`, cookie: `pullsheet-session=${token}` } })
      expect(withToken.status).toBe(401)
    }
    const res = await uploadFiles(token, [good(2)])
    expect(JSON.stringify(res.body)).not.toMatch(new RegExp(`"benchTestId"|"id"|${bt.title}`))
  })

  it('refuses a file over 5 MB, naming it, and keeps nothing of that upload', async () => {
    const { token, link } = await newLink()
    const big = { name: 'huge.csv', text: `${good(3).text}# ${'x'.repeat(5 * 1024 * 1024)}\n` }
    const res = await uploadFiles(token, [good(4), big])
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/^huge\.csv is larger than 5 MB; files up to 5 MB are accepted/)
    expect(await inboxCount(link.id)).toBe(0)
  })

  it('takes at most 30 files per 10 minutes per link, counted in the database', async () => {
    const { token, link } = await newLink()
    const small = (n: number) => Array.from({ length: n }, (_, i) => ({ name: `f${i}.csv`, text: 'RPM,Torque (lb-ft)\n3000,400\n' }))
    expect((await uploadFiles(token, small(20))).status).toBe(201)
    expect((await uploadFiles(token, small(10))).status).toBe(201)
    const refused = await uploadFiles(token, small(1))
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(refused.body.message).toMatch(/at most 30 files per 10 minutes/)
    expect(await inboxCount(link.id)).toBe(30)
    // Files received more than 10 minutes ago no longer count.
    await testDb()('inbox_files').where({ operator_link_id: link.id }).update({ received_at: testDb().raw('NOW(3) - INTERVAL 11 MINUTE') })
    expect((await uploadFiles(token, small(1))).status).toBe(201)
  })

  it('stops working once expired (410)', async () => {
    const { token, link } = await newLink()
    await testDb()('operator_links').where({ id: link.id }).update({ expires_at: testDb().raw('NOW(3) - INTERVAL 1 MINUTE') })
    expect((await new Client().get(`/api/upload/${token}`)).status).toBe(410)
    const res = await uploadFiles(token, [good(5)])
    expect(res.status).toBe(410)
    expect(res.body.message).toMatch(/expired/)
    expect(await inboxCount(link.id)).toBe(0)
    const listed = expectOk(await writer.get(`/api/bench-tests/${bt.id}/operator-links`)).links.find((l: any) => l.id === link.id)
    expect(listed.state).toBe('expired')
  })

  it('stops working once revoked (410)', async () => {
    const { token, link } = await newLink()
    expect((await uploadFiles(token, [good(6)])).status).toBe(201)
    const revoked = expectOk(await writer.post(`/api/bench-tests/${bt.id}/operator-links/${link.id}/revoke`)).link
    expect(revoked.state).toBe('revoked')
    expect(revoked.revokedAt).not.toBeNull()
    expect((await new Client().get(`/api/upload/${token}`)).status).toBe(410)
    expect((await uploadFiles(token, [good(7)])).status).toBe(410)
    expect(await inboxCount(link.id)).toBe(1)
  })

  it('stops after its file allowance, and when its bench test is deleted', async () => {
    const { token } = await newLink({ expiresInHours: 1, maxFiles: 2 })
    expect((await uploadFiles(token, [good(8), good(9)])).status).toBe(201)
    expect((await uploadFiles(token, [good(10)])).status).toBe(410)
    const other = await createBenchTest(writer)
    const second = await newLink({ expiresInHours: 1 }, other.id)
    expectOk(await writer.delete(`/api/bench-tests/${other.id}`))
    expect((await uploadFiles(second.token, [good(11)])).status).toBe(410)
  })
})

describe('inbox', () => {
  it('assigns a file to a setup through the import path, once', async () => {
    const { token, link } = await newLink({ label: 'Assign test', expiresInHours: 2 })
    const file = good(21)
    expectOk(await uploadFiles(token, [file]), 201)
    const entry = expectOk(await writer.get(`/api/bench-tests/${bt.id}/inbox`)).files.find((f: any) => f.link.id === link.id)
    const res = await writer.post(`/api/bench-tests/${bt.id}/inbox/assign`, { items: [{ fileId: entry.id, setupId: setup, weather }] })
    const [pull] = expectOk(res, 201).pulls
    expect(pull).toMatchObject({ fileName: 'pull-21.csv', setupId: setup, weather, uploadedBy: { kind: 'operator-link', linkId: link.id, label: 'Assign test' } })
    const original = await writer.get(`/api/bench-tests/${bt.id}/pulls/${pull.id}/file`)
    expect(original.body).toBe(file.text)
    const after = expectOk(await writer.get(`/api/bench-tests/${bt.id}/inbox?state=assigned`)).files.find((f: any) => f.id === entry.id)
    expect(after.assignedPullId).toBe(pull.id)
    const again = await writer.post(`/api/bench-tests/${bt.id}/inbox/assign`, { items: [{ fileId: entry.id, setupId: setup, weather }] })
    expect(again.status).toBe(409)
  })

  it('refuses a batch with a bad file, naming it, and saves none of it', async () => {
    const { token, link } = await newLink()
    expectOk(await uploadFiles(token, [good(22), { name: 'bad.csv', text: 'RPM,Torque (lb-ft)\n3000,abc\n' }]), 201)
    const files = expectOk(await writer.get(`/api/bench-tests/${bt.id}/inbox`)).files.filter((f: any) => f.link.id === link.id)
    const before = Number((await testDb()('pulls').where({ bench_test_id: bt.id }).count({ n: '*' }).first())?.n)
    const res = await writer.post(`/api/bench-tests/${bt.id}/inbox/assign`, { items: files.map((f: any) => ({ fileId: f.id, setupId: setup, weather })) })
    expect(res.status).toBe(422)
    expect(res.body.message).toMatch(/bad\.csv, line 2, column "Torque \(lb-ft\)": "abc"/)
    expect(Number((await testDb()('pulls').where({ bench_test_id: bt.id }).count({ n: '*' }).first())?.n)).toBe(before)
    expect(expectOk(await writer.get(`/api/bench-tests/${bt.id}/inbox?state=waiting`)).files.filter((f: any) => f.link.id === link.id)).toHaveLength(2)
    const bad = files.find((f: any) => f.fileName === 'bad.csv')
    const dismissed = expectOk(await writer.post(`/api/bench-tests/${bt.id}/inbox/${bad.id}/dismiss`)).file
    expect(dismissed.state).toBe('dismissed')
  })

  it('previews a stored file again with a column mapping', async () => {
    const { token, link } = await newLink()
    const text = pullCsv({ seed: 23 }).csv.replace('RPM,', 'Crank speed,')
    expectOk(await uploadFiles(token, [{ name: 'mapme.csv', text }]), 201)
    const entry = expectOk(await writer.get(`/api/bench-tests/${bt.id}/inbox`)).files.find((f: any) => f.link.id === link.id)
    expect(entry.preview.ok).toBe(false)
    expect(entry.preview.unrecognisedHeaders).toContain('Crank speed')
    const { preview } = expectOk(await writer.post(`/api/bench-tests/${bt.id}/inbox/${entry.id}/preview`, { mapping: { 'Crank speed': 'rpm' } }))
    expect(preview.ok).toBe(true)
    const [pull] = expectOk(await writer.post(`/api/bench-tests/${bt.id}/inbox/assign`, { items: [{ fileId: entry.id, setupId: setup, weather, mapping: { 'Crank speed': 'rpm' } }] }), 201).pulls
    expect(pull.rpmFrom).toBe(3000)
  })
})
