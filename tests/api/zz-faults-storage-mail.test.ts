// Fault drills with the real services: the storage endpoint killed under an upload,
// the SMTP server killed while changes that send mail go on. Each drill restarts
// what it stopped, so the main test server and the services stay healthy.
import { afterAll, describe, expect, it, vi } from 'vitest'
import { Client, signedIn, uniqueEmail } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { caughtMail, waitForMail } from '../support/mail'
import { bucketKeys, makeJpeg, photoTestTimeouts, uploadPhoto, waitForPhoto } from '../support/photos'
import { startService, stopService } from '../support/services-control'
import { DEMO, createBenchTest, expectOk, newWriter } from '../support/workspace'

// Waits for photo sizing: timeouts from the one bound for a loaded machine (tests/support/photos.ts).
vi.setConfig(photoTestTimeouts(1))

afterAll(async () => {
  await startService('storage')
  await startService('mail')
  await closeTestDb()
})

let lastOutageMessage = ''

const LEAKS = /\bat .+\.(m?js|ts):\d+|node_modules|ECONNREFUSED|:4579\b|S3RVER/

describe('storage endpoint down', () => {
  it('an upload fails with a clear message and leaves no row without its object; it works again after', async () => {
    const { client } = await newWriter()
    const bt = await createBenchTest(client)
    const jpeg = await makeJpeg(800, 600)
    await stopService('storage')
    let failed
    try {
      failed = await uploadPhoto(client, bt.id, jpeg, 'while-down.jpg')
      // Reading pages that need no storage keeps working.
      expect((await client.get(`/api/bench-tests/${bt.id}`)).status).toBe(200)
    }
    finally {
      await startService('storage')
    }
    expect(failed.status, JSON.stringify(failed.body)).toBe(503)
    expect(failed.body.message).toMatch(/\S/)
    expect(JSON.stringify(failed.body)).not.toMatch(LEAKS)
    lastOutageMessage = String(failed.body.message)
    expect(await testDb()('photos').where({ bench_test_id: bt.id }).count({ n: '*' }).first()).toEqual({ n: 0 })

    const again = expectOk(await uploadPhoto(client, bt.id, jpeg, 'after.jpg'), 201).photo
    const ready = await waitForPhoto(client, bt.id, again.id)
    expect(ready.status).toBe('ready')
    const rows = await testDb()('photos').where({ bench_test_id: bt.id })
    expect(rows).toHaveLength(1)
    const keys = await bucketKeys('')
    for (const column of ['original_key', 'storage_key', 'key'].filter(c => c in rows[0])) {
      expect(keys).toContain(rows[0][column])
    }
    expect(ready.variants.length).toBeGreaterThan(0)
    for (const v of ready.variants) expect((await fetch(client.base + v.url, { headers: { cookie: client.cookie } })).status).toBe(200)
  })
})

// A refused connection counts as "database down" only on the database's port
// (server/utils/db-unavailable.ts), so the writer is told which part is down.
describe('storage endpoint down, the message', () => {
  it('names the storage, not the database', () => {
    expect(lastOutageMessage).toMatch(/storage|store|file|photo/i)
    expect(lastOutageMessage).not.toMatch(/database/i)
  })
})

describe('SMTP down', () => {
  it('state changes still succeed, mail waits in the outbox and is delivered once after', async () => {
    const admin = await signedIn(DEMO.admin)
    const email = uniqueEmail('outage')
    expectOk(await admin.post('/api/users', { email, displayName: 'Outage reader', role: 'reader', password: 'a-long-test-password' }), 201)
    await stopService('mail')
    try {
      const reset = await new Client().post('/api/auth/password-reset', { email })
      expect(reset.status).toBe(200)
      const invitee = uniqueEmail('invitee')
      expectOk(await admin.post('/api/users', { email: invitee, displayName: 'Invited writer', role: 'writer' }), 201)
      // The worker tries and fails at least once while the server is down.
      await expect.poll(async () => {
        const row = await testDb()('mail_outbox').where({ to_address: email }).first()
        return row && row.status === 'pending' && row.attempts > 0
      }, { timeout: 20_000, interval: 300 }).toBe(true)
      const pending = await testDb()('mail_outbox').whereIn('to_address', [email, invitee])
      expect(pending.map(r => r.status)).toEqual(['pending', 'pending'])
      expect(pending.every(r => r.last_error)).toBe(true)
      expect(caughtMail().some(m => m.to.includes(email))).toBe(false)
    }
    finally {
      await startService('mail')
    }
    const delivered = await waitForMail(email, /reset/i, 60_000)
    expect(delivered.text).toMatch(/reset-password\?token=/)
    await expect.poll(async () => (await testDb()('mail_outbox').where({ to_address: email }).first()).status, { timeout: 30_000 }).toBe('sent')
    // Exactly once, even after the retries.
    await new Promise(r => setTimeout(r, 1500))
    expect(caughtMail().filter(m => m.to.includes(email))).toHaveLength(1)
  }, 120_000)
})
