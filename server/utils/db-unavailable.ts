// Errors that mean "the database is not reachable right now" rather than a bug.
// Socket errors (ECONNREFUSED ...) count only when they name the database's port
// or come from the MySQL driver: the S3 client and SMTP fail with the same codes.
const SOCKET_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH'])
const DRIVER_CODES = new Set(['PROTOCOL_CONNECTION_LOST', 'ER_CON_COUNT_ERROR', 'ER_SERVER_SHUTDOWN', 'ER_SERVER_SHUTDOWN_COMPLETE'])

interface ErrorLike { code?: string, name?: string, message?: string, port?: number, fatal?: boolean, cause?: unknown }

export function isDatabaseUnavailable(error: unknown, databasePort: number): boolean {
  for (let e = error as ErrorLike | undefined, depth = 0; e && depth < 4; e = e.cause as ErrorLike | undefined, depth++) {
    if (e.name === 'KnexTimeoutError') return true
    if (e.code && DRIVER_CODES.has(e.code)) return true
    // mysql2 marks a lost or refused connection fatal; node's own socket errors carry the port.
    if (e.code && SOCKET_CODES.has(e.code) && (e.fatal === true || e.port === databasePort)) return true
    // A transaction whose connection died under it fails its ROLLBACK with mysql2's
    // closed-state error (fatal, no code): the database went away, not a bug.
    if (typeof e.message === 'string' && /Connection lost: The server closed|Pool is closed|Knex: Timeout acquiring|Can't add new command when connection is in closed state|Can't write in closed state/i.test(e.message)) return true
  }
  return false
}
