import { isDatabaseUnavailable } from './db-unavailable'

let databasePort: number | undefined

/** True when the error means the database is away right now (a 503), not a bug. */
export function isDatabaseOutage(error: unknown): boolean {
  if (databasePort === undefined) {
    try { databasePort = Number(new URL(appConfig().databaseUrl).port || 3306) }
    catch { databasePort = 3306 }
  }
  return isDatabaseUnavailable(error, databasePort)
}

/** The error as the reader should get it: an outage becomes a clean 503. */
export function outageAs503(error: unknown): unknown {
  if (!isDatabaseOutage(error)) return error
  return createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: 'The database is not reachable right now. Try again shortly.' })
}
