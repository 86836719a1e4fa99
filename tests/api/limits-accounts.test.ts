// Rate limits on every account route, through the one limiter of the sign-in
// (server/services/accounts/login-limit.ts), and answers that do not tell which addresses have
// accounts. The test server trusts X-Forwarded-For (TRUST_PROXY=1), so each test
// comes from its own documentation-range address (RFC 5737) and counts alone.
import { afterAll, describe, expect, it } from 'vitest'
import { Client, signedIn, uniqueEmail } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { caughtMail, waitForMail } from '../support/mail'
import { DEMO, expectOk } from '../support/workspace'

afterAll(closeTestDb)

const PASSWORD = 'a-long-test-password'
let lastOctet = 0
/** A fresh client address: 203.0.113.0/24 with a random third-party prefix so reruns do not meet. */
function freshIp(): string {
  lastOctet = (lastOctet % 250) + 1
  return `203.0.${Math.floor(Math.random() * 250) + 1}.${lastOctet}`
}

function from(ip: string, method: string, path: string, json: unknown, client = new Client()) {
  return client.request(method, path, { json, headers: { 'x-forwarded-for': ip } })
}

async function newReader(): Promise<{ email: string, client: Client }> {
  const admin = await signedIn(DEMO.admin)
  const email = uniqueEmail('limits')
  expectOk(await admin.post('/api/users', { email, displayName: 'Limits reader', role: 'reader', password: PASSWORD }), 201)
  return { email, client: await signedIn(email, PASSWORD) }
}

const tokenOf = (text: string) => /token=([\w-]+)/.exec(text)![1]!

describe('registration', () => {
  it('answers a known and a new address the same, mails the owner of the known one, and changes nothing on it', async () => {
    const { email: known, client } = await newReader()
    const fresh = uniqueEmail('fresh')
    const ip = freshIp()
    const a = await from(ip, 'POST', '/api/auth/register', { email: known, displayName: 'Someone else' })
    const b = await from(ip, 'POST', '/api/auth/register', { email: fresh, displayName: 'Someone new' })
    expect([a.status, a.body]).toEqual([202, { mailed: true }])
    expect([b.status, b.body]).toEqual([a.status, a.body])
    expect(a.headers.getSetCookie()).toEqual(b.headers.getSetCookie())
    const owner = await waitForMail(known, /already have a Pullsheet account/)
    expect(owner.text).not.toMatch(/token=/)
    await waitForMail(fresh, /Finish creating/)
    expect(expectOk(await client.get('/api/auth/me')).user.displayName).toBe('Limits reader')
    await signedIn(known, PASSWORD)
  })

  it('is limited per IP and per address', async () => {
    const ip = freshIp()
    for (let i = 0; i < 10; i++) expect((await from(ip, 'POST', '/api/auth/register', { email: uniqueEmail('spray'), displayName: 'Spray' })).status).toBe(202)
    const blocked = await from(ip, 'POST', '/api/auth/register', { email: uniqueEmail('spray'), displayName: 'Spray' })
    expect(blocked.status).toBe(429)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)

    const address = uniqueEmail('again')
    for (let i = 0; i < 3; i++) expect((await from(freshIp(), 'POST', '/api/auth/register', { email: address, displayName: 'Again' })).status).toBe(202)
    expect((await from(freshIp(), 'POST', '/api/auth/register', { email: address, displayName: 'Again' })).status).toBe(429)
  })
})

describe('password reset requests', () => {
  it('answer a known and an unknown address the same, limited per address the same way', async () => {
    const { email: known } = await newReader()
    const unknown = uniqueEmail('nobody')
    for (const address of [known, unknown]) {
      for (let i = 0; i < 3; i++) {
        const res = await from(freshIp(), 'POST', '/api/auth/password-reset', { email: address })
        expect([res.status, res.body]).toEqual([200, { ok: true }])
      }
      const blocked = await from(freshIp(), 'POST', '/api/auth/password-reset', { email: address })
      expect(blocked.status).toBe(429)
      expect(blocked.body.message).toMatch(/Too many password reset requests/)
    }
    await waitForMail(known, /Reset your Pullsheet password/)
    expect(caughtMail().some(m => m.to.includes(unknown))).toBe(false)
  })

  it('are limited per IP across addresses', async () => {
    const ip = freshIp()
    for (let i = 0; i < 10; i++) expect((await from(ip, 'POST', '/api/auth/password-reset', { email: uniqueEmail('spray') })).status).toBe(200)
    expect((await from(ip, 'POST', '/api/auth/password-reset', { email: uniqueEmail('spray') })).status).toBe(429)
  })
})

