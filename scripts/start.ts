// npm start: services, migrations, demo seed when empty, build when needed, production server.
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../shared/utils/demo-accounts'
import { buildDemoMagazine, demoMagazineWanted } from './demo/magazine'
import { startApp } from './lib/app'
import { buildIfNeeded } from './lib/build'
import { migrate, seedIfEmpty } from './lib/database'
import { localEnv, serverEnv } from './lib/env'
import { killGroup } from './lib/proc'
import { startServices } from './lib/services'

const env = localEnv('local')
const services = await startServices(env)
let app: Awaited<ReturnType<typeof startApp>> | undefined
let stopping = false

async function shutdown(code: number) {
  if (stopping) return
  stopping = true
  console.log('\nstopping...')
  if (app) await killGroup(app)
  await services.stop()
  process.exit(code)
}
process.on('SIGINT', () => void shutdown(0))
process.on('SIGTERM', () => void shutdown(0))

try {
  const { DATABASE_URL } = serverEnv(env)
  await migrate(DATABASE_URL!)
  const seedStarted = Date.now()
  if (await seedIfEmpty(DATABASE_URL!)) console.log(`database: demo data seeded in ${((Date.now() - seedStarted) / 1000).toFixed(1)} s`)
  await buildIfNeeded()
  // Two photos sized at once (the production default is one, for 24 MP uploads on
  // small servers): the demo's drawn photos are small, and a local machine has the cores.
  app = await startApp(env, { PHOTO_WORKERS: process.env.PHOTO_WORKERS ?? '2' })
  app.on('exit', code => void shutdown(code ?? 1))
  if (await demoMagazineWanted(DATABASE_URL!)) {
    console.log('demo magazine: writing, photographing and publishing the season...')
    await buildDemoMagazine(env.app.baseUrl, DATABASE_URL!)
      .then(r => console.log(`demo magazine: ${r.stories} stories, ${r.photos} photos in ${r.seconds.toFixed(1)} s (writing ${r.phases.writing.toFixed(1)} s, waiting for photo sizing ${r.phases.waitingForPhotos.toFixed(1)} s, publishing ${r.phases.publishing.toFixed(1)} s)`))
      .catch((error: Error) => console.warn(`demo magazine: stopped: ${error.message}`))
  }
  console.log(`
Pullsheet is running at ${env.app.baseUrl}

Demo accounts (password: ${DEMO_PASSWORD}):
${DEMO_ACCOUNTS.map(a => `  ${a.role.padEnd(7)} ${a.email}`).join('\n')}

Caught e-mail: ${env.smtp.mailDir} (admins: ${env.app.baseUrl}/admin/mail)
Press Ctrl-C to stop.`)
}
catch (error) {
  console.error(`start failed: ${(error as Error).message}`)
  await shutdown(1)
}
