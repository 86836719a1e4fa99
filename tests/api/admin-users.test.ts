import { afterAll, describe, expect, it } from 'vitest'
import type { UserRow } from '#shared/types/users'
import { signedIn, uniqueEmail } from '../support/http'
import { closeTestDb } from '../support/db'

afterAll(closeTestDb)

describe('the admin\'s list of accounts', () => {
  it('tells an invited account (no password chosen yet) from an active one', async () => {
    const admin = await signedIn('admin@example.com')
    const invitedEmail = uniqueEmail('invited')
    const activeEmail = uniqueEmail('active')
    expect((await admin.post('/api/users', { email: invitedEmail, displayName: 'Invited writer', role: 'writer' })).status).toBe(201)
    expect((await admin.post('/api/users', { email: activeEmail, displayName: 'Active writer', role: 'writer', password: 'a-long-test-password' })).status).toBe(201)
    const { users } = (await admin.get<{ users: UserRow[] }>('/api/users')).body
    expect(users.find(u => u.email === invitedEmail)).toMatchObject({ invited: true, disabled: false })
    expect(users.find(u => u.email === activeEmail)).toMatchObject({ invited: false, disabled: false })
  })
})
