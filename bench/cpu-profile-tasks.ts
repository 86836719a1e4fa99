// The longest main-thread tasks in a V8 CPU profile (a .cpuprofile written by
// `node --cpu-prof`): consecutive samples outside (idle), longer than a threshold,
// each with the stacks it spent its time in. Used with the pull-check benchmark:
//   APP_NODE_ARGS="--cpu-prof --cpu-prof-dir=/tmp/prof --cpu-prof-interval=500" \
//     npx tsx --tsconfig tsconfig.tools.json bench/pull-checks.bench.ts
//   npx tsx bench/cpu-profile-tasks.ts /tmp/prof/CPU.*.0.001.cpuprofile 30 [fromSeconds]
// (the server's main thread is the profile whose thread id is 0). A stretch is wall
// time: on a loaded machine the thread may be descheduled inside it, so compare the
// functions it names, not only its length.
import { readFileSync } from 'node:fs'

interface ProfileNode { id: number, callFrame: { functionName: string, url: string, lineNumber: number }, children?: number[] }
interface Profile { nodes: ProfileNode[], startTime: number, endTime: number, samples: number[], timeDeltas: number[] }

const [file, thresholdArg = '50', fromArg = '0'] = process.argv.slice(2)
if (!file) throw new Error('usage: cpu-profile-tasks.ts <file.cpuprofile> [thresholdMs] [fromSeconds]')
const profile = JSON.parse(readFileSync(file, 'utf8')) as Profile
const byId = new Map(profile.nodes.map(n => [n.id, n]))
const parentOf = new Map<number, number>()
for (const n of profile.nodes) for (const c of n.children ?? []) parentOf.set(c, n.id)
const fn = (id: number) => byId.get(id)!.callFrame.functionName || '(anonymous)'
function stackOf(id: number): string {
  const names: string[] = []
  for (let x: number | undefined = id; x !== undefined; x = parentOf.get(x)) names.push(fn(x))
  return names.slice(0, -1).reverse().slice(-7).join(' > ')
}

let t = profile.startTime
const times = profile.samples.map((_, i) => (t += profile.timeDeltas[i]!))
interface Stretch { start: number, end: number, by: Map<string, number> }
const stretches: Stretch[] = []
let current: Stretch | undefined
for (let i = 0; i < profile.samples.length; i++) {
  const id = profile.samples[i]!
  if (fn(id) === '(idle)') {
    if (current) stretches.push(current)
    current = undefined
    continue
  }
  const duration = (times[i + 1] ?? times[i]!) - times[i]!
  current ??= { start: times[i]!, end: times[i]!, by: new Map() }
  current.end = times[i]! + duration
  const key = stackOf(id)
  current.by.set(key, (current.by.get(key) ?? 0) + duration)
}
if (current) stretches.push(current)

const from = Number(fromArg) * 1e6
const threshold = Number(thresholdArg) * 1000
const chosen = stretches.filter(s => s.start - profile.startTime >= from)
const long = chosen.filter(s => s.end - s.start >= threshold)
const ms = (us: number) => (us / 1000).toFixed(1)
console.log(`${file}: ${chosen.length} busy stretches from +${fromArg} s, ${long.length} of ${thresholdArg} ms or more; longest ${ms(Math.max(0, ...chosen.map(s => s.end - s.start)))} ms`)
for (const s of long.sort((a, b) => (b.end - b.start) - (a.end - a.start)).slice(0, 15)) {
  console.log(`\n${ms(s.end - s.start)} ms at +${((s.start - profile.startTime) / 1e6).toFixed(2)} s`)
  for (const [stack, us] of [...s.by].sort((a, b) => b[1] - a[1]).slice(0, 4)) console.log(`  ${ms(us).padStart(7)} ms  ${stack}`)
}
