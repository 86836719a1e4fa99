import type { FieldIssue } from '#shared/types/users'

// $fetch rejects with a FetchError; we read it by shape so these helpers also
// accept errors that went through createError or a payload round trip.
interface ErrorBody {
  message?: string
  statusMessage?: string
  data?: unknown
}

export function apiStatus(err: unknown): number | undefined {
  if (!err || typeof err !== 'object') return undefined
  const e = err as { statusCode?: unknown, status?: unknown }
  const code = e.statusCode ?? e.status
  return typeof code === 'number' ? code : undefined
}

function apiBody(err: unknown): ErrorBody | undefined {
  if (!err || typeof err !== 'object') return undefined
  const data = (err as { data?: unknown }).data
  return data && typeof data === 'object' ? data as ErrorBody : undefined
}

/** The server's own words when it sent some, else the fallback (never a stack or URL). */
export function apiMessage(err: unknown, fallback: string): string {
  const body = apiBody(err)
  const message = body?.message ?? body?.statusMessage
  return typeof message === 'string' && message.trim() ? message : fallback
}

/** Field problems from a 400 answer: `{ data: { issues: [{ path, message }] } }`. */
export function apiFieldIssues(err: unknown): FieldIssue[] {
  if (apiStatus(err) !== 400) return []
  const inner = apiBody(err)?.data as { issues?: unknown } | undefined
  if (!inner || !Array.isArray(inner.issues)) return []
  return inner.issues.filter((i): i is FieldIssue =>
    !!i && typeof i === 'object' && typeof (i as FieldIssue).message === 'string',
  ).map(i => ({ path: String(i.path ?? ''), message: i.message }))
}

/** Seconds to wait from a 429 answer, if the server said. */
export function apiRetryAfter(err: unknown): number | undefined {
  if (apiStatus(err) !== 429) return undefined
  const inner = apiBody(err)?.data as { retryAfterSeconds?: unknown } | undefined
  const seconds = inner?.retryAfterSeconds
  return typeof seconds === 'number' && seconds > 0 ? Math.ceil(seconds) : undefined
}

export function describeWait(seconds: number): string {
  if (seconds < 90) return `${seconds} second${seconds === 1 ? '' : 's'}`
  const minutes = Math.ceil(seconds / 60)
  return `${minutes} minutes`
}