describe('reset confirmation', () => {
  it('counts links that do not work per IP and refuses past the limit, even a good link', async () => {
    const { email } = await newReader()
    const ip = freshIp()
    for (let i = 0; i < 10; i++) {
      const res = await from(ip, 'POST', '/api/auth/password-reset/confirm', { token: `not-a-real-token-${i}-xxxxxxxxxxxx`, password: 'whatever-password-1' })
      expect(res.status).toBe(400)
    }
    expectOk(await from(freshIp(), 'POST', '/api/auth/password-reset', { email }))
    const token = tokenOf((await waitForMail(email, /Reset your Pullsheet password/)).text)
    expect((await from(ip, 'POST', '/api/auth/password-reset/confirm', { token, password: 'new-password-123' })).status).toBe(429)
    expect((await from(freshIp(), 'POST', '/api/auth/password-reset/confirm', { token, password: 'new-password-123' })).status).toBe(200)
  })

  it('using one reset link cancels the other open ones', async () => {
    const { email } = await newReader()
    expectOk(await from(freshIp(), 'POST', '/api/auth/password-reset', { email }))
    expectOk(await from(freshIp(), 'POST', '/api/auth/password-reset', { email }))
    const until = Date.now() + 15_000
    let mails = caughtMail().filter(m => m.to.includes(email))
    while (mails.length < 2 && Date.now() < until) {
      await new Promise(r => setTimeout(r, 200))
      mails = caughtMail().filter(m => m.to.includes(email))
    }
    const [first, second] = mails.map(m => tokenOf(m.text))
    expect(first).toBeDefined()
    expect(second).toBeDefined()
    expect((await from(freshIp(), 'POST', '/api/auth/password-reset/confirm', { token: first, password: 'first-new-password' })).status).toBe(200)
    const other = await from(freshIp(), 'POST', '/api/auth/password-reset/confirm', { token: second, password: 'second-new-password' })
    expect(other.status).toBe(400)
    await signedIn(email, 'first-new-password')
  })
})

describe('password change', () => {
  it('a wrong current password counts as a failed sign-in of the account', async () => {
    const { email, client } = await newReader()
    const ip = freshIp()
    for (let i = 0; i < 5; i++) {
      const res = await from(ip, 'PATCH', '/api/auth/password', { currentPassword: `wrong-${i}-password`, newPassword: 'another-long-password' }, client)
      expect(res.status).toBe(400)
    }
    const again = await from(ip, 'PATCH', '/api/auth/password', { currentPassword: PASSWORD, newPassword: 'another-long-password' }, client)
    expect(again.status).toBe(429)
    expect((await from(freshIp(), 'POST', '/api/auth/login', { email, password: PASSWORD })).status).toBe(429)
    const rows = await testDb()('login_failures').where({ email, kind: 'login' }).count({ n: '*' }).first()
    expect(Number(rows?.n)).toBe(5)
  })

  it('cancels every open reset link of the account', async () => {
    const { email, client } = await newReader()
    expectOk(await from(freshIp(), 'POST', '/api/auth/password-reset', { email }))
    const token = tokenOf((await waitForMail(email, /Reset your Pullsheet password/)).text)
    expectOk(await client.patch('/api/auth/password', { currentPassword: PASSWORD, newPassword: 'changed-password-1' }))
    expect((await from(freshIp(), 'POST', '/api/auth/password-reset/confirm', { token, password: 'reset-after-change' })).status).toBe(400)
  })
})

describe('answers that cannot depend on the address', () => {
  // Structural, not timed: the test holds a write lock on the users table, so any
  // per-address work (looking the address up, a token, an account, a mail) waits for it.
  // Every answer must still come while the lock is held, for known and unknown addresses
  // alike; the work happens once the lock goes. A route that did its work before
  // answering would not answer at all until the lock went, and the test would fail.
  it('reset requests and registrations answer before any work on the address, then do it', async () => {
    const { email: known } = await newReader()
    const unknown = uniqueEmail('nobody')
    const fresh = uniqueEmail('fresh')
    const lock = await testDb().transaction()
    let answers: { status: number, body: unknown, ms: number }[]
    try {
      await lock.raw('LOCK TABLES users WRITE')
      const ask = async (path: string, json: unknown) => {
        const t0 = performance.now()
        const res = await from(freshIp(), 'POST', path, json)
        return { status: res.status, body: res.body, ms: Math.round(performance.now() - t0) }
      }
      const timeout = new Promise<never>((_, reject) => setTimeout(() => reject(new Error('no answer within 10 s while the users table was locked: the route works on the address before answering')), 10_000))
      answers = await Promise.race([Promise.all([
        ask('/api/auth/password-reset', { email: known }),
        ask('/api/auth/password-reset', { email: unknown }),
        ask('/api/auth/register', { email: known, displayName: 'Someone else' }),
        ask('/api/auth/register', { email: fresh, displayName: 'Someone new' }),
      ]), timeout])
      // Still locked: nothing of the work can have happened.
      expect(caughtMail().filter(m => (m.to.includes(known) || m.to.includes(fresh)) && /Reset your|already have|Finish creating/.test(m.subject))).toEqual([])
    }
    finally {
      await lock.raw('UNLOCK TABLES')
      await lock.commit()
    }
    expect(answers.map(a => [a.status, a.body])).toEqual([[200, { ok: true }], [200, { ok: true }], [202, { mailed: true }], [202, { mailed: true }]])
    await waitForMail(known, /Reset your Pullsheet password/)
    await waitForMail(known, /already have a Pullsheet account/)
    await waitForMail(fresh, /Finish creating/)
    expect(caughtMail().some(m => m.to.includes(unknown))).toBe(false)
  })
})
