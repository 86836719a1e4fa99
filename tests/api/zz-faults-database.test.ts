// MariaDB stopped and started again under traffic, with an import batch in flight:
// requests get a clean 503 while it is down (never a 500 or a stack), the server
// recovers without a restart, and the batch is stored whole or not at all.
import { afterAll, describe, expect, it } from 'vitest'
import { localEnv } from '../../scripts/lib/env'
import { mariadbAlive, startMariadb, stopMariadb } from '../../scripts/lib/mariadb'
import { Client, signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, createBenchTest, createSetup, expectOk, importFiles, newWriter, pullFile } from '../support/workspace'

const env = localEnv('test')

afterAll(async () => {
  await startMariadb(env.db)
  await closeTestDb()
})

const LEAKS = /\bat .+\.(m?js|ts):\d+|node_modules|ECONNREFUSED|ER_[A-Z_]+|mysql:\/\//

describe('database outage under traffic', () => {
  it('answers 503 while down, recovers by itself, and an import in flight is whole or absent', async () => {
    const { client: writer } = await newWriter()
    const reader = await signedIn(DEMO.reader)
    const bt = await createBenchTest(writer)
    const setup = await createSetup(writer, bt.id, 'Baseline')
    const files = Array.from({ length: 20 }, (_, i) => pullFile(`outage-${i}.csv`, setup.id, { seed: 5000 + i }))

    const seen: { path: string, status: number, body: string }[] = []
    let traffic = true
    const paths: [Client, string][] = [[reader, '/api/auth/me'], [writer, '/api/bench-tests'], [new Client(), '/api/magazine/latest'], [reader, '/api/preferences']]
    const load = Promise.all(paths.map(async ([client, path]) => {
      while (traffic) {
        const res = await client.get(path).catch(() => ({ status: 0, body: 'connection failed' }))
        seen.push({ path, status: res.status, body: JSON.stringify(res.body) })
        await new Promise(r => setTimeout(r, 20))
      }
    }))

    const inFlight = importFiles(writer, bt.id, files)
    await new Promise(r => setTimeout(r, 60))
    const stoppedAt = seen.length
    await stopMariadb(env.db)
    expect(await mariadbAlive(env.db)).toBe(false)
    let imported
    try {
      imported = await inFlight
      await new Promise(r => setTimeout(r, 1500))
      const health = await new Client().get('/api/health')
      expect(health.status).toBe(503)
      expect(health.body.database).toBe('unreachable')
      const write = await writer.post('/api/bench-tests', { title: 'Written while down', engineFamily: 'pushrod-v8', partType: 'exhaust' })
      expect(write.status).toBe(503)
      expect(write.body.message).toMatch(/database/i)
    }
    finally {
      await startMariadb(env.db)
    }
    const restartedAt = seen.length
    await new Promise(r => setTimeout(r, 2000))
    traffic = false
    await load

    const during = seen.slice(stoppedAt, restartedAt)
    expect(during.some(s => s.status === 503)).toBe(true)
    for (const s of seen) {
      expect([200, 503], `${s.path}: ${s.status} ${s.body.slice(0, 200)}`).toContain(s.status)
      expect(s.body, s.path).not.toMatch(LEAKS)
    }
    // Recovered without a restart of the app: the last answers of every path are 200 again.
    for (const [, path] of paths) expect(seen.filter(s => s.path === path).at(-1)!.status, path).toBe(200)

    // The batch: all 20 pulls or none (the batch limit), and never a pull without its points.
    const stored = await testDb()('pulls').where({ bench_test_id: bt.id }).count({ n: '*' }).first()
    const n = Number(stored!.n)
    if (imported.status === 201) expect(n).toBe(files.length)
    else {
      expect(imported.status, JSON.stringify(imported.body)).toBe(503)
      expect(n).toBe(0)
    }
    expect([0, files.length]).toContain(n)

    // And writing works again: the same batch imports whole when it had not.
    if (n === 0) expectOk(await importFiles(writer, bt.id, files), 201)
    expect(expectOk(await writer.get(`/api/bench-tests/${bt.id}/pulls`)).pulls).toHaveLength(files.length)
    expect((await new Client().get('/api/health')).status).toBe(200)
  }, 120_000)
})
