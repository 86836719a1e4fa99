// The uncached story page built from its edition (issue 13's speed target), run on demand:
//   flock /tmp/pullsheet-test.lock npx tsx --tsconfig tsconfig.tools.json bench/editions.bench.ts
// Builds the demo magazine on the test profile (the same code `npm start` runs), then,
// for the demo's camshaft story and its header story, loads the page as a signed-in
// reader (private, so never served from the page cache) with wrk at 10 connections,
// on two app servers of the same build and database taking turns: one with a process
// per core (server/cluster.mjs; BENCH_PROCESSES to choose) and one with one process.
// Target: p95 under 60 ms on this machine. Then a small signed-in page without a story
// (FLOOR) the same way, for what any page costs. Invented data throughout.
// Each row also prints the server's CPU milliseconds per page (user + system time of the
// server's processes over the row, from /proc, divided by the pages answered): unlike the
// latencies, that figure holds while other work shares the cores.
// Last, the framework's own yardstick in the same run: a Nuxt app with nothing of ours
// (bench/minimal-nuxt: one page of plain text, the project's own Nuxt and Vue), built
// into .data/bench and loaded the same way on one process. What a page can cost here at
// the least, and what that gives at ten concurrent readers.
import { rmSync } from 'node:fs'
import os from 'node:os'
import { join } from 'node:path'
import { startApp } from '../scripts/lib/app'
import { buildIfNeeded } from '../scripts/lib/build'
import { migrate, scriptDb, seed } from '../scripts/lib/database'
import { localEnv, ROOT, serverEnv } from '../scripts/lib/env'
import { killGroup, portOpen, runInherit, startDetached, waitFor } from '../scripts/lib/proc'
import { startServices } from '../scripts/lib/services'
import { buildDemoMagazine } from '../scripts/demo/magazine'
import { DEMO_PASSWORD } from '../shared/utils/demo-accounts'
import { Client } from '../tests/support/http'
import { expectOk } from '../tests/support/workspace'
import { processCpuMs } from './proc-cpu'
import { clean, wrk, type WrkResult } from './wrk'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10)
const WARMUP_SECONDS = 3
const BROTLI = { 'accept-encoding': 'gzip, deflate, br' }
/** The demo stories measured, found by their part type and engine (scripts/demo/stories.ts). */
const STORIES = [
  { name: 'camshaft story (four cams, 5.7)', headline: /^Four cams/ },
  { name: 'header story (long tubes, 6.3)', headline: /^Long tubes/ },
]
/**
 * A small signed-in page with no story on it (the site's own "about" page), loaded the
 * same way: what any page costs the framework (router, plugins, layout and header, head,
 * session and user row, payload, compression), the floor under the story pages' figures.
 */
const FLOOR = { name: 'about page (no story: the floor of any signed-in page)', path: '/about' }

/**
 * Loads each URL with wrk at 10 connections (first the same load, uncounted, while the
 * JIT warms up), the servers taking turns, two rounds of half the time each; one line per
 * server: latencies per round, the rate, and the server's CPU time per page.
 */
async function measure(urls: string[], pids: number[], headers: Record<string, string>): Promise<string[]> {
  for (const url of urls) await wrk(url, { connections: 10, seconds: WARMUP_SECONDS, headers })
  const halves = urls.map(() => [] as WrkResult[])
  const cpuMs = urls.map(() => 0)
  for (let round = 0; round < 2; round++) {
    for (const [i, url] of urls.entries()) {
      const before = processCpuMs({ group: pids[i]! })
      halves[i]!.push(clean(url, await wrk(url, { connections: 10, seconds: SECONDS / 2, headers })))
      cpuMs[i]! += processCpuMs({ group: pids[i]! }) - before
    }
  }
  return halves.map(([a, b], i) => {
    const perSecond = (a!.requests + b!.requests) / (a!.requests / a!.perSecond + b!.requests / b!.perSecond)
    const cpuPerPage = cpuMs[i]! / (a!.requests + b!.requests)
    return `p50 ${a!.p50.toFixed(1)}/${b!.p50.toFixed(1)} ms, p95 ${a!.p95.toFixed(1)}/${b!.p95.toFixed(1)} ms, p99 ${a!.p99.toFixed(1)}/${b!.p99.toFixed(1)} ms (rounds 1/2; n = ${a!.requests + b!.requests}, ${perSecond.toFixed(0)} req/s, ${cpuPerPage.toFixed(1)} CPU ms per page`
  })
}

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
  const pages = STORIES.map((story) => {
    const row = published.find(s => story.headline.test(s.headline))
    if (!row) throw new Error(`no published demo story for ${story.name}`)
    return { name: story.name, path: `/stories/${row.slug}` }
  })
  for (const story of [...pages, FLOOR]) {
    const headers = { cookie: reader.cookie, ...BROTLI }
    const urls = servers.map(s => `${s.base}${story.path}`)
    for (const url of urls) {
      const probe = await fetch(url, { headers })
      if (probe.status !== 200 || probe.headers.get('x-page-cache') || !/private/.test(probe.headers.get('cache-control') ?? '')) {
        throw new Error(`the signed-in page must be private and uncached: ${probe.status} ${probe.headers.get('x-page-cache')} ${probe.headers.get('cache-control')}`)
      }
    }
    const rows = await measure(urls, apps.map(app => app.pid!), headers)
    for (const [i, row] of rows.entries()) {
      console.log(`${story.name}, uncached, signed-in reader, 10 concurrent, ${servers[i]!.processes} process(es): ${row}${story === FLOOR ? '' : '; target p95 < 60 ms'}; load average ${os.loadavg()[0]!.toFixed(1)})`)
    }
  }

  // The yardstick: Nuxt alone, built from bench/minimal-nuxt into .data/bench, one process.
  const code = await runInherit(join(ROOT, 'node_modules', '.bin', 'nuxi'), ['build', 'bench/minimal-nuxt'], { cwd: ROOT, env: { ...process.env, NODE_ENV: 'production' }, stdio: 'ignore' })
  if (code !== 0) throw new Error(`nuxi build bench/minimal-nuxt failed with exit code ${code}`)
  const port = env.app.port + servers.length
  const bare = startDetached(process.execPath, [join(ROOT, '.data', 'bench', 'minimal-nuxt', '.output', 'server', 'index.mjs')], {
    cwd: ROOT, env: { ...process.env, NODE_ENV: 'production', PORT: String(port), NITRO_PORT: String(port), HOST: env.app.host, NITRO_HOST: env.app.host },
  })
  apps.push(bare)
  await waitFor(`the minimal Nuxt app on port ${port}`, () => portOpen(port, env.app.host), 60_000)
  const [row] = await measure([`http://${env.app.host}:${port}/`], [bare.pid!], BROTLI)
  console.log(`yardstick: Nuxt alone (bench/minimal-nuxt, a page of text, no session), 10 concurrent, 1 process: ${row}; load average ${os.loadavg()[0]!.toFixed(1)})`)
  console.log(`load average ${os.loadavg().map(l => l.toFixed(1)).join(' ')}`)
}
finally {
  for (const app of apps) await killGroup(app)
  await services.stop()
}
process.exit(0)
