// Pull-check benchmark (issue 14, item 2; not a timed test). Run under the test lock,
// after a build, on the test profile's ports and a throwaway data folder:
//   flock /tmp/pullsheet-test.lock npx tsx --tsconfig tsconfig.tools.json bench/pull-checks.bench.ts
// A writer checks 60 MB of pull files (three preview requests of four 5 MB files at
// once, as the import page sends them) while a second client asks GET /api/health
// back to back. Targets: no event-loop gap over 50 ms inside the server
// (perf_hooks.monitorEventLoopDelay, GET /api/admin/runtime) and health answering
// meanwhile. Writes the figures to docs/bench/pull-checks.md.
import { cpus, loadavg } from 'node:os'
import { mkdirSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { syntheticPull } from '../shared/dyno/index'
import { startApp } from '../scripts/lib/app'
import { buildIfNeeded } from '../scripts/lib/build'
import { migrate, seed } from '../scripts/lib/database'
import { localEnv, ROOT, serverEnv } from '../scripts/lib/env'
import { killGroup } from '../scripts/lib/proc'
import { startServices } from '../scripts/lib/services'
import { Client } from '../tests/support/http'

const FILES_PER_REQUEST = 4
const REQUESTS = 3
const STEP_RPM = 0.026 // about 173,000 rows and 5 MB a file

const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))
const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] ?? Number.NaN
const round = (n: number) => Math.round(n * 10) / 10

/** GET /api/health back to back until stopped; latencies in ms. */
function healthLoad(base: string) {
  const latencies: number[] = []
  let failures = 0
  let running = true
  const loop = (async () => {
    while (running) {
      const t0 = performance.now()
      const res = await fetch(`${base}/api/health`)
      await res.arrayBuffer()
      if (res.status !== 200) failures++
      latencies.push(performance.now() - t0)
      await sleep(10)
    }
  })()
  return {
    async stop() {
      running = false
      await loop
      const sorted = [...latencies].sort((a, b) => a - b)
      return { requests: sorted.length, failures, p50: round(percentile(sorted, 50)), p95: round(percentile(sorted, 95)), max: round(sorted.at(-1) ?? Number.NaN) }
    },
  }
}

// Made before any request: building them blocks this process for seconds, longer than
// the server keeps an idle keep-alive connection open.
const bodies = Array.from({ length: REQUESTS }, (_, r) => JSON.stringify({
  files: Array.from({ length: FILES_PER_REQUEST }, (_, f) => {
    const seed = r * FILES_PER_REQUEST + f + 1
    const pull = syntheticPull({ peakTorqueLbFt: 430, peakTorqueRpm: 4400, widthLowRpm: 2600, widthHighRpm: 1900, fromRpm: 2000, toRpm: 6500, stepRpm: STEP_RPM, seed })
    return { name: `bench-pull-${seed}.csv`, text: pull.csv }
  }),
}))
const benchEnv = localEnv('test')
rmSync(benchEnv.dataDir, { recursive: true, force: true })
const settings = serverEnv(benchEnv)
await buildIfNeeded()
const services = await startServices(benchEnv)
try {
  await migrate(settings.DATABASE_URL!)
  await seed(settings.DATABASE_URL!)
  const app = await startApp(benchEnv, {})
  try {
    const base = benchEnv.app.baseUrl
    const admin = new Client(base)
    const writer = new Client(base)
    await admin.post('/api/auth/login', { email: 'admin@example.com', password: 'pullsheet-demo' })
    await writer.post('/api/auth/login', { email: 'writer@example.com', password: 'pullsheet-demo' })
    const bench = (await writer.post('/api/bench-tests', { title: 'Pull check benchmark (fictional)', engineFamily: 'pushrod-v8', partType: 'camshaft' })).body.benchTest.id as number

    const totalMb = bodies.reduce((n, b) => n + Buffer.byteLength(b), 0) / 1024 / 1024
    const loadBefore = loadavg()[0]!

    // Idle figures first, then the same while the files are checked.
    await admin.post('/api/admin/runtime/reset')
    const idleLoad = healthLoad(base)
    await sleep(3000)
    const idle = await idleLoad.stop()
    const idleGap = (await admin.get('/api/admin/runtime')).body.eventLoop.maxDelayMs as number

    await admin.post('/api/admin/runtime/reset')
    const busyLoad = healthLoad(base)
    const t0 = performance.now()
    const replies = await Promise.all(bodies.map(body => writer.request('POST', `/api/bench-tests/${bench}/pulls/preview`, { headers: { 'content-type': 'application/json' }, body })))
    const checkMs = performance.now() - t0
    const busy = await busyLoad.stop()
    const busyRuntime = (await admin.get('/api/admin/runtime')).body
    const statuses = replies.map(r => r.status)
    if (statuses.some(s => s !== 200)) throw new Error(`preview answered ${statuses.join(', ')}: ${JSON.stringify(replies.find(r => r.status !== 200)?.body).slice(0, 300)}`)
    const fileCount = replies.flatMap(r => r.body.files as unknown[]).length

    const verdict = (ok: boolean) => (ok ? 'met' : 'NOT met')
    const lines = [
      '# Pull-check benchmark',
      '',
      `Measured by \`bench/pull-checks.bench.ts\` on ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC: ${cpus().length} cores, Node ${process.version}, the built server with its pull-check pool (piscina, \`PULL_CHECK_THREADS\` 1, check thread at nice ${process.env.PULL_CHECK_NICE ?? 19}), MariaDB and s3rver on the same machine. Load average (1 min) at the start / end: ${loadBefore.toFixed(2)} / ${loadavg()[0]!.toFixed(2)}; other engineers' work shared the two cores.`,
      '',
      `A writer checks ${totalMb.toFixed(1)} MB of synthetic pull files: ${REQUESTS} \`POST .../pulls/preview\` requests of ${FILES_PER_REQUEST} files at once (${fileCount} files, about 173,000 rows each). Meanwhile a second client asks \`GET /api/health\` back to back (10 ms pause). Event-loop gaps are measured inside the server (perf_hooks.monitorEventLoopDelay, 10 ms resolution).`,
      '',
      '| figure | idle (3 s before) | while checking | target |',
      '| --- | --- | --- | --- |',
      `| all ${REQUESTS} checks answered | - | ${(checkMs / 1000).toFixed(1)} s | - |`,
      `| /api/health answers (failures) | ${idle.requests} (${idle.failures}) | ${busy.requests} (${busy.failures}) | all answer |`,
      `| /api/health p50 / p95 / max | ${idle.p50} / ${idle.p95} / ${idle.max} ms | ${busy.p50} / ${busy.p95} / ${busy.max} ms | - |`,
      `| longest event-loop gap in the server | ${idleGap} ms | ${busyRuntime.eventLoop.maxDelayMs} ms (p99 ${busyRuntime.eventLoop.p99DelayMs} ms) | < 50 ms: ${verdict(busyRuntime.eventLoop.maxDelayMs < 50)} |`,
      `| server RSS after | - | ${busyRuntime.memory.rssMb} MB | - |`,
      '',
    ]
    mkdirSync(join(ROOT, 'docs', 'bench'), { recursive: true })
    writeFileSync(join(ROOT, 'docs', 'bench', 'pull-checks.md'), lines.join('\n'))
    console.log(lines.join('\n'))
  }
  finally {
    await killGroup(app)
  }
}
finally {
  await services.stop()
}
