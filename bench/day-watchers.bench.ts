// Dyno day benchmark, run on demand (not a test):
//   flock /tmp/pullsheet-test.lock npx tsx --tsconfig tsconfig.tools.json bench/day-watchers.bench.ts
// Starts the test profile's services and the built server (build it first with the test
// runner), makes a bench test with a running plan, opens WATCHERS event streams on the
// day view (as the browser's EventSource does), then sends PULLS files through the
// operator link, one every INTERVAL_MS. Measures, per file, the time from the upload's
// answer to each watcher's change event, and the server's memory and event-loop delay
// (GET /api/admin/runtime) before the watchers, with them idle, and after the pulls.
// Synthetic pulls (invented data).
import { loadavg } from 'node:os'
import { syntheticPull } from '../shared/dyno/index'
import { localEnv } from '../scripts/lib/env'
import { startServices } from '../scripts/lib/services'
import { startApp } from '../scripts/lib/app'
import { killGroup } from '../scripts/lib/proc'
import { Client } from '../tests/support/http'

const WATCHERS = Number(process.env.WATCHERS ?? 20)
const PULLS = Number(process.env.PULLS ?? 20)
const INTERVAL_MS = Number(process.env.INTERVAL_MS ?? 1000)

const testEnv = localEnv('test')
const services = await startServices(testEnv)
const app = await startApp(testEnv, { PULLSHEET_WORKERS: '0' })
const base = testEnv.app.baseUrl
const streams: AbortController[] = []
try {
  const admin = new Client(base)
  if ((await admin.post('/api/auth/login', { email: 'admin@example.com', password: 'pullsheet-demo' })).status !== 200) throw new Error('seed the test database first (run the test runner once)')
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const ok = async (r: Promise<{ status: number, body: any }>) => {
    const res = await r
    if (res.status >= 300) throw new Error(`${res.status} ${JSON.stringify(res.body).slice(0, 200)}`)
    return res.body
  }
  const bt = (await ok(admin.post('/api/bench-tests', { title: 'Benchmark dyno day (synthetic)', engineFamily: 'pushrod-v8', partType: 'camshaft' }))).benchTest
  const setup = (await ok(admin.post(`/api/bench-tests/${bt.id}/setups`, { label: 'Baseline' }))).setup
  const plan = (await ok(admin.request('PUT', `/api/bench-tests/${bt.id}/plan`, { json: { version: 0, acceptance: { rpmFrom: 3000, rpmTo: 6000, coolantF: null, oilF: null, airTempF: null, baroInHg: null, repeatPct: 1 }, steps: [{ setupId: setup.id, partsChange: '', swapMinutes: null, plannedPulls: PULLS, checklist: [] }] } }))).plan
  await ok(admin.post(`/api/bench-tests/${bt.id}/plan/day`, { action: 'start', stepId: plan.steps[0].id }))
  const { token } = await ok(admin.post(`/api/bench-tests/${bt.id}/operator-links`, { expiresInHours: 2, maxFiles: PULLS + 5 }))
  const runtime = async () => (await ok(admin.get('/api/admin/runtime'))) as { eventLoop: { maxDelayMs: number, p99DelayMs: number, meanDelayMs: number }, memory: { rssMb: number, heapUsedMb: number } }

  await ok(admin.post('/api/admin/runtime/reset'))
  await new Promise(r => setTimeout(r, 3000))
  const before = await runtime()

  // Each watcher: the time its change events arrive, keyed by the counter.
  const seen: Map<number, number>[] = []
  for (let w = 0; w < WATCHERS; w++) {
    const ctrl = new AbortController()
    streams.push(ctrl)
    const times = new Map<number, number>()
    seen.push(times)
    const res = await fetch(`${base}/api/bench-tests/${bt.id}/day/events`, { headers: { accept: 'text/event-stream', cookie: admin.cookie }, signal: ctrl.signal })
    if (res.status !== 200) throw new Error(`stream ${w}: ${res.status}`)
    void (async () => {
      const reader = res.body!.getReader()
      const decoder = new TextDecoder()
      let buffer = ''
      try {
        for (;;) {
          const { value, done } = await reader.read()
          if (done) return
          buffer += decoder.decode(value)
          // One message per blank line; the first also carries a retry: line.
          for (let cut = buffer.indexOf('\n\n'); cut >= 0; cut = buffer.indexOf('\n\n')) {
            const message = buffer.slice(0, cut)
            buffer = buffer.slice(cut + 2)
            const id = /^id: (\d+)$/m.exec(message)?.[1]
            if (id && /^event: change$/m.test(message)) times.set(Number(id), performance.now())
          }
        }
      }
      catch { /* aborted at the end */ }
    })()
  }
  await ok(admin.post('/api/admin/runtime/reset'))
  await new Promise(r => setTimeout(r, 5000))
  const idle = await runtime()

  await ok(admin.post('/api/admin/runtime/reset'))
  const latencies: number[] = []
  let missed = 0
  for (let i = 0; i < PULLS; i++) {
    const pull = syntheticPull({ peakTorqueLbFt: 430, peakTorqueRpm: 4400, widthLowRpm: 2600, widthHighRpm: 1900, seed: 900 + i, fromRpm: 3000, toRpm: 6000, stepRpm: 20 })
    const form = new FormData()
    form.append('file', new Blob([pull.csv]), `pull-${i + 1}.csv`)
    const res = await fetch(`${base}/api/upload/${token}`, { method: 'POST', body: form })
    const answered = performance.now()
    if (res.status !== 201) throw new Error(`upload ${i}: ${res.status} ${await res.text()}`)
    const day = await ok(admin.get(`/api/bench-tests/${bt.id}/day`))
    const seq = day.seq as number
    await new Promise(r => setTimeout(r, INTERVAL_MS))
    for (const times of seen) {
      const at = [...times.entries()].find(([s]) => s >= seq)?.[1]
      if (at === undefined) missed++
      else latencies.push(Math.max(0, at - answered))
    }
  }
  const after = await runtime()
  const s = [...latencies].sort((a, b) => a - b)
  const q = (p: number) => s[Math.min(s.length - 1, Math.ceil(p * s.length) - 1)] ?? Number.NaN
  console.log(`| ${WATCHERS} watchers, ${PULLS} pulls one per ${INTERVAL_MS} ms | every watcher sees every pull | ${latencies.length} of ${WATCHERS * PULLS} seen (${missed} missed); upload answer to event p50 ${q(0.5).toFixed(0)} ms, p95 ${q(0.95).toFixed(0)} ms, max ${q(1).toFixed(0)} ms |`)
  console.log(`| server memory | | RSS ${before.memory.rssMb} MB before the watchers, ${idle.memory.rssMb} MB with ${WATCHERS} idle watchers, ${after.memory.rssMb} MB after the pulls (heap ${before.memory.heapUsedMb} / ${idle.memory.heapUsedMb} / ${after.memory.heapUsedMb} MB) |`)
  console.log(`| machine | | load average ${loadavg().map(l => l.toFixed(1)).join(' / ')} (1 / 5 / 15 min) at the end |`)
  console.log(`| event loop | | delay max ${idle.eventLoop.maxDelayMs} ms, p99 ${idle.eventLoop.p99DelayMs} ms with idle watchers; max ${after.eventLoop.maxDelayMs} ms, p99 ${after.eventLoop.p99DelayMs} ms, mean ${after.eventLoop.meanDelayMs} ms while the pulls arrived |`)
}
finally {
  for (const c of streams) c.abort()
  await killGroup(app)
  await services.stop()
}
process.exit(0)
