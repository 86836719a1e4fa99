import { describe, expect, it } from 'vitest'
import { Client, DEMO_PASSWORD } from '../support/http'

describe('security headers', () => {
  it('pages carry a CSP without unsafe-inline scripts, nosniff, a referrer policy and no framing', async () => {
    const res = await new Client().request('GET', '/', { headers: { accept: 'text/html' } })
    expect(res.status).toBe(200)
    const csp = res.headers.get('content-security-policy') ?? ''
    expect(csp).toContain(`frame-ancestors 'none'`)
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin')
    expect(res.headers.get('x-frame-options')).toBe('DENY')
  })

  it('the session cookie is HttpOnly and SameSite', async () => {
    const res = await new Client().post('/api/auth/login', { email: 'reader@example.com', password: DEMO_PASSWORD })
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('pullsheet-session='))!
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
  })

  it('error answers carry no stack trace', async () => {
    const res = await new Client().get('/api/users/not-a-number')
    expect(res.status).toBeGreaterThanOrEqual(400)
    expect(JSON.stringify(res.body)).not.toMatch(/\bat .+\.(m?js|ts):\d+|node_modules/)
  })
})
