// npm run demo:magazine: builds the demo magazine on the running `npm start` server
// (normally `npm start` does this itself on a fresh database).
import { buildDemoMagazine, demoMagazineWanted } from './demo/magazine'
import { localEnv, serverEnv } from './lib/env'

const env = localEnv('local')
const { DATABASE_URL } = serverEnv(env)
if (!(await demoMagazineWanted(DATABASE_URL!))) {
  console.log('demo magazine: not wanted here (stories exist already, or the demo seed has not run)')
}
else {
  const result = await buildDemoMagazine(env.app.baseUrl, DATABASE_URL!)
  console.log(`demo magazine: ${result.stories} stories, ${result.photos} photos in ${result.seconds.toFixed(1)} s`)
}
