// Workspace benchmark, run on demand (not a test):
//   flock /tmp/pullsheet-test.lock npx tsx bench/workspace.bench.ts
// Against DATABASE_URL when set, otherwise the test profile's MariaDB (started if
// needed, port 3317). Measures, in this process, the same service code the routes call:
//   1. import of one 20,000-row pull file: check (parse, data check) + store, in one transaction
//   2. analysis of 6 setups x 3 pulls: cached (warm, same question), recomputed from
//      cached points, and recomputed from the database
// Then, unless BENCH_HTTP=0, the same two over HTTP against the built server on the test
// profile (started here, port 3010; build it first with the test runner), signed in as a
// writer: what a browser waits for, session check and JSON included.
// Synthetic pulls (invented data). Its rows are deleted at the end.
import os from 'node:os'
import { syntheticPull } from '../shared/dyno/index'
import { clearAnalysisCaches, runAnalysis } from '../server/services/workspace/analysis'
import { benchTestById, createBenchTest } from '../server/services/workspace/bench-test-core'
import { createSetup } from '../server/services/workspace/setups'
import { checkPullBatch, importPulls, type PullToImport } from '../server/services/workspace/pull-import'
import { migrate, scriptDb } from '../scripts/lib/database'
import { localEnv, serverEnv } from '../scripts/lib/env'
import { startServices, type RunningServices } from '../scripts/lib/services'
import { startApp } from '../scripts/lib/app'
import { killGroup } from '../scripts/lib/proc'
import { Client } from '../tests/support/http'

const RUNS_IMPORT = 7
const RUNS_ANALYSIS = 200

function stats(ms: number[]) {
  const s = [...ms].sort((a, b) => a - b)
  const at = (q: number) => s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)]!
  return { n: s.length, p50: at(0.5), p95: at(0.95), max: s[s.length - 1]! }
}
const fmt = (x: { n: number, p50: number, p95: number, max: number }) => `p50 ${x.p50.toFixed(1)} ms, p95 ${x.p95.toFixed(1)} ms, max ${x.max.toFixed(1)} ms (n = ${x.n})`

let services: RunningServices | undefined
let url = process.env.DATABASE_URL
const testEnv = localEnv('test')
if (!url) {
  services = await startServices(testEnv)
  url = serverEnv(testEnv).DATABASE_URL!
}
await migrate(url)
const db = scriptDb(url)
const created: number[] = []

