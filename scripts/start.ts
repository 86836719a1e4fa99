// npm start: services, migrations, demo seed when empty, build when needed, production server.
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../shared/utils/demo-accounts'
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
  await seedIfEmpty(DATABASE_URL!)
  await buildIfNeeded()
  app = await startApp(env)
  app.on('exit', code => void shutdown(code ?? 1))
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
