import { describe, expect, it } from 'vitest'
import { formatTime, ownTimeText, timeWithOwn, zoneAbbreviation } from '#shared/utils/time-text'

// Offsets and abbreviations from the IANA time zone database (tzdata) and CLDR, as bundled
// with Node's ICU: US Central is UTC-6 (CST) in winter and UTC-5 (CDT) in summer; central
// Europe is UTC+1 (CET) / UTC+2 (CEST); Japan is UTC+9 all year with no common letters.
describe('one time text', () => {
  it('says the magazine\'s clock with its abbreviation, winter and summer', () => {
    expect(formatTime('2026-12-04T01:02:03Z', 'America/Chicago')).toBe('3 Dec 2026, 19:02 CST')
    expect(formatTime('2026-07-14T14:00:00Z', 'America/Chicago')).toBe('14 Jul 2026, 09:00 CDT')
    expect(formatTime('2026-07-14T14:00:00Z', 'Europe/Berlin')).toBe('14 Jul 2026, 16:00 CEST')
    expect(formatTime('2026-07-14T14:00:00Z', 'UTC')).toBe('14 Jul 2026, 14:00 UTC')
  })

  it('uses only plain ASCII spaces (no narrow no-break space), so server and browser agree', () => {
    expect(formatTime('2026-07-14T14:00:00Z', 'America/Chicago')).toMatch(/^[\x20-\x7e]+$/)
  })

  it('falls back to an offset where a zone has no common letters', () => {
    expect(zoneAbbreviation(new Date('2026-07-14T14:00:00Z'), 'Asia/Tokyo')).toBe('UTC+9')
  })

  it('adds seconds or gives the date only when asked, and leaves a non-time alone', () => {
    expect(formatTime('2026-07-14T14:00:05Z', 'America/Chicago', { seconds: true })).toBe('14 Jul 2026, 09:00:05 CDT')
    expect(formatTime('2026-07-14T04:00:00Z', 'America/Chicago', { dateOnly: true })).toBe('13 Jul 2026')
    expect(formatTime('not a time', 'America/Chicago')).toBe('not a time')
  })

  it('adds the reader\'s own clock only where it reads differently', () => {
    const at = '2026-12-04T01:02:00Z'
    expect(ownTimeText(at, 'America/Chicago', 'Europe/Berlin')).toBe('4 Dec 2026, 02:02 CET')
    expect(ownTimeText(at, 'America/Chicago', 'America/Chicago')).toBeNull()
    // Same clock under another name (Winnipeg keeps Central time too).
    expect(ownTimeText(at, 'America/Chicago', 'America/Winnipeg')).toBeNull()
    expect(ownTimeText(at, 'America/Chicago', null)).toBeNull()
    expect(timeWithOwn(at, 'America/Chicago', 'Europe/Berlin')).toBe('3 Dec 2026, 19:02 CST (your time: 4 Dec 2026, 02:02 CET)')
  })
})
