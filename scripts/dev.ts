// npm run dev: the same local services, then nuxi dev with hot reload.
import { join } from 'node:path'
import { migrate, seedIfEmpty } from './lib/database'
import { localEnv, ROOT, serverEnv } from './lib/env'
import { killGroup, startDetached } from './lib/proc'
import { startServices } from './lib/services'

const env = localEnv('local')
const services = await startServices(env)
const settings = serverEnv(env)
await migrate(settings.DATABASE_URL!)
await seedIfEmpty(settings.DATABASE_URL!)
const { NODE_ENV: _prod, ...devSettings } = settings
const nuxt = startDetached(join(ROOT, 'node_modules', '.bin', 'nuxi'), ['dev', '--host', env.app.host, '--port', String(env.app.port)], {
  cwd: ROOT, env: { ...process.env, ...devSettings },
})
let stopping = false
async function shutdown() {
  if (stopping) return
  stopping = true
  await killGroup(nuxt)
  await services.stop()
  process.exit(0)
}
nuxt.on('exit', () => void shutdown())
process.on('SIGINT', () => void shutdown())
process.on('SIGTERM', () => void shutdown())
