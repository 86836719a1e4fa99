// Sessions end when they should: a new cookie at sign-in, sign-out and disabling take
// effect on the very next request, a reset token works once and not after it expires.
// Plus the headers and error bodies an attacker sees.
import { afterAll, describe, expect, it } from 'vitest'
import { Client, signedIn, uniqueEmail } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { caughtMail, waitForMail } from '../support/mail'
import { DEMO, expectOk, newWriter } from '../support/workspace'

afterAll(closeTestDb)

const PASSWORD = 'a-long-test-password'

async function newReader() {
  const admin = await signedIn(DEMO.admin)
  const email = uniqueEmail('session')
  const user = expectOk(await admin.post('/api/users', { email, displayName: 'Session reader', role: 'reader', password: PASSWORD }), 201).user
  return { admin, email, id: user.id as number }
}

function resetToken(text: string): string {
  const match = /reset-password\?token=([\w-]+)/.exec(text)
  if (!match) throw new Error(`no reset link in: ${text.slice(0, 300)}`)
  return match[1]!
}

describe('sessions', () => {
  it('signing in issues a new cookie: a cookie planted before sign-in is not the one used after', async () => {
    const { email } = await newReader()
    const client = new Client()
    await client.get('/api/auth/me')
    const planted = client.cookie
    expectOk(await client.post('/api/auth/login', { email, password: PASSWORD }))
    expect(client.cookie).toMatch(/^pullsheet-session=/)
    expect(client.cookie).not.toBe(planted)
    // A second sign-in of the same account gets its own sealed cookie too.
    const second = await signedIn(email, PASSWORD)
    expect(second.cookie).not.toBe(client.cookie)
  })

  it('signing out ends the session at once, also for a copy of the cookie', async () => {
    const { email } = await newReader()
    const client = await signedIn(email, PASSWORD)
    const copy = new Client()
    copy.cookie = client.cookie
    expect(expectOk(await copy.get('/api/auth/me')).user.email).toBe(email)
    expectOk(await client.post('/api/auth/logout'))
    expect(expectOk(await copy.get('/api/auth/me')).user).toBeNull()
    expect((await copy.get('/api/preferences')).status).toBe(401)
  })

  it('disabling an account ends its session on the next request', async () => {
    const writer = await newWriter()
    const admin = await signedIn(DEMO.admin)
    expect((await writer.client.get('/api/bench-tests')).status).toBe(200)
    expectOk(await admin.patch(`/api/users/${writer.id}`, { disabled: true }))
    expect((await writer.client.get('/api/bench-tests')).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email: writer.email, password: PASSWORD })).status).toBe(401)
  })

  it('a reset token from the e-mail works once, and an expired one not at all', async () => {
    const { email, id } = await newReader()
    const old = await signedIn(email, PASSWORD)
    expectOk(await new Client().post('/api/auth/password-reset', { email }))
    const token = resetToken((await waitForMail(email, /reset/i)).text)

    const first = await new Client().post('/api/auth/password-reset/confirm', { token, password: 'a-new-long-password-1' })
    expect(first.status).toBe(200)
    expect((await old.get('/api/preferences')).status).toBe(401) // other sessions end with the reset
    const again = await new Client().post('/api/auth/password-reset/confirm', { token, password: 'a-new-long-password-2' })
    expect(again.status).toBe(400)
    await signedIn(email, 'a-new-long-password-1')

    // A second token, expired behind the app's back.
    expectOk(await new Client().post('/api/auth/password-reset', { email }))
    const resetMails = () => caughtMail().filter(m => m.to.includes(email) && /reset/i.test(m.subject))
    await expect.poll(() => resetMails().length, { timeout: 15_000 }).toBe(2)
    const expired = resetToken(resetMails().at(-1)!.text)
    await testDb()('user_tokens').where({ user_id: id }).whereNull('used_at').update({ expires_at: testDb().raw('NOW(3) - INTERVAL 1 MINUTE') })
    const late = await new Client().post('/api/auth/password-reset/confirm', { token: expired, password: 'a-new-long-password-3' })
    expect(late.status).toBe(400)
    expect((await new Client().post('/api/auth/login', { email, password: 'a-new-long-password-3' })).status).toBe(401)
  })
})

