import { isDatabaseUnavailable } from '../utils/db-unavailable'

// Nitro calls the 'error' hook synchronously before rendering the error, so the
// status can be corrected here: an unreachable database is a clean 503, not a 500.
export default defineNitroPlugin((nitroApp) => {
  let databasePort = 3306
  try { databasePort = Number(new URL(appConfig().databaseUrl).port || 3306) }
  catch { /* no DATABASE_URL: the startup check says so */ }
  nitroApp.hooks.hook('error', (error) => {
    if (!isDatabaseUnavailable(error, databasePort)) return
    const e = error as { statusCode?: number, statusMessage?: string, message: string, unhandled?: boolean, fatal?: boolean }
    e.statusCode = 503
    e.statusMessage = 'Service Unavailable'
    e.message = 'The database is not reachable right now. Try again shortly.'
    e.unhandled = false
    e.fatal = false
  })
})
