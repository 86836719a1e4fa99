// Every workspace route for every kind of caller: signed out 401, reader 403, another
// writer 404 (learns nothing), the owner, an editor and an admin get through.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb } from '../support/db'
import { DEMO, createBenchTest, createSetup, expectOk, importFiles, newWriter, pullFile, uploadFiles } from '../support/workspace'

afterAll(closeTestDb)

interface Fixture { id: number, setupA: number, setupB: number, pullId: number, pullVersion: number, checkId: number, linkId: number, token: string, inboxAssign: number, inboxDismiss: number, version: number, setupBVersion: number }

async function fixture(owner: Client): Promise<Fixture> {
  const bt = await createBenchTest(owner)
  expectOk(await owner.request('PUT', `/api/bench-tests/${bt.id}/build-sheet`, { json: { version: 0, boreIn: 4.1, strokeIn: 3.622, cylinders: 8, compressionRatio: 10.4, heads: '', induction: '', fuel: '', ignition: '', exhaust: '', notes: '' } }))
  const a = await createSetup(owner, bt.id, 'Baseline')
  const b = await createSetup(owner, bt.id, 'Candidate')
  const check = expectOk(await owner.post(`/api/bench-tests/${bt.id}/setups/${a.id}/idle-checks`, { idleRpm: 750, vacuumInHg: 17.5 }), 201).idleCheck
  const pulls = expectOk(await importFiles(owner, bt.id, [pullFile('a1.csv', a.id, { seed: 11 }), pullFile('b1.csv', b.id, { seed: 12, peakTorqueLbFt: 445 })]), 201).pulls
  const created = expectOk(await owner.post(`/api/bench-tests/${bt.id}/operator-links`, { expiresInHours: 2 }), 201)
  expectOk(await uploadFiles(created.token, [{ name: 'op-1.csv', text: pullFile('x', a.id, { seed: 13 }).text }, { name: 'op-2.csv', text: pullFile('x', a.id, { seed: 14 }).text }]), 201)
  const inbox = expectOk(await owner.get(`/api/bench-tests/${bt.id}/inbox`)).files
  const detail = expectOk(await owner.get(`/api/bench-tests/${bt.id}`))
  return {
    id: bt.id, setupA: a.id, setupB: b.id, pullId: pulls[0].id, pullVersion: pulls[0].version, checkId: check.id, linkId: created.link.id, token: created.token,
    inboxAssign: inbox.find((f: any) => f.fileName === 'op-1.csv').id, inboxDismiss: inbox.find((f: any) => f.fileName === 'op-2.csv').id,
    version: detail.benchTest.version, setupBVersion: b.version,
  }
}

const weather = { baroInHg: 29.5, airTempF: 75, humidityPct: 40 }

/** [method, path, body, status when allowed]; destructive ones last. */
function routes(f: Fixture): [string, string, unknown, number][] {
  const bt = `/api/bench-tests/${f.id}`
  const csv = pullFile('c.csv', f.setupB, { seed: 21 })
  return [
    ['GET', '/api/bench-tests', undefined, 200],
    ['GET', bt, undefined, 200],
    ['PATCH', bt, { version: f.version, notes: 'edited' }, 200],
    ['PUT', `${bt}/build-sheet`, { version: 1, boreIn: 4.1, strokeIn: 3.622, cylinders: 8, compressionRatio: 10.5, heads: '', induction: '', fuel: '', ignition: '', exhaust: '', notes: '' }, 200],
    ['GET', `${bt}/setups`, undefined, 200],
    ['POST', `${bt}/setups`, { label: 'Third' }, 201],
    ['PATCH', `${bt}/setups/${f.setupB}`, { version: f.setupBVersion, description: 'changed' }, 200],
    ['POST', `${bt}/setups/${f.setupB}/baseline`, {}, 200],
    ['POST', `${bt}/setups/${f.setupA}/baseline`, {}, 200],
    ['POST', `${bt}/setups/${f.setupA}/idle-checks`, { idleRpm: 760, vacuumInHg: 17 }, 201],
    ['GET', `${bt}/pulls`, undefined, 200],
    ['GET', `${bt}/pulls/${f.pullId}`, undefined, 200],
    ['GET', `${bt}/pulls/${f.pullId}/file`, undefined, 200],
    ['PATCH', `${bt}/pulls/${f.pullId}`, { version: f.pullVersion, included: false, exclusionReason: 'test' }, 200],
    ['POST', `${bt}/pulls/preview`, { files: [{ name: csv.name, text: csv.text }] }, 200],
    ['POST', `${bt}/pulls/import`, { files: [csv] }, 201],
    ['GET', `${bt}/analysis`, undefined, 200],
    ['GET', `${bt}/analysis/csv`, undefined, 200],
    ['GET', `${bt}/operator-links`, undefined, 200],
    ['POST', `${bt}/operator-links`, { expiresInHours: 1 }, 201],
    ['GET', `${bt}/inbox`, undefined, 200],
    ['POST', `${bt}/inbox/${f.inboxAssign}/preview`, {}, 200],
    ['POST', `${bt}/inbox/assign`, { items: [{ fileId: f.inboxAssign, setupId: f.setupA, weather }] }, 201],
    ['POST', `${bt}/inbox/${f.inboxDismiss}/dismiss`, {}, 200],
    ['POST', `${bt}/operator-links/${f.linkId}/revoke`, {}, 200],
    ['DELETE', `${bt}/setups/${f.setupA}/idle-checks/${f.checkId}`, undefined, 200],
    ['DELETE', `${bt}/setups/${f.setupB}?confirm=true`, undefined, 200],
    ['POST', `${bt}/setups/${f.setupB}/restore`, {}, 200],
    ['DELETE', `${bt}?confirm=true`, undefined, 200],
    ['POST', `${bt}/restore`, {}, 200],
  ]
}

