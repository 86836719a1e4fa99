// Workspace benchmark, run on demand (not a test):
//   flock /tmp/pullsheet-test.lock npx tsx bench/workspace.bench.ts
// Against DATABASE_URL when set, otherwise the test profile's MariaDB (started if
// needed, port 3317). Measures, in this process, the same service code the routes call:
//   1. import of one 20,000-row pull file: check (parse, data check) + store, in one transaction
//   2. analysis of 6 setups x 3 pulls: cached (warm, same question), recomputed from
//      cached points, and recomputed from the database
// Synthetic pulls (invented data). Its rows are deleted at the end.
import os from 'node:os'
import { syntheticPull } from '../shared/dyno/index'
import { clearAnalysisCaches, runAnalysis } from '../server/utils/analysis'
import { findBenchTest, createBenchTest } from '../server/utils/bench-tests'
import { createSetup } from '../server/utils/setups'
import { checkPullBatch, importPulls, type PullToImport } from '../server/utils/pull-import'
import { migrate, scriptDb } from '../scripts/lib/database'
import { localEnv, serverEnv } from '../scripts/lib/env'
import { startServices, type RunningServices } from '../scripts/lib/services'

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
if (!url) {
  const env = localEnv('test')
  services = await startServices(env)
  url = serverEnv(env).DATABASE_URL!
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
    const benchTest = await findBenchTest(db, { ...user, role: 'admin' }, b.id)
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
