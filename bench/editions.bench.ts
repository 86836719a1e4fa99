// The uncached story page built from its edition (issue 13's speed target), run on demand:
//   flock /tmp/pullsheet-test.lock npx tsx --tsconfig tsconfig.tools.json bench/editions.bench.ts
// Builds the demo magazine on the test profile (the same code `npm start` runs), then,
// for the demo's camshaft story and its header story, loads the page as a signed-in
// reader (private, so never served from the page cache) with wrk at 10 connections,
// on two app servers of the same build and database taking turns: one with a process
// per core (server/cluster.mjs; BENCH_PROCESSES to choose) and one with one process.
// Target: p95 under 60 ms on this machine. Invented data throughout.
import { rmSync } from 'node:fs'
import os from 'node:os'
import { startApp } from '../scripts/lib/app'
import { buildIfNeeded } from '../scripts/lib/build'
import { migrate, scriptDb, seed } from '../scripts/lib/database'
import { localEnv, serverEnv } from '../scripts/lib/env'
import { killGroup } from '../scripts/lib/proc'
import { startServices } from '../scripts/lib/services'
import { buildDemoMagazine } from '../scripts/demo/magazine'
import { DEMO_PASSWORD } from '../shared/utils/demo-accounts'
import { Client } from '../tests/support/http'
import { expectOk } from '../tests/support/workspace'
import { clean, wrk, type WrkResult } from './wrk'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10)
const WARMUP_SECONDS = 3
const BROTLI = { 'accept-encoding': 'gzip, deflate, br' }
/** The demo stories measured, found by their part type and engine (scripts/demo/stories.ts). */
const STORIES = [
  { name: 'camshaft story (four cams, 5.7)', headline: /^Four cams/ },
  { name: 'header story (long tubes, 6.3)', headline: /^Long tubes/ },
]

const env = localEnv('test')
rmSync(env.dataDir, { recursive: true, force: true })
const settings = serverEnv(env)
await buildIfNeeded()
const services = await startServices(env)
const processes = Number(process.env.BENCH_PROCESSES ?? os.availableParallelism())
const servers = [{ base: env.app.baseUrl, processes }, ...(processes > 1 ? [{ base: `http://${env.app.host}:${env.app.port + 1}`, processes: 1 }] : [])]
const apps: Awaited<ReturnType<typeof startApp>>[] = []
try {
  await migrate(settings.DATABASE_URL!)
  await seed(settings.DATABASE_URL!)
  for (const [i, server] of servers.entries()) apps.push(await startApp(env, { MAIL_POLL_MS: '300', PULLSHEET_PROCESSES: String(server.processes) }, env.app.port + i))
  const built = await buildDemoMagazine(env.app.baseUrl, settings.DATABASE_URL!)
  console.log(`demo magazine: ${built.stories} stories in ${built.seconds.toFixed(1)} s`)
  const db = scriptDb(settings.DATABASE_URL!)
  const published = await db('stories').where({ state: 'published' }).select('slug', 'headline')
  await db.destroy()

  const reader = new Client(env.app.baseUrl)
  expectOk(await reader.post('/api/auth/login', { email: 'reader@example.com', password: DEMO_PASSWORD }))
  console.log(`load average ${os.loadavg().map(l => l.toFixed(1)).join(' ')}`)
  for (const story of STORIES) {
    const row = published.find(s => story.headline.test(s.headline))
    if (!row) throw new Error(`no published demo story for ${story.name}`)
    const headers = { cookie: reader.cookie, ...BROTLI }
    const urls = servers.map(s => `${s.base}/stories/${row.slug}`)
    for (const url of urls) {
      const probe = await fetch(url, { headers })
      if (probe.status !== 200 || probe.headers.get('x-page-cache') || !/private/.test(probe.headers.get('cache-control') ?? '')) {
        throw new Error(`the signed-in page must be private and uncached: ${probe.status} ${probe.headers.get('x-page-cache')} ${probe.headers.get('cache-control')}`)
      }
      // The server's first seconds are its JIT warming up: the same load first, not counted.
      await wrk(url, { connections: 10, seconds: WARMUP_SECONDS, headers })
    }
    // The servers take turns, two rounds of half the time each.
    const halves = urls.map(() => [] as WrkResult[])
    for (let round = 0; round < 2; round++) {
      for (const [i, url] of urls.entries()) halves[i]!.push(clean(story.name, await wrk(url, { connections: 10, seconds: SECONDS / 2, headers })))
    }
    for (const [i, [a, b]] of halves.entries()) {
      const perSecond = (a!.requests + b!.requests) / (a!.requests / a!.perSecond + b!.requests / b!.perSecond)
      console.log(`${story.name}, uncached, signed-in reader, 10 concurrent, ${servers[i]!.processes} process(es): p50 ${a!.p50.toFixed(1)}/${b!.p50.toFixed(1)} ms, p95 ${a!.p95.toFixed(1)}/${b!.p95.toFixed(1)} ms, p99 ${a!.p99.toFixed(1)}/${b!.p99.toFixed(1)} ms (rounds 1/2; n = ${a!.requests + b!.requests}, ${perSecond.toFixed(0)} req/s; target p95 < 60 ms)`)
    }
  }
  console.log(`load average ${os.loadavg().map(l => l.toFixed(1)).join(' ')}`)
}
finally {
  for (const app of apps) await killGroup(app)
  await services.stop()
}
process.exit(0)
