import { afterAll, describe, expect, it } from 'vitest'
import { Client, signedIn, uniqueEmail, DEMO_PASSWORD } from '../support/http'
import { closeTestDb } from '../support/db'
import { waitForMail } from '../support/mail'

const DEMO = { reader: 'reader@example.com', writer: 'writer@example.com', editor: 'editor@example.com', admin: 'admin@example.com' } as const

afterAll(closeTestDb)

function expectStatus(res: { status: number, body: unknown }, status: number) {
  if (res.status !== status) throw new Error(`expected ${status}, got ${res.status}: ${JSON.stringify(res.body)}`)
}

async function newUser(role: 'reader' | 'writer' | 'editor' | 'admin', password = 'a-long-test-password') {
  const admin = await signedIn(DEMO.admin)
  const email = uniqueEmail(role)
  const res = await admin.post('/api/users', { email, displayName: `Test ${role}`, role, password })
  expect(res.status).toBe(201)
  return { email, password, id: res.body.user.id as number, admin }
}

describe('sign-in', () => {
  it.each(Object.entries(DEMO))('the demo %s signs in and is that role', async (role, email) => {
    const client = await signedIn(email)
    const me = await client.get('/api/auth/me')
    expect(me.body.user).toMatchObject({ email, role })
    expect(me.body.user).not.toHaveProperty('password_hash')
  })

  it('answers a wrong password and an unknown e-mail the same way', async () => {
    const { email } = await newUser('reader')
    const wrong = await new Client().post('/api/auth/login', { email, password: 'not-the-password' })
    const unknown = await new Client().post('/api/auth/login', { email: uniqueEmail('nobody'), password: 'whatever-it-is' })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body.message).toBe(unknown.body.message)
  })

  it('matches the e-mail case-insensitively', async () => {
    const { email, password } = await newUser('reader')
    const res = await new Client().post('/api/auth/login', { email: email.toUpperCase(), password })
    expect(res.status).toBe(200)
  })

  it('answers 429 with a retry time after repeated failures on one account', async () => {
    const { email, password } = await newUser('reader')
    const client = new Client()
    for (let i = 0; i < 5; i++) expect((await client.post('/api/auth/login', { email, password: `wrong-${i}-password` })).status).toBe(401)
    const blocked = await client.post('/api/auth/login', { email, password })
    expect(blocked.status).toBe(429)
    expect(blocked.body.data.retryAfterSeconds).toBeGreaterThan(0)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
  })

  it('answers 429 after repeated failures from one address, across accounts', async () => {
    const { email, password } = await newUser('reader')
    const ip = `198.51.100.${Math.floor(Math.random() * 200) + 1}`
    const from = (json: unknown) => new Client().request('POST', '/api/auth/login', { json, headers: { 'x-forwarded-for': ip } })
    for (let i = 0; i < 20; i++) await from({ email: uniqueEmail('spray'), password: 'wrong-password' })
    const blocked = await from({ email, password })
    expect(blocked.status).toBe(429)
    const elsewhere = await new Client().post('/api/auth/login', { email, password })
    expect(elsewhere.status).toBe(200)
  })

  it('issues a fresh session cookie at sign-in', async () => {
    const client = await signedIn(DEMO.reader)
    const first = client.cookie
    await client.post('/api/auth/login', { email: DEMO.reader, password: DEMO_PASSWORD })
    expect(client.cookie).not.toBe('')
    expect(client.cookie).not.toBe(first)
  })
})

describe('session', () => {
  it('sign-out ends the session, and the old cookie no longer works', async () => {
    const { email, password } = await newUser('writer')
    const client = new Client()
    await client.post('/api/auth/login', { email, password })
    const stolen = client.cookie
    expect((await client.post('/api/auth/logout')).status).toBe(200)
    const replay = new Client()
    replay.cookie = stolen
    expect((await replay.get('/api/auth/me')).body.user).toBeNull()
  })

  it('a disabled user is refused at the next request', async () => {
    const { email, password, id, admin } = await newUser('writer')
    const user = new Client()
    await user.post('/api/auth/login', { email, password })
    expect((await user.get('/api/auth/me')).body.user.email).toBe(email)
    expect((await admin.patch(`/api/users/${id}`, { disabled: true })).status).toBe(200)
    expect((await user.get('/api/auth/me')).body.user).toBeNull()
    expect((await user.patch('/api/auth/password', { currentPassword: password, newPassword: 'another-long-password' })).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email, password })).status).toBe(401)
  })

  it('a role change takes effect at the next request', async () => {
    const { email, password, id, admin } = await newUser('writer')
    const user = new Client()
    await user.post('/api/auth/login', { email, password })
    expect((await user.get('/api/users')).status).toBe(403)
    await admin.patch(`/api/users/${id}`, { role: 'admin' })
    expect((await user.get('/api/users')).status).toBe(200)
    await admin.patch(`/api/users/${id}`, { role: 'reader' })
    expect((await user.get('/api/users')).status).toBe(403)
  })

  it('a password change keeps this session and ends the others', async () => {
    const { email, password } = await newUser('reader')
    const here = new Client()
    const there = new Client()
    await here.post('/api/auth/login', { email, password })
    await there.post('/api/auth/login', { email, password })
    expect((await here.patch('/api/auth/password', { currentPassword: 'wrong-password!', newPassword: 'brand-new-password' })).status).toBe(400)
    expect((await here.patch('/api/auth/password', { currentPassword: password, newPassword: 'brand-new-password' })).status).toBe(200)
    expect((await here.get('/api/auth/me')).body.user.email).toBe(email)
    expect((await there.get('/api/auth/me')).body.user).toBeNull()
    expect((await new Client().post('/api/auth/login', { email, password: 'brand-new-password' })).status).toBe(200)
  })
})