try {
  const [userId] = await db('users').insert({ email: `bench-${Date.now()}@bench.example`, display_name: 'Bench writer', role: 'writer' })
  const user = { id: Number(userId), email: 'bench', displayName: 'Bench writer', role: 'writer' as const }
  const model = { peakTorqueLbFt: 430, peakTorqueRpm: 4400, widthLowRpm: 2600, widthHighRpm: 1900 }

  // ---- 1. import of a 20,000-row file ----
  const bt = await createBenchTest(db, user.id, { title: 'Benchmark import (synthetic)', engineFamily: 'pushrod-v8', partType: 'exhaust' })
  created.push(bt.id)
  const setup = await createSetup(db, bt.id, { label: 'Baseline' })
  const big = syntheticPull({ ...model, seed: 1, fromRpm: 2500, toRpm: 7000, samples: 20_000 })
  const file: PullToImport = { name: 'big.csv', text: big.csv, setupId: setup.id, weather: big.weather }
  const checkMs: number[] = []
  const importMs: number[] = []
  for (let i = 0; i < RUNS_IMPORT; i++) {
    let t = performance.now()
    checkPullBatch([file], 'sae-j1349-1990')
    checkMs.push(performance.now() - t)
    t = performance.now()
    await importPulls(db, bt.id, [file], { userId: user.id })
    importMs.push(performance.now() - t)
  }

  // ---- 2. analysis, 6 setups x 3 pulls ----
  async function analysisBench(samples: number) {
    const b = await createBenchTest(db, user.id, { title: `Benchmark analysis ${samples} (synthetic)`, engineFamily: 'pushrod-v8', partType: 'exhaust' })
    created.push(b.id)
    for (let s = 0; s < 6; s++) {
      const st = await createSetup(db, b.id, { label: `Setup ${s + 1}` })
      const files = [1, 2, 3].map((n) => {
        const pull = syntheticPull({ ...model, peakTorqueLbFt: model.peakTorqueLbFt + s * 4, seed: 100 + s * 10 + n, fromRpm: 2500, toRpm: 7000, samples })
        return { name: `s${s}-p${n}.csv`, text: pull.csv, setupId: st.id, weather: pull.weather }
      })
      await importPulls(db, b.id, files, { userId: user.id })
    }
    const benchTest = await benchTestById(db, b.id)
    const time = async (before: () => void) => {
      const ms: number[] = []
      for (let i = 0; i < RUNS_ANALYSIS; i++) {
        before()
        const t = performance.now()
        await runAnalysis(db, benchTest, {})
        ms.push(performance.now() - t)
      }
      return stats(ms)
    }
    clearAnalysisCaches()
    await runAnalysis(db, benchTest, {}) // warm-up: JIT and caches
    return {
      cached: await time(() => {}),
      fromCachedPoints: await time(() => clearAnalysisCaches({ points: false })),
      fromDatabase: await time(() => clearAnalysisCaches()),
    }
  }
  const typical = await analysisBench(451)
  const heavy = await analysisBench(20_000)

  const cpu = os.cpus()
  const lines = [
    `Measured ${new Date().toISOString().slice(0, 10)} on ${cpu.length} x ${cpu[0]?.model ?? 'unknown CPU'}, Node ${process.version}, MariaDB 10.11 (local).`,
    '',
    '| what | target | measured |',
    '| --- | --- | --- |',
    `| check of one 20,000-row file (parse + data check, no database) | | median ${stats(checkMs).p50.toFixed(0)} ms |`,
    `| import of one 20,000-row file (check + store in one transaction; ${(Buffer.byteLength(big.csv) / 1024).toFixed(0)} KB) | under 1.5 s | median ${stats(importMs).p50.toFixed(0)} ms, max ${stats(importMs).max.toFixed(0)} ms (n = ${RUNS_IMPORT}) |`,
    `| analysis, 6 setups x 3 pulls of 451 points, warm (cached answer) | p95 under 150 ms | ${fmt(typical.cached)} |`,
    `| same, recomputed from cached points (after any change) | | ${fmt(typical.fromCachedPoints)} |`,
    `| same, recomputed with points read from the database | | ${fmt(typical.fromDatabase)} |`,
    `| analysis, 6 setups x 3 pulls of 20,000 points, warm (cached answer) | | ${fmt(heavy.cached)} |`,
    `| same, recomputed from cached points | | ${fmt(heavy.fromCachedPoints)} |`,
    `| same, recomputed with points read from the database | | ${fmt(heavy.fromDatabase)} |`,
  ]
  if (process.env.BENCH_HTTP !== '0' && !process.env.DATABASE_URL) lines.push(...await httpBench())
  console.log(lines.join('\n'))
}
finally {
  for (const id of created) {
    await db('pulls').where({ bench_test_id: id }).delete()
    await db('setups').where({ bench_test_id: id }).delete()
    await db('bench_tests').where({ id }).delete()
  }
  await db('users').where('email', 'like', 'bench-%@bench.example').delete()
  await db.destroy()
  await services?.stop()
}

