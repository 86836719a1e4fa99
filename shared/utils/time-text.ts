// The one way Pullsheet says a time, on every page and in every e-mail: day, month,
// year, 24-hour clock and the zone's abbreviation, in the magazine's time zone (a site
// setting), plus the reader's own clock where it differs. Built from Intl's parts in a
// fixed order, so the server render and every browser print the same characters (no
// locale punctuation, no narrow no-break spaces) and hydration never disagrees. Pure.

/** The magazine's time zone until an admin sets another (no zod here: the reader's page imports this). */
export const DEFAULT_TIME_ZONE = 'America/Chicago'

export interface TimeTextOptions {
  /** Add seconds (schedule confirmations). */
  seconds?: boolean
  /** Only the date: "4 Dec 2026". */
  dateOnly?: boolean
}

const FORMATTERS = new Map<string, Intl.DateTimeFormat>()

function formatter(locale: string, timeZone: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale}|${timeZone}|${JSON.stringify(options)}`
  let f = FORMATTERS.get(key)
  if (!f) {
    f = new Intl.DateTimeFormat(locale, { timeZone, ...options })
    FORMATTERS.set(key, f)
  }
  return f
}

function part(parts: Intl.DateTimeFormatPart[], type: Intl.DateTimeFormatPartTypes): string {
  return parts.find(p => p.type === type)?.value ?? ''
}

// CLDR keeps the familiar letters per region: US zones in en-US ("CST"), European ones in
// en-GB ("CET", "BST"), Australian ones in en-AU ("AEDT"). Elsewhere an offset remains.
const ABBREVIATION_LOCALES = ['en-US', 'en-GB', 'en-AU'] as const

/** "CST", "CEST", "UTC"; "UTC+9" where no common letters exist. */
export function zoneAbbreviation(date: Date, timeZone: string): string {
  let fallback = ''
  for (const locale of ABBREVIATION_LOCALES) {
    const name = part(formatter(locale, timeZone, { timeZoneName: 'short' }).formatToParts(date), 'timeZoneName')
    if (!/^GMT[+-]/.test(name) && name) return name
    fallback ||= name
  }
  return fallback.replace(/^GMT/, 'UTC') || 'UTC'
}

/** "4 Dec 2026, 19:02 CST" in the given zone; the input unchanged when it is no time. */
export function formatTime(iso: string | Date, timeZone: string, options: TimeTextOptions = {}): string {
  const date = new Date(iso)
  if (Number.isNaN(date.getTime())) return String(iso)
  const parts = formatter('en-US', timeZone, {
    year: 'numeric', month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit', second: '2-digit', hourCycle: 'h23',
  }).formatToParts(date)
  const day = `${part(parts, 'day')} ${part(parts, 'month')} ${part(parts, 'year')}`
  if (options.dateOnly) return day
  const clock = `${part(parts, 'hour')}:${part(parts, 'minute')}${options.seconds ? `:${part(parts, 'second')}` : ''}`
  return `${day}, ${clock} ${zoneAbbreviation(date, timeZone)}`
}

/** The same instant on the reader's clock, or null when their clock reads the same as the magazine's. */
export function ownTimeText(iso: string | Date, siteZone: string, viewerZone: string | null | undefined, options: TimeTextOptions = {}): string | null {
  if (!viewerZone || viewerZone === siteZone) return null
  const own = formatTime(iso, viewerZone, options)
  return own === formatTime(iso, siteZone, options) ? null : own
}

/** A whole sentence's worth for e-mails and titles: "4 Dec 2026, 19:02 CST (your time: 5 Dec 2026, 02:02 CET)". */
export function timeWithOwn(iso: string | Date, siteZone: string, viewerZone?: string | null, options: TimeTextOptions = {}): string {
  const own = ownTimeText(iso, siteZone, viewerZone, options)
  return own ? `${formatTime(iso, siteZone, options)} (your time: ${own})` : formatTime(iso, siteZone, options)
}
