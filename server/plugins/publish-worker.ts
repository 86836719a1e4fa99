import { publishJobHandlers } from '~~/server/services/desk/publish'
// Every app server runs this loop; the job row's SKIP LOCKED claim and the story's
// row lock keep each publication to exactly one. The first tick runs at startup,
// so stories whose time passed while no server was up go live straight away.
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender || process.env.PULLSHEET_WORKERS === '0') return
  const intervalMs = Number(process.env.PUBLISH_POLL_MS ?? 1000)
  let running = false
  const tick = async () => {
    if (running) return
    running = true
    try {
      // Several stories may fall due together: drain what is due, then wait.
      for (let n = 0; n < 50 && await runOneJob(publishJobHandlers(useDb()), 120); n++) { /* next */ }
    }
    catch { /* database away: the jobs stay due and are claimed on a later tick */ }
    finally { running = false }
  }
  const timer = setInterval(tick, intervalMs)
  timer.unref()
  void tick()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
