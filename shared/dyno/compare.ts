// Comparing pulls: the mean of repeat pulls, and one setup against another on a
// common rpm grid (multiples of stepRpm inside the range both cover).

import type { AtRpm, PeakGain, PullPoint } from './types'
import { peakOf, type Channel } from './band'
import { ascending, resample, rpmGrid } from './resample'

export const DEFAULT_STEP_RPM = 100

/** The rpm range every pull covers. */
export function sharedRange(pulls: readonly (readonly PullPoint[])[]): { fromRpm: number, toRpm: number } {
  let fromRpm = -Infinity
  let toRpm = Infinity
  for (const pull of pulls) {
    const sorted = ascending(pull)
    const first = sorted[0]
    const last = sorted[sorted.length - 1]
    if (!first || !last) throw new RangeError('a pull has no points')
    fromRpm = Math.max(fromRpm, first.rpm)
    toRpm = Math.min(toRpm, last.rpm)
  }
  if (!(toRpm >= fromRpm)) throw new RangeError('the pulls share no rpm range')
  return { fromRpm, toRpm }
}

/** Every pull on the grid they all cover; throws when that grid has fewer than 2 points. */
export function onSharedGrid(pulls: readonly (readonly PullPoint[])[], stepRpm: number): PullPoint[][] {
  if (pulls.length === 0) throw new RangeError('no pulls given')
  const { fromRpm, toRpm } = sharedRange(pulls)
  if (rpmGrid(stepRpm, fromRpm, toRpm).length < 2) {
    throw new RangeError(`the pulls share less than one ${stepRpm} rpm step (${fromRpm}..${toRpm} rpm)`)
  }
  return pulls.map(p => resample(p, stepRpm, fromRpm, toRpm))
}

function mean(values: number[]): number {
  let sum = 0
  for (const v of values) sum += v
  return sum / values.length
}

/**
 * Mean of repeat pulls on the grid all of them cover. spreadPct is the largest, over
 * that grid, of (max - min) / mean of power across the pulls, in percent.
 */
export function averagePulls(pulls: readonly (readonly PullPoint[])[], stepRpm = DEFAULT_STEP_RPM): { points: PullPoint[], spreadPct: number } {
  const grids = onSharedGrid(pulls, stepRpm)
  const first = grids[0] ?? []
  let spreadPct = 0
  const points = first.map((p0, i) => {
    const at = grids.map(g => g[i] ?? p0)
    const powers = at.map(p => p.powerHp)
    const meanHp = mean(powers)
    if (meanHp > 0) spreadPct = Math.max(spreadPct, ((Math.max(...powers) - Math.min(...powers)) / meanHp) * 100)
    const point: PullPoint = { rpm: p0.rpm, torqueLbFt: mean(at.map(p => p.torqueLbFt)), powerHp: meanHp }
    const vacuums = at.map(p => p.vacuumInHg)
    if (vacuums.every(v => v !== undefined)) point.vacuumInHg = mean(vacuums as number[])
    const afrs = at.map(p => p.afr)
    if (afrs.every(v => v !== undefined)) point.afr = mean(afrs as number[])
    return point
  })
  return { points, spreadPct }
}

/** Where d changes sign along the rows: r = r1 + (r2 - r1) x d1 / (d1 - d2). A run of exact zeros counts once, at its middle. */
export function findCrossings(rows: readonly { rpm: number, d: number }[]): number[] {
  const out: number[] = []
  let last: { rpm: number, d: number, index: number } | undefined
  rows.forEach((row, index) => {
    if (row.d === 0 || !Number.isFinite(row.d)) return
    if (last && Math.sign(last.d) !== Math.sign(row.d)) {
      if (index === last.index + 1) out.push(last.rpm + ((row.rpm - last.rpm) * last.d) / (last.d - row.d))
      else {
        const zeroFrom = rows[last.index + 1]?.rpm ?? last.rpm
        const zeroTo = rows[index - 1]?.rpm ?? row.rpm
        out.push((zeroFrom + zeroTo) / 2)
      }
    }
    last = { rpm: row.rpm, d: row.d, index }
  })
  return out
}

