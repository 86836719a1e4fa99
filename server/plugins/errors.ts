// Nitro calls the 'error' hook synchronously before rendering the error, so the
// status can be corrected here: an unreachable database is a clean 503, not a 500.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error) => {
    if (!isDatabaseUnavailable(error)) return
    const e = error as { statusCode?: number, statusMessage?: string, message: string, unhandled?: boolean, fatal?: boolean }
    e.statusCode = 503
    e.statusMessage = 'Service Unavailable'
    e.message = 'The database is not reachable right now. Try again shortly.'
    e.unhandled = false
    e.fatal = false
  })
})