describe('CSRF', () => {
  it('refuses a state-changing request from a foreign origin', async () => {
    const res = await new Client().post('/api/auth/login', { email: DEMO.reader, password: DEMO_PASSWORD }, { origin: 'https://attacker.example' })
    expect(res.status).toBe(403)
  })

  it('refuses a cookie-authenticated request without an Origin', async () => {
    const admin = await signedIn(DEMO.admin)
    const res = await admin.post('/api/users', { email: uniqueEmail(), displayName: 'X', role: 'reader', password: 'long-enough-pass' }, { origin: null })
    expect(res.status).toBe(403)
    expect((await admin.get('/api/users')).status).toBe(200)
  })
})

describe('registration and accounts', () => {
  it('registers a reader through a mailed link; the same e-mail again, in any case, gets the same answer and changes nothing', async () => {
    const email = uniqueEmail('newreader')
    const client = new Client()
    const res = await client.post('/api/auth/register', { email, displayName: 'New Reader' })
    expect(res.status).toBe(202)
    expect(res.body).toEqual({ mailed: true })
    expect(client.cookie).toBe('')
    const mail = await waitForMail(email, /Finish creating/)
    const token = /token=([\w-]+)/.exec(mail.text)![1]!
    expectStatus(await new Client().post('/api/auth/password-reset/confirm', { token, password: 'reader-password-1' }), 200)
    const reader = await signedIn(email, 'reader-password-1')
    expect((await reader.get('/api/auth/me')).body.user).toMatchObject({ email, role: 'reader', displayName: 'New Reader' })
    const again = await new Client().post('/api/auth/register', { email: email.toUpperCase(), displayName: 'Again' })
    expect(again.status).toBe(202)
    expect(again.body).toEqual({ mailed: true })
    await waitForMail(email, /already have a Pullsheet account/)
    expect((await reader.get('/api/auth/me')).body.user.displayName).toBe('New Reader')
  })

  it('says which field is wrong', async () => {
    const res = await new Client().post('/api/auth/register', { email: 'not-an-email', displayName: '' })
    expect(res.status).toBe(400)
    const paths = res.body.data.issues.map((i: { path: string }) => i.path).sort()
    expect(paths).toEqual(['displayName', 'email'])
  })

  it('resets a password by an e-mailed token that works once', async () => {
    const { email } = await newUser('writer')
    expect((await new Client().post('/api/auth/password-reset', { email })).status).toBe(200)
    const mail = await waitForMail(email, /reset/i)
    const token = /token=([\w-]+)/.exec(mail.text)![1]!
    const confirm = await new Client().post('/api/auth/password-reset/confirm', { token, password: 'reset-password-99' })
    expect(confirm.status).toBe(200)
    expect((await new Client().post('/api/auth/login', { email, password: 'reset-password-99' })).status).toBe(200)
    expect((await new Client().post('/api/auth/password-reset/confirm', { token, password: 'reset-password-100' })).status).toBe(400)
  })

  it('invites a user by e-mail when the admin gives no password', async () => {
    const admin = await signedIn(DEMO.admin)
    const email = uniqueEmail('invitee')
    const res = await admin.post('/api/users', { email, displayName: 'Invited Writer', role: 'writer' })
    expect(res.status).toBe(201)
    expect(res.body.invited).toBe(true)
    const mail = await waitForMail(email, /invited/i)
    const token = /token=([\w-]+)/.exec(mail.text)![1]!
    expect((await new Client().post('/api/auth/password-reset/confirm', { token, password: 'invited-password-1' })).status).toBe(200)
    const me = await signedIn(email, 'invited-password-1')
    expect((await me.get('/api/auth/me')).body.user.role).toBe('writer')
  })
})

describe('admin routes', () => {
  it.each([
    ['GET', '/api/users'],
    ['POST', '/api/users'],
    ['PATCH', '/api/users/1'],
    ['GET', '/api/dev/mail'],
  ])('%s %s is 401 for anonymous and 403 for writers and editors', async (method, path) => {
    const json = method === 'GET' ? undefined : {}
    expect((await new Client().request(method, path, { json })).status).toBe(401)
    for (const who of [DEMO.reader, DEMO.writer, DEMO.editor]) {
      const client = await signedIn(who)
      expect((await client.request(method, path, { json })).status).toBe(403)
    }
  })

  it('an admin cannot disable themselves', async () => {
    const admin = await signedIn(DEMO.admin)
    const me = (await admin.get('/api/auth/me')).body.user
    expect((await admin.patch(`/api/users/${me.id}`, { disabled: true })).status).toBe(400)
  })
})
