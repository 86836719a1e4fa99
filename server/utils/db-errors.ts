// Errors that mean "the database is not reachable right now" rather than a bug.
const UNREACHABLE_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'PROTOCOL_CONNECTION_LOST', 'ER_CON_COUNT_ERROR', 'ER_SERVER_SHUTDOWN', 'ER_SERVER_SHUTDOWN_COMPLETE'])

export function isDatabaseUnavailable(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e && depth < 4; e = (e as { cause?: unknown }).cause, depth++) {
    const { code, name, message } = e as { code?: string, name?: string, message?: string }
    if (code && UNREACHABLE_CODES.has(code)) return true
    if (name === 'KnexTimeoutError') return true
    if (typeof message === 'string' && /connect ECONNREFUSED|Connection lost|Pool is closed/i.test(message)) return true
  }
  return false
}
