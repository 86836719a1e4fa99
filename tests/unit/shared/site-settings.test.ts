import { describe, expect, it } from 'vitest'
import { DEFAULT_SITE_SETTINGS, SiteSettingsPatchBody, SiteSettingsSchema } from '#shared/types/site-settings'
import { isKnownTimeZone } from '#shared/settings/time-zone'

describe('site settings schema', () => {
  it('accepts the defaults', () => {
    expect(SiteSettingsSchema.parse(DEFAULT_SITE_SETTINGS)).toEqual(DEFAULT_SITE_SETTINGS)
  })

  it('knows IANA zone names and refuses made-up ones', () => {
    // Zone names from the IANA time zone database (tzdata), as Intl reads them.
    expect(isKnownTimeZone('America/Chicago')).toBe(true)
    expect(isKnownTimeZone('UTC')).toBe(true)
    expect(isKnownTimeZone('Mars/Olympus_Mons')).toBe(false)
  })

  it('wants a version and widening column spans', () => {
    expect(SiteSettingsPatchBody.safeParse({ timeZone: 'UTC' }).success).toBe(false)
    const narrowing = SiteSettingsPatchBody.safeParse({ version: 1, printColumnsMm: { one: 55, two: 50, three: 175 } })
    expect(narrowing.success).toBe(false)
    expect(narrowing.error?.issues[0]?.path).toEqual(['printColumnsMm', 'three'])
  })
})
