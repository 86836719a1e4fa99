import { afterAll, describe, expect, it } from 'vitest'
import { DEFAULT_SITE_SETTINGS, type SiteSettingsView } from '#shared/types/site-settings'
import { signedIn } from '../support/http'
import { closeTestDb } from '../support/db'

afterAll(closeTestDb)

describe('site settings (admin)', () => {
  it('reads, changes with the version read, refuses a stale version and bad values, then goes back', async () => {
    const admin = await signedIn('admin@example.com')
    const first = await admin.get<SiteSettingsView>('/api/admin/settings')
    expect(first.status).toBe(200)
    expect(first.body.settings.timeZone).toMatch(/\//)
    expect(first.body.settings.printColumnsMm).toEqual(expect.objectContaining({ one: expect.any(Number) }))

    const changed = await admin.patch<SiteSettingsView>('/api/admin/settings', { version: first.body.version, timeZone: 'Europe/Berlin' })
    expect(changed.status).toBe(200)
    expect(changed.body.settings.timeZone).toBe('Europe/Berlin')
    // Only the key sent changes; the other keeps its value.
    expect(changed.body.settings.printColumnsMm).toEqual(first.body.settings.printColumnsMm)
    expect(changed.body.version).toBe(first.body.version + 1)
    expect(changed.body.updatedByName).toBeTruthy()

    const stale = await admin.patch('/api/admin/settings', { version: first.body.version, timeZone: 'Asia/Tokyo' })
    expect(stale.status).toBe(409)
    expect(stale.body.message).toMatch(/changed by .* meanwhile/)
    expect((await admin.get<SiteSettingsView>('/api/admin/settings')).body.settings.timeZone).toBe('Europe/Berlin')

    const badZone = await admin.patch('/api/admin/settings', { version: changed.body.version, timeZone: 'Mars/Olympus_Mons' })
    expect(badZone.status).toBe(400)
    expect(badZone.body.data.issues).toEqual([expect.objectContaining({ path: 'timeZone' })])
    const badColumns = await admin.patch('/api/admin/settings', { version: changed.body.version, printColumnsMm: { one: 120, two: 115, three: 175 } })
    expect(badColumns.status).toBe(400)
    expect(badColumns.body.data.issues[0].path).toBe('printColumnsMm.three')

    const back = await admin.patch<SiteSettingsView>('/api/admin/settings', { version: changed.body.version, timeZone: first.body.settings.timeZone, printColumnsMm: DEFAULT_SITE_SETTINGS.printColumnsMm })
    expect(back.status).toBe(200)
    expect(back.body.settings).toEqual({ ...first.body.settings, printColumnsMm: DEFAULT_SITE_SETTINGS.printColumnsMm })
  })

  it('is for admins only', async () => {
    const editor = await signedIn('editor@example.com')
    expect((await editor.get('/api/admin/settings')).status).toBe(403)
    expect((await editor.patch('/api/admin/settings', { version: 0, timeZone: 'UTC' })).status).toBe(403)
  })
})
