import { describe, expect, it } from 'vitest'
import { ROLES, type Role } from '#shared/types/roles'
import { rolesAtLeast } from '#shared/accounts/roles'
import { csrfReason, decideAccess } from '#shared/utils/access'

// Source: the product brief's role table (each role may do all the ones before it may).
describe('roles', () => {
  it('orders roles so each includes the ones before it', () => {
    expect(rolesAtLeast('reader')).toEqual(['reader', 'writer', 'editor', 'admin'])
    expect(rolesAtLeast('writer')).toEqual(['writer', 'editor', 'admin'])
    expect(rolesAtLeast('editor')).toEqual(['editor', 'admin'])
    expect(rolesAtLeast('admin')).toEqual(['admin'])
  })
})

describe('decideAccess (the rule behind requireRole)', () => {
  it('refuses anonymous with 401 whatever the roles', () => {
    expect(decideAccess(null, ROLES)).toMatchObject({ ok: false, status: 401 })
    expect(decideAccess(undefined, ['admin'])).toMatchObject({ ok: false, status: 401 })
  })

  it.each(ROLES.flatMap(actual => ROLES.map(needed => [actual, needed] as [Role, Role])))(
    '%s against at-least-%s',
    (actual, needed) => {
      const decision = decideAccess({ role: actual }, rolesAtLeast(needed))
      const allowed = ROLES.indexOf(actual) >= ROLES.indexOf(needed)
      expect(decision.ok).toBe(allowed)
      if (!decision.ok) expect(decision.status).toBe(403)
    },
  )

  it('does not imply a hierarchy when roles are listed explicitly', () => {
    expect(decideAccess({ role: 'admin' }, ['writer']).ok).toBe(false)
  })
})

describe('csrfReason', () => {
  const own = new Set(['http://127.0.0.1:3000'])
  it('lets safe methods through', () => {
    expect(csrfReason({ method: 'GET', origin: 'https://evil.example', hasSessionCookie: true, ownOrigins: own })).toBeNull()
  })
  it('refuses a foreign Origin on POST, PATCH and DELETE', () => {
    for (const method of ['POST', 'PATCH', 'DELETE', 'put']) {
      expect(csrfReason({ method, origin: 'https://evil.example', hasSessionCookie: false, ownOrigins: own })).toMatch(/evil\.example/)
    }
  })
  it('accepts its own origin', () => {
    expect(csrfReason({ method: 'POST', origin: 'http://127.0.0.1:3000', hasSessionCookie: true, ownOrigins: own })).toBeNull()
  })
  it('refuses a cookie-authenticated request without Origin, but not a cookie-less one', () => {
    expect(csrfReason({ method: 'POST', hasSessionCookie: true, ownOrigins: own })).toMatch(/without an Origin/)
    expect(csrfReason({ method: 'POST', hasSessionCookie: false, ownOrigins: own })).toBeNull()
  })
})
