// Publication times: stored and sent in UTC, shown in the magazine's own time
// zone and in the reader's. The schedule form takes a wall-clock time in either
// zone and turns it into the UTC instant the server wants. Pure (Intl only).

import { DEFAULT_TIME_ZONE, formatTime } from './time-text'

/** The default desk clock; the magazine's own is the site setting timeZone (useSiteTimeZone, getSiteSettings). */
export const SITE_TIME_ZONE = DEFAULT_TIME_ZONE

const PARTS_CACHE = new Map<string, Intl.DateTimeFormat>()

function partsFormatter(timeZone: string): Intl.DateTimeFormat {
  let f = PARTS_CACHE.get(timeZone)
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' })
    PARTS_CACHE.set(timeZone, f)
  }
  return f
}

interface WallClock { year: number, month: number, day: number, hour: number, minute: number, second: number }

function wallClock(ms: number, timeZone: string): WallClock {
  const parts = Object.fromEntries(partsFormatter(timeZone).formatToParts(new Date(ms)).map(p => [p.type, p.value]))
  return { year: Number(parts.year), month: Number(parts.month), day: Number(parts.day), hour: Number(parts.hour) % 24, minute: Number(parts.minute), second: Number(parts.second) }
}

/** How far the zone's clock is ahead of UTC at that instant, in ms. */
function zoneOffsetMs(ms: number, timeZone: string): number {
  const w = wallClock(ms, timeZone)
  return Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second) - Math.floor(ms / 1000) * 1000
}

export function isTimeZone(timeZone: string): boolean {
  try {
    partsFormatter(timeZone)
    return true
  }
  catch {
    return false
  }
}

const LOCAL_INPUT = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/

/**
 * The UTC instant of a wall-clock time in a zone ("2026-05-14T09:00" in the site's
 * zone). In the hour a spring-forward skips, the time after the jump; in the hour
 * a fall-back repeats, the earlier one. null when the text is not such a time.
 */
export function zonedTimeToUtc(local: string, timeZone: string): string | null {
  const m = LOCAL_INPUT.exec(local)
  if (!m) return null
  const [year, month, day, hour, minute, second] = m.slice(1).map(v => Number(v ?? 0)) as [number, number, number, number, number, number]
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 23 || minute > 59 || second > 59) return null
  const asUtc = Date.UTC(year, month - 1, day, hour, minute, second)
  const check = new Date(asUtc)
  if (check.getUTCDate() !== day) return null
  // The zone's offset at the guessed instant may differ from the one at the naive
  // one near a change of clocks; take the second when it maps back consistently.
  const naive = zoneOffsetMs(asUtc, timeZone)
  let guess = asUtc - naive
  const settled = zoneOffsetMs(guess, timeZone)
  if (settled !== naive && zoneOffsetMs(asUtc - settled, timeZone) === settled) guess = asUtc - settled
  return new Date(guess).toISOString()
}

const pad = (n: number) => String(n).padStart(2, '0')

/** The value for an `<input type="datetime-local">` showing this instant in the zone. */
export function toZonedInput(iso: string, timeZone: string, withSeconds = false): string {
  const w = wallClock(new Date(iso).getTime(), timeZone)
  const base = `${w.year}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}`
  return withSeconds ? `${base}:${pad(w.second)}` : base
}

/** "14 May 2026, 09:00 CDT": the shared time text (shared/utils/time-text.ts). */
export function formatInZone(iso: string, timeZone: string, withSeconds = false): string {
  return formatTime(iso, timeZone, { seconds: withSeconds })
}

/** "3 h 20 min", "2 days": how long a story has waited. */
export function formatAge(seconds: number): string {
  const s = Math.max(0, Math.floor(seconds))
  if (s < 60) return 'under a minute'
  const minutes = Math.floor(s / 60)
  if (minutes < 60) return `${minutes} min`
  const hours = Math.floor(minutes / 60)
  if (hours < 48) return minutes % 60 ? `${hours} h ${minutes % 60} min` : `${hours} h`
  return `${Math.floor(hours / 24)} days`
}