function peakGain(baseline: readonly PullPoint[], candidate: readonly PullPoint[], channel: Channel): PeakGain {
  const b = peakOf(baseline, channel)
  const c = peakOf(candidate, channel)
  const gain = c.value - b.value
  return { baseline: b, candidate: c, gain, gainPct: (gain / b.value) * 100 }
}

function trapezoidMean(rows: readonly { rpm: number, d: number }[]): number {
  let area = 0
  for (let i = 1; i < rows.length; i++) {
    const a = rows[i - 1]
    const b = rows[i]
    if (a && b) area += ((a.d + b.d) / 2) * (b.rpm - a.rpm)
  }
  const first = rows[0]
  const last = rows[rows.length - 1]
  return first && last && last.rpm > first.rpm ? area / (last.rpm - first.rpm) : (first?.d ?? 0)
}

function extreme(rows: readonly { rpm: number, d: number }[], pick: 'max' | 'min'): AtRpm {
  let best: AtRpm = { value: pick === 'max' ? -Infinity : Infinity, rpm: Number.NaN }
  for (const r of rows) if (pick === 'max' ? r.d > best.value : r.d < best.value) best = { value: r.d, rpm: r.rpm }
  return best
}

export type PullComparison = {
  peakPower: PeakGain
  peakTorque: PeakGain
  averageGain: { powerHp: number, torqueLbFt: number, fromRpm: number, toRpm: number }
  /** Largest gain on the grid and where. */
  maxGain: { powerHp: AtRpm, torqueLbFt: AtRpm }
  /** Smallest gain on the grid and where: negative when the candidate loses there. */
  maxLoss: { powerHp: AtRpm, torqueLbFt: AtRpm }
  crossovers: { powerRpm: number[], torqueRpm: number[] }
  byRpm: {
    rpm: number
    baseline: { powerHp: number, torqueLbFt: number }
    candidate: { powerHp: number, torqueLbFt: number }
    gain: { powerHp: number, torqueLbFt: number }
  }[]
}

/**
 * Candidate against baseline. Peaks come from each pull's own samples (peak-to-peak,
 * wherever each falls); everything else from the common grid, where gain = candidate
 * - baseline.
 */
export function comparePulls(
  baseline: readonly PullPoint[],
  candidate: readonly PullPoint[],
  opts: { stepRpm?: number } = {},
): PullComparison {
  const stepRpm = opts.stepRpm ?? DEFAULT_STEP_RPM
  const [b = [], c = []] = onSharedGrid([baseline, candidate], stepRpm)
  const byRpm = b.map((bp, i) => {
    const cp = c[i] ?? bp
    return {
      rpm: bp.rpm,
      baseline: { powerHp: bp.powerHp, torqueLbFt: bp.torqueLbFt },
      candidate: { powerHp: cp.powerHp, torqueLbFt: cp.torqueLbFt },
      gain: { powerHp: cp.powerHp - bp.powerHp, torqueLbFt: cp.torqueLbFt - bp.torqueLbFt },
    }
  })
  const power = byRpm.map(r => ({ rpm: r.rpm, d: r.gain.powerHp }))
  const torque = byRpm.map(r => ({ rpm: r.rpm, d: r.gain.torqueLbFt }))
  return {
    peakPower: peakGain(baseline, candidate, 'powerHp'),
    peakTorque: peakGain(baseline, candidate, 'torqueLbFt'),
    averageGain: {
      powerHp: trapezoidMean(power),
      torqueLbFt: trapezoidMean(torque),
      fromRpm: byRpm[0]?.rpm ?? Number.NaN,
      toRpm: byRpm[byRpm.length - 1]?.rpm ?? Number.NaN,
    },
    maxGain: { powerHp: extreme(power, 'max'), torqueLbFt: extreme(torque, 'max') },
    maxLoss: { powerHp: extreme(power, 'min'), torqueLbFt: extreme(torque, 'min') },
    crossovers: { powerRpm: findCrossings(power), torqueRpm: findCrossings(torque) },
    byRpm,
  }
}