describe('headers', () => {
  const pages = ['/', '/sign-in', '/search?q=cam', '/no-such-page-here']

  it('every page carries CSP with frame-ancestors, nosniff, a referrer policy and no framing', async () => {
    for (const path of pages) {
      const res = await new Client().request('GET', path, { headers: { accept: 'text/html' } })
      const csp = res.headers.get('content-security-policy') ?? ''
      expect(csp, path).toMatch(/default-src [^;]*'self'/)
      expect(csp, path).toContain(`frame-ancestors 'none'`)
      expect(csp, path).toMatch(/object-src 'none'/)
      expect(res.headers.get('x-content-type-options'), path).toBe('nosniff')
      expect(res.headers.get('referrer-policy'), path).toMatch(/^(strict-origin-when-cross-origin|no-referrer|same-origin)$/)
      expect(res.headers.get('x-frame-options'), path).toBe('DENY')
    }
  })

  it('API answers are nosniff too, and the session cookie is HttpOnly and SameSite on every way in', async () => {
    const api = await new Client().get('/api/magazine/home')
    expect(api.headers.get('x-content-type-options')).toBe('nosniff')
    // Registration signs nobody in (the account is finished from a mailed link): the
    // ways in are signing in and a password change, which issues a fresh cookie.
    const email = uniqueEmail('cookie')
    const admin = await signedIn(DEMO.admin)
    expect((await admin.post('/api/users', { email, displayName: 'Cookie reader', role: 'reader', password: PASSWORD })).status).toBe(201)
    const reader = await signedIn(email, PASSWORD)
    const change = await reader.request('PATCH', '/api/auth/password', { json: { currentPassword: PASSWORD, newPassword: `${PASSWORD}-2` } })
    const login = await new Client().post('/api/auth/login', { email: DEMO.reader, password: 'pullsheet-demo' })
    for (const res of [change, login]) {
      const cookie = res.headers.getSetCookie().find(c => c.startsWith('pullsheet-session='))
      expect(cookie, JSON.stringify(res.body)).toBeDefined()
      expect(cookie).toMatch(/HttpOnly/i)
      expect(cookie).toMatch(/SameSite=(Lax|Strict)/i)
      expect(cookie).toMatch(/Path=\//i)
    }
  })
})

describe('error answers', () => {
  const LEAKS = /\bat .+\.(m?js|ts):\d+|node_modules|\.output\/|ER_[A-Z_]+|sqlMessage|SELECT |INSERT |password_hash|NUXT_SESSION_PASSWORD|S3RVER|secretAccessKey/

  it('bad JSON, huge ids, wrong types and unknown routes answer without stack traces or secrets', async () => {
    const editor = await signedIn(DEMO.editor)
    const admin = await signedIn(DEMO.admin)
    const cases: [Client, string, string, unknown?, string?][] = [
      [editor, 'GET', '/api/bench-tests/99999999999999999999999'],
      [editor, 'GET', '/api/bench-tests/-1'],
      [editor, 'GET', '/api/bench-tests/1e308'],
      [editor, 'GET', '/api/stories/99999999999999999999'],
      [editor, 'GET', '/api/stories/abc/figures'],
      [editor, 'GET', '/api/stories/1/revisions/compare?from=x&to=%00'],
      [editor, 'GET', '/api/magazine/search?q=' + 'x'.repeat(5000)],
      [editor, 'GET', '/api/magazine/stories/' + '%E0%A4%A'],
      [editor, 'GET', '/api/magazine/part/not-a-part'],
      [editor, 'GET', '/api/preview/short'],
      [editor, 'GET', '/api/upload/' + 'z'.repeat(300)],
      [editor, 'GET', '/api/no/such/route'],
      [editor, 'PATCH', '/api/stories/1', undefined, '{"version": '],
      [editor, 'POST', '/api/stories', undefined, '[[[[[['],
      [editor, 'POST', '/api/stories', { benchTestId: 'one', headline: 7 }],
      [editor, 'POST', '/api/stories', { benchTestId: 2 ** 53, headline: 'Huge id' }],
      [editor, 'PATCH', '/api/bench-tests/1', { version: 'latest', title: ['a'] }],
      [editor, 'POST', '/api/bench-tests/1/pulls/import', { files: 'everything' }],
      [editor, 'POST', '/api/bench-tests/1/pulls/import', { files: [{ name: 'a.csv', text: 'rpm,torque\nnot,numbers', setupId: 99999999 }] }],
      [admin, 'PATCH', '/api/users/99999999', { role: 'emperor' }],
      [admin, 'POST', '/api/users', { email: 'not-an-address', displayName: '', role: 'admin' }],
      [new Client(), 'POST', '/api/auth/login', { email: { $ne: '' }, password: { $gt: '' } }],
      [new Client(), 'POST', '/api/auth/password-reset/confirm', { token: 'x'.repeat(10_000), password: 'short' }],
    ]
    for (const [client, method, path, json, raw] of cases) {
      const res = raw === undefined
        ? await client.request(method, path, { json: method === 'GET' ? undefined : json })
        : await client.request(method, path, { body: raw, headers: { 'content-type': 'application/json' } })
      const text = JSON.stringify(res.body)
      expect(res.status, `${method} ${path}: ${text.slice(0, 200)}`).toBeGreaterThanOrEqual(400)
      expect(res.status, `${method} ${path}: ${text.slice(0, 200)}`).toBeLessThan(500)
      expect(text, `${method} ${path}`).not.toMatch(LEAKS)
      expect(res.body?.stack, `${method} ${path}`).toBeUndefined()
    }
  })
})
