// Runs last (files run one at a time, in name order): it stops the database.
import { describe, expect, it } from 'vitest'
import { localEnv } from '../../scripts/lib/env'
import { startMariadb, stopMariadb } from '../../scripts/lib/mariadb'
import { Client, signedIn } from '../support/http'

describe('health', () => {
  it('is 200 with every part ok while all run', async () => {
    const res = await new Client().get('/api/health')
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ database: 'ok', storage: 'ok', mail: 'ok' })
    expect(JSON.stringify(res.body)).not.toMatch(/password|S3RVER|mysql:/i)
  })

  it('shares the storage and mail probes between calls, so a flood costs one probe', async () => {
    const answers = await Promise.all(Array.from({ length: 10 }, () => new Client().get('/api/health')))
    const again = await new Client().get('/api/health')
    for (const res of [...answers, again]) expect(res.status).toBe(200)
    const taken = new Set([...answers, again].map(res => `${res.body.checked.storage} ${res.body.checked.mail}`))
    // One probe each, or two when the shared answer (5 s) ran out between the calls.
    expect(taken.size).toBeLessThanOrEqual(2)
    expect(Date.parse(again.body.checked.storage)).toBeLessThanOrEqual(Date.now())
  })

  it('is 503 naming the database while it is stopped, and recovers without a restart', async () => {
    const env = localEnv('test')
    const reader = await signedIn('reader@example.com')
    await stopMariadb(env.db)
    try {
      const res = await new Client().get('/api/health')
      expect(res.status).toBe(503)
      expect(res.body).toMatchObject({ database: 'unreachable', storage: 'ok', mail: 'ok' })
      const me = await reader.get('/api/auth/me')
      expect(me.status).toBe(503)
      expect(JSON.stringify(me.body)).not.toMatch(/at .*\.mjs|ECONNREFUSED|stack/i)
    }
    finally {
      await startMariadb(env.db)
    }
    const after = await new Client().get('/api/health')
    expect(after.status).toBe(200)
    expect((await reader.get('/api/auth/me')).body.user.email).toBe('reader@example.com')
  })
})
