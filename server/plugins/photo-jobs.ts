import { startPhotoJobLoop } from '~~/server/services/photos/jobs'
import { stopPhotoWorkers } from '~~/server/services/photos/pool'
import { sweepPhotoStorage } from '~~/server/services/photos/sweep'
// Every app server sizes photos (row locks keep each job on one) and sweeps
// storage a little after start and then every few hours.
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender || process.env.PULLSHEET_WORKERS === '0') return
  const stopLoop = startPhotoJobLoop(useDb())

  const sweep = () => {
    sweepPhotoStorage(useDb()).catch(error => console.warn('photo sweep did not finish:', (error as Error).message))
  }
  const first = setTimeout(sweep, Number(process.env.PHOTO_SWEEP_DELAY_SECONDS ?? 30) * 1000)
  const every = setInterval(sweep, Number(process.env.PHOTO_SWEEP_HOURS ?? 6) * 3600 * 1000)
  first.unref()
  every.unref()

  nitroApp.hooks.hook('close', () => {
    stopLoop()
    stopPhotoWorkers()
    clearTimeout(first)
    clearInterval(every)
  })
})