/** The routes themselves, through the built server: import 20,000 rows, then the analysis. */
async function httpBench(): Promise<string[]> {
  const app = await startApp(testEnv, { PULLSHEET_WORKERS: '0' })
  try {
    const admin = new Client(testEnv.app.baseUrl)
    const email = `bench-${Date.now()}-http@bench.example`
    const password = 'bench-password-long'
    // The demo admin exists in a seeded test database; it makes the bench writer.
    const signIn = async (c: Client, e: string, pw: string) => {
      const r = await c.post('/api/auth/login', { email: e, password: pw })
      if (r.status !== 200) throw new Error(`sign-in as ${e} failed (${r.status}); seed the test database (run the test runner once)`)
    }
    await signIn(admin, 'admin@example.com', 'pullsheet-demo')
    const made = await admin.post('/api/users', { email, displayName: 'Bench writer', role: 'writer', password })
    if (made.status !== 201) throw new Error(`creating the bench writer failed: ${made.status}`)
    const writer = new Client(testEnv.app.baseUrl)
    await signIn(writer, email, password)
    const post = async (path: string, body: unknown, status = 201) => {
      const r = await writer.post(path, body)
      if (r.status !== status) throw new Error(`${path}: ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`)
      return r.body
    }
    const model = { peakTorqueLbFt: 430, peakTorqueRpm: 4400, widthLowRpm: 2600, widthHighRpm: 1900 }

    const importBt = (await post('/api/bench-tests', { title: 'Benchmark HTTP import (synthetic)', engineFamily: 'pushrod-v8', partType: 'exhaust' })).benchTest
    created.push(importBt.id)
    const importSetup = (await post(`/api/bench-tests/${importBt.id}/setups`, { label: 'Baseline' })).setup
    const big = syntheticPull({ ...model, seed: 2, fromRpm: 2500, toRpm: 7000, samples: 20_000 })
    const importMs: number[] = []
    for (let i = 0; i < RUNS_IMPORT; i++) {
      const t = performance.now()
      await post(`/api/bench-tests/${importBt.id}/pulls/import`, { files: [{ name: 'big.csv', text: big.csv, setupId: importSetup.id, weather: big.weather }] })
      importMs.push(performance.now() - t)
    }

    const bt = (await post('/api/bench-tests', { title: 'Benchmark HTTP analysis (synthetic)', engineFamily: 'pushrod-v8', partType: 'exhaust' })).benchTest
    created.push(bt.id)
    for (let s = 0; s < 6; s++) {
      const setup = (await post(`/api/bench-tests/${bt.id}/setups`, { label: `Setup ${s + 1}` })).setup
      const files = [1, 2, 3].map((n) => {
        const pull = syntheticPull({ ...model, peakTorqueLbFt: model.peakTorqueLbFt + s * 4, seed: 300 + s * 10 + n, fromRpm: 2500, toRpm: 7000, samples: 451 })
        return { name: `s${s}-p${n}.csv`, text: pull.csv, setupId: setup.id, weather: pull.weather }
      })
      await post(`/api/bench-tests/${bt.id}/pulls/import`, { files })
    }
    const get = async (query: string) => {
      const t = performance.now()
      const r = await writer.get(`/api/bench-tests/${bt.id}/analysis${query}`)
      if (r.status !== 200) throw new Error(`analysis: ${r.status}`)
      return performance.now() - t
    }
    for (let i = 0; i < 20; i++) await get('') // warm-up
    const warm: number[] = []
    for (let i = 0; i < RUNS_ANALYSIS; i++) warm.push(await get(''))
    // A question not asked before (points cached, answer not): maxPoints differs each time.
    const fresh: number[] = []
    for (let i = 0; i < RUNS_ANALYSIS; i++) fresh.push(await get(`?maxPoints=${1000 + i}`))
    return [
      `| over HTTP: import of one 20,000-row file (POST .../pulls/import, ${(Buffer.byteLength(JSON.stringify(big.csv)) / 1024).toFixed(0)} KB of JSON) | under 1.5 s | median ${stats(importMs).p50.toFixed(0)} ms, max ${stats(importMs).max.toFixed(0)} ms (n = ${RUNS_IMPORT}) |`,
      `| over HTTP: GET .../analysis, 6 setups x 3 pulls of 451 points, warm | p95 under 150 ms | ${fmt(stats(warm))} |`,
      `| over HTTP: same, a new question each time (recomputed from cached points) | | ${fmt(stats(fresh))} |`,
    ]
  }
  finally {
    await killGroup(app)
  }
}
