// Every app server runs this loop; row locks in deliverDueMail keep sends unique.
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender || process.env.PULLSHEET_WORKERS === '0') return
  const intervalMs = Number(process.env.MAIL_POLL_MS ?? 2000)
  let running = false
  const timer = setInterval(async () => {
    if (running) return
    running = true
    try { await deliverDueMail() }
    catch { /* database or SMTP away: the rows stay pending and are tried again */ }
    finally { running = false }
  }, intervalMs)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
