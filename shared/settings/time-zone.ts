/** True when the runtime's Intl knows the zone (IANA names such as "America/Chicago", or "UTC"). */
export function isKnownTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: zone })
    return true
  }
  catch {
    return false
  }
}
