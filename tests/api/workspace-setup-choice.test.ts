// No pull goes into a setup nobody chose (issue 15 item 1): a batch with a file lacking
// its setup is refused whole, and the message names the file.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { createBenchTest, createSetup, expectOk, importFiles, newWriter, pullFile, uploadFiles } from '../support/workspace'

afterAll(closeTestDb)

let writer: Client
let benchTestId: number
let setupId: number

beforeAll(async () => {
  writer = (await newWriter()).client
  benchTestId = (await createBenchTest(writer)).id
  setupId = (await createSetup(writer, benchTestId, 'Baseline')).id
})

describe('a file without a setup', () => {
  it('stops the whole import batch, naming the file', async () => {
    const good = pullFile('baseline-1.csv', setupId, { seed: 501 })
    const { setupId: _none, ...unassigned } = pullFile('mystery-pull.csv', setupId, { seed: 502 })
    const res = await importFiles(writer, benchTestId, [good, unassigned])
    expect(res.status).toBe(400)
    expect(res.body.data.issues).toEqual([{ path: 'files.1.setupId', message: 'mystery-pull.csv: Choose the setup this pull was made with (none is assumed)' }])
    expect(await testDb()('pulls').join('setups', 'setups.id', 'pulls.setup_id').where('setups.bench_test_id', benchTestId).count({ n: '*' }).first()).toEqual({ n: 0 })
  })

  it('stops an inbox assignment, naming the file', async () => {
    const link = expectOk(await writer.post(`/api/bench-tests/${benchTestId}/operator-links`, { expiresInHours: 1 }), 201)
    const file = pullFile('from-the-cell.csv', setupId, { seed: 503 })
    expectOk(await uploadFiles(link.token, [{ name: file.name, text: file.text }]), 201)
    const entry = expectOk(await writer.get(`/api/bench-tests/${benchTestId}/inbox`)).files.find((f: { fileName: string }) => f.fileName === 'from-the-cell.csv')
    const res = await writer.post(`/api/bench-tests/${benchTestId}/inbox/assign`, { items: [{ fileId: entry.id, weather: file.weather }] })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0]).toEqual({ path: 'items.0.setupId', message: 'from-the-cell.csv: Choose the setup this pull was made with (none is assumed)' })
  })
})
