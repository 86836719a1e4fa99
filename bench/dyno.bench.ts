// Benchmark of the dyno library (not a timed test): `npx tsx bench/dyno.bench.ts`.
// Targets (issue 3): parse + check a 20,000-row file under 300 ms; average and
// compare 6 setups x 3 pulls of 4,000 samples under 20 ms. Data: synthetic pulls.

import { averagePulls, comparePulls, parsePullCsv, resultsTable, syntheticPull, type PullPoint } from '../shared/dyno/index'

function timeIt(label: string, runs: number, fn: () => unknown): { medianMs: number, minMs: number } {
  for (let i = 0; i < 3; i++) fn() // warm up the JIT
  const ms: number[] = []
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now()
    fn()
    ms.push(performance.now() - t0)
  }
  ms.sort((a, b) => a - b)
  const medianMs = ms[Math.floor(ms.length / 2)] ?? Number.NaN
  const minMs = ms[0] ?? Number.NaN
  console.log(`${label}: median ${medianMs.toFixed(2)} ms, best ${minMs.toFixed(2)} ms (${runs} runs)`)
  return { medianMs, minMs }
}

const model = { peakTorqueLbFt: 520, peakTorqueRpm: 4800, widthLowRpm: 3000, widthHighRpm: 2400 }

const big = syntheticPull({ ...model, seed: 1, fromRpm: 2000, toRpm: 8000, samples: 20000 })
const parsed = parsePullCsv(big.csv)
if (parsed.points.length !== 20000 || !parsed.ok) throw new Error(`unexpected parse: ${parsed.points.length} points, ${parsed.problems.length} problems`)
console.log(`file: 20,000 rows, ${(big.csv.length / 1024).toFixed(0)} KiB`)
const parse = timeIt('parse + check 20,000 rows', 20, () => parsePullCsv(big.csv))

const setups: PullPoint[][][] = Array.from({ length: 6 }, (_, s) =>
  Array.from({ length: 3 }, (_, p) =>
    syntheticPull({ ...model, peakTorqueLbFt: model.peakTorqueLbFt + 4 * s, peakTorqueRpm: model.peakTorqueRpm + 60 * s, seed: 100 + 10 * s + p, fromRpm: 2500, toRpm: 7000, samples: 4000 }).points,
  ),
)
const compare = timeIt('average + compare, 6 setups x 3 pulls x 4,000 samples', 50, () => {
  const averaged = setups.map(pulls => averagePulls(pulls))
  const base = averaged[0]!.points
  for (const a of averaged.slice(1)) comparePulls(base, a.points)
})
const table = timeIt('  ...plus the results table of the 6 averaged setups', 50, () => {
  const averaged = setups.map(pulls => averagePulls(pulls))
  resultsTable(averaged.map((a, i) => ({ name: `Setup ${i + 1}`, points: a.points, spreadPct: a.spreadPct })))
})

console.log(`node ${process.version}; targets: parse < 300 ms ${parse.medianMs < 300 ? 'met' : 'MISSED'}, compare < 20 ms ${compare.medianMs < 20 ? 'met' : 'MISSED'}`)
void table
