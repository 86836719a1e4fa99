// npm run db:migrate | db:seed | db:reset against the local profile (PULLSHEET_PROFILE=test for the test one).
import { migrate, reset, seed } from './lib/database'
import { localEnv, serverEnv, type Profile } from './lib/env'
import { startServices } from './lib/services'

const command = process.argv[2]
if (!['migrate', 'seed', 'reset'].includes(command ?? '')) {
  console.error('usage: tsx scripts/db.ts migrate|seed|reset')
  process.exit(2)
}
const env = localEnv((process.env.PULLSHEET_PROFILE as Profile) ?? 'local')
const url = process.env.DATABASE_URL ?? serverEnv(env).DATABASE_URL!
const services = process.env.DATABASE_URL ? undefined : await startServices(env)
try {
  if (command === 'migrate') await migrate(url)
  if (command === 'seed') await seed(url)
  if (command === 'reset') await reset(url)
  console.log(`db:${command} done`)
}
finally {
  await services?.stop()
}
