// Tables that only grow are trimmed (issue 14, item 3's limiter and its neighbours):
// server/services/accounts/housekeeping.ts, run periodically by server/plugins/housekeeping.ts
// (the test server runs it every few seconds: HOUSEKEEPING_MINUTES in scripts/test.ts)
// and on demand by an admin. Rows a rule still reads stay.
import { randomBytes } from 'node:crypto'
import { afterAll, describe, expect, it } from 'vitest'
import { closeTestDb, testDb } from '../support/db'
import { signedIn } from '../support/http'
import { DEMO, expectOk, newWriter } from '../support/workspace'

afterAll(closeTestDb)

const db = () => testDb()
const ago = (sql: string) => db().raw(`NOW(3) - INTERVAL ${sql}`)
const hash = () => randomBytes(32).toString('hex')

/** Rows older than any rule reads, and recent ones beside them; ids of each. */
async function arrange() {
  const { id: userId } = await newWriter('reader')
  const ip = `198.51.100.${Math.floor(Math.random() * 250) + 1}`
  const email = `housekeeping-${hash().slice(0, 8)}@example.com`
  const insert = async (table: string, row: Record<string, unknown>) => Number((await db()(table).insert(row))[0])
  const old = {
    attempt: await insert('login_failures', { kind: 'login', email, ip, failed_at: ago('61 MINUTE') }),
    usedToken: await insert('user_tokens', { user_id: userId, purpose: 'reset', token_hash: hash(), expires_at: ago('7 DAY'), used_at: ago('8 DAY') }),
    expiredToken: await insert('user_tokens', { user_id: userId, purpose: 'invite', token_hash: hash(), expires_at: ago('8 DAY') }),
    job: await insert('jobs', { kind: 'housekeeping-test', payload: '{}', status: 'done', finished_at: ago('31 DAY') }),
    mail: await insert('mail_outbox', { to_address: email, subject: 'old', body_text: 'old', status: 'sent', sent_at: ago('31 DAY'), created_at: ago('31 DAY') }),
  }
  const recent = {
    attempt: await insert('login_failures', { kind: 'reset-request', email, ip, failed_at: ago('59 MINUTE') }),
    token: await insert('user_tokens', { user_id: userId, purpose: 'reset', token_hash: hash(), expires_at: ago('6 DAY') }),
    pendingJob: await insert('jobs', { kind: 'housekeeping-test', payload: '{}', status: 'failed', finished_at: ago('29 DAY') }),
    mail: await insert('mail_outbox', { to_address: email, subject: 'recent', body_text: 'recent', status: 'sent', sent_at: ago('29 DAY'), created_at: ago('29 DAY'), next_attempt_at: ago('29 DAY') }),
  }
  return { old, recent }
}

async function present(ids: Record<string, number>): Promise<string[]> {
  const tables: Record<string, string> = { attempt: 'login_failures', usedToken: 'user_tokens', expiredToken: 'user_tokens', token: 'user_tokens', job: 'jobs', pendingJob: 'jobs', mail: 'mail_outbox' }
  const found: string[] = []
  for (const [name, id] of Object.entries(ids)) {
    if (await db()(tables[name]!).where({ id }).first('id')) found.push(name)
  }
  return found
}

describe('housekeeping', () => {
  it('an admin purge deletes the limiter\'s rows past every window, old tokens, jobs and mails, and keeps what a rule still reads', async () => {
    const { old, recent } = await arrange()
    const admin = await signedIn(DEMO.admin)
    const report = expectOk(await admin.post('/api/admin/housekeeping', {}))
    // Another server's periodic run may have taken some of them first.
    expect(Object.keys(report).sort()).toEqual(['attempts', 'jobs', 'mails', 'userTokens'])
    expect(await present(old)).toEqual([])
    expect(await present(recent)).toEqual(Object.keys(recent))
  })

  it('runs by itself periodically on the app server', async () => {
    const { old, recent } = await arrange()
    const until = Date.now() + 25_000
    let left = await present(old)
    while (left.length && Date.now() < until) {
      await new Promise(r => setTimeout(r, 500))
      left = await present(old)
    }
    expect(left).toEqual([])
    expect(await present(recent)).toEqual(Object.keys(recent))
  })

  it('is for admins only', async () => {
    const writer = await signedIn(DEMO.writer)
    expect((await writer.post('/api/admin/housekeeping', {})).status).toBe(403)
  })
})