async function call(client: Client, [method, path, body]: [string, string, unknown, number]) {
  return client.request(method, path, body === undefined ? {} : { json: body })
}

let owner: { client: Client, id: number }
let shared: Fixture

beforeAll(async () => {
  owner = await newWriter()
  shared = await fixture(owner.client)
})

describe('workspace routes refuse', () => {
  it('every route to a signed-out caller with 401', async () => {
    for (const route of routes(shared)) {
      const res = await call(new Client(), route)
      expect(res.status, `${route[0]} ${route[1]}`).toBe(401)
    }
  })

  it('every route to a reader with 403', async () => {
    const reader = await signedIn(DEMO.reader)
    for (const route of routes(shared)) {
      const res = await call(reader, route)
      expect(res.status, `${route[0]} ${route[1]}`).toBe(403)
    }
  })

  it('every route on another writer\'s bench test with 404, and changes nothing', async () => {
    const other = await newWriter()
    const before = expectOk(await owner.client.get(`/api/bench-tests/${shared.id}`))
    for (const route of routes(shared)) {
      if (route[1] === '/api/bench-tests') continue
      const res = await call(other.client, route)
      expect(res.status, `${route[0]} ${route[1]}`).toBe(404)
      expect(JSON.stringify(res.body)).not.toContain('Test shop')
    }
    const after = expectOk(await owner.client.get(`/api/bench-tests/${shared.id}`))
    expect(after).toEqual(before)
    const list = expectOk(await other.client.get('/api/bench-tests')).benchTests
    expect(list.map((b: any) => b.id)).not.toContain(shared.id)
  })

  it('a sub-object reached through another bench test with 404', async () => {
    const mine = await createBenchTest(owner.client)
    const bt = `/api/bench-tests/${mine.id}`
    for (const [method, path] of [
      ['GET', `${bt}/pulls/${shared.pullId}`],
      ['PATCH', `${bt}/setups/${shared.setupA}`],
      ['POST', `${bt}/setups/${shared.setupA}/baseline`],
      ['POST', `${bt}/operator-links/${shared.linkId}/revoke`],
      ['POST', `${bt}/inbox/${shared.inboxDismiss}/dismiss`],
      ['DELETE', `${bt}/setups/${shared.setupA}/idle-checks/${shared.checkId}`],
    ] as const) {
      const res = await owner.client.request(method, path, method === 'GET' ? {} : { json: { version: 1 } })
      expect(res.status, `${method} ${path}`).toBe(404)
    }
  })

  it('state changes without an Origin header while signed in', async () => {
    const res = await owner.client.request('POST', `/api/bench-tests/${shared.id}/setups`, { json: { label: 'x' }, origin: null })
    expect(res.status).toBe(403)
  })
})

describe('workspace routes admit', () => {
  it.each([['the owning writer', 'owner'], ['an editor', DEMO.editor], ['an admin', DEMO.admin]])('%s on every route', async (_who, who) => {
    const writer = who === 'owner' ? await newWriter() : undefined
    const client = writer ? writer.client : await signedIn(who)
    // The bench test belongs to a writer; editors and admins reach it all the same.
    const ownerOfFixture = writer ?? await newWriter()
    const f = await fixture(ownerOfFixture.client)
    for (const route of routes(f)) {
      const res = await call(client, route)
      expect(res.status, `${route[0]} ${route[1]}: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(route[3])
    }
  })

  it('lists a writer only their own bench tests, an editor everyone\'s', async () => {
    const a = await newWriter()
    const b = await newWriter()
    const ba = await createBenchTest(a.client)
    const bb = await createBenchTest(b.client)
    const listA = expectOk(await a.client.get('/api/bench-tests')).benchTests.map((x: any) => x.id)
    expect(listA).toContain(ba.id)
    expect(listA).not.toContain(bb.id)
    const editor = await signedIn(DEMO.editor)
    const listE = expectOk(await editor.get('/api/bench-tests')).benchTests.map((x: any) => x.id)
    expect(listE).toEqual(expect.arrayContaining([ba.id, bb.id]))
  })
})
