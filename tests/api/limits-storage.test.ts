// The start-up check of the bucket: an unsigned ListObjectsV2 against the configured
// store. The test profile's s3rver lets anyone list (it is a development stand-in), so
// the check must have found the bucket public; admins see the finding.
import { describe, expect, it } from 'vitest'
import { signedIn } from '../support/http'
import { DEMO, expectOk } from '../support/workspace'

describe('the production storage check', () => {
  it('finds that the local stand-in bucket can be listed without credentials', async () => {
    const admin = await signedIn(DEMO.admin)
    const until = Date.now() + 10_000
    let found = expectOk(await admin.get('/api/admin/runtime')).storageListing
    while (found === 'unknown' && Date.now() < until) {
      await new Promise(r => setTimeout(r, 250))
      found = expectOk(await admin.get('/api/admin/runtime')).storageListing
    }
    expect(found).toBe('public')
  })
})
