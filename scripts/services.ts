// npm run services: just the local database, storage and mail, until Ctrl-C.
import { localEnv, type Profile } from './lib/env'
import { startServices } from './lib/services'

const env = localEnv((process.env.PULLSHEET_PROFILE as Profile) ?? 'local')
const services = await startServices(env)
console.log('services are up; Ctrl-C stops what was started here')
const stop = async () => { await services.stop(); process.exit(0) }
process.on('SIGINT', () => void stop())
process.on('SIGTERM', () => void stop())
setInterval(() => {}, 1 << 30)
