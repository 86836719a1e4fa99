import { purgeExpiredRows } from '~~/server/services/accounts/housekeeping'
// Every app server trims the tables that only grow (server/services/accounts/housekeeping.ts) a
// little after start and then every HOUSEKEEPING_MINUTES, as the photo sweep runs.
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender || process.env.PULLSHEET_WORKERS === '0') return
  let running = false
  const purge = async () => {
    if (running) return
    running = true
    try { await purgeExpiredRows(useDb()) }
    catch (error) { console.warn('housekeeping did not finish:', (error as Error).message) }
    finally { running = false }
  }
  const first = setTimeout(purge, Number(process.env.HOUSEKEEPING_DELAY_SECONDS ?? 60) * 1000)
  const every = setInterval(purge, Number(process.env.HOUSEKEEPING_MINUTES ?? 30) * 60 * 1000)
  first.unref()
  every.unref()
  nitroApp.hooks.hook('close', () => {
    clearTimeout(first)
    clearInterval(every)
  })
})
