// A fixed locale and time zone: the server render and the browser must print the
// same text, or hydration fails.
const DATE_TIME = new Intl.DateTimeFormat('en-GB', {
  dateStyle: 'medium',
  timeStyle: 'short',
  timeZone: 'UTC',
})

export function formatDateTime(iso: string): string {
  const date = new Date(iso)
  return Number.isNaN(date.getTime()) ? iso : `${DATE_TIME.format(date)} UTC`
}
