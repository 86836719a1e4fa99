import { describe, expect, it } from 'vitest'
import { formatAge, formatInZone, toZonedInput, zonedTimeToUtc } from '#shared/utils/story-time'

// Offsets and clock changes from the IANA time zone database (tzdata, published), as
// bundled with Node's ICU: US Central is UTC-6 in winter and UTC-5 in summer; in 2026
// clocks go forward on 8 March at 02:00 and back on 1 November at 02:00.
describe('wall-clock times in a zone', () => {
  it('turns the magazine\'s local time into UTC, summer and winter', () => {
    expect(zonedTimeToUtc('2026-07-14T09:00', 'America/Chicago')).toBe('2026-07-14T14:00:00.000Z')
    expect(zonedTimeToUtc('2026-01-14T09:00:30', 'America/Chicago')).toBe('2026-01-14T15:00:30.000Z')
    expect(zonedTimeToUtc('2026-05-14T09:00', 'UTC')).toBe('2026-05-14T09:00:00.000Z')
  })

  it('takes the time after the jump in the hour that spring skips', () => {
    expect(zonedTimeToUtc('2026-03-08T02:30', 'America/Chicago')).toBe('2026-03-08T08:30:00.000Z')
  })

  it('takes the earlier of the two in the hour that autumn repeats', () => {
    expect(zonedTimeToUtc('2026-11-01T01:30', 'America/Chicago')).toBe('2026-11-01T06:30:00.000Z')
    expect(zonedTimeToUtc('2026-11-01T03:00', 'America/Chicago')).toBe('2026-11-01T09:00:00.000Z')
  })

  it('refuses what is not a time', () => {
    expect(zonedTimeToUtc('2026-02-30T10:00', 'UTC')).toBeNull()
    expect(zonedTimeToUtc('tomorrow', 'UTC')).toBeNull()
  })

  it('shows an instant back in a zone, for the form and for reading', () => {
    expect(toZonedInput('2026-07-14T14:00:00Z', 'America/Chicago')).toBe('2026-07-14T09:00')
    expect(formatInZone('2026-07-14T14:00:00Z', 'America/Chicago')).toBe('14 Jul 2026, 09:00 CDT')
  })

  it('says how long something has waited', () => {
    expect(formatAge(30)).toBe('under a minute')
    expect(formatAge(3 * 3600 + 20 * 60)).toBe('3 h 20 min')
    expect(formatAge(5 * 86400)).toBe('5 days')
  })
})
