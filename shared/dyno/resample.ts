// Putting pulls on a common rpm grid by linear interpolation (common practice:
// 100 rpm steps). Never extrapolates: a grid point outside a pull's own range is
// simply not produced. Each channel is interpolated on its own, so observed power
// stays observed power rather than being recomputed from interpolated torque.

import type { PullPoint } from './types'
import { interpolateAt } from './interpolate'

/** Points in ascending rpm; a copy is sorted only when the input is not. */
export function ascending(points: readonly PullPoint[]): readonly PullPoint[] {
  for (let i = 1; i < points.length; i++) {
    if ((points[i]?.rpm ?? 0) < (points[i - 1]?.rpm ?? 0)) return [...points].sort((a, b) => a.rpm - b.rpm)
  }
  return points
}

/** The multiples of stepRpm inside [fromRpm, toRpm]. */
export function rpmGrid(stepRpm: number, fromRpm: number, toRpm: number): number[] {
  if (!(stepRpm > 0) || !Number.isFinite(stepRpm)) throw new RangeError(`rpm step must be above 0 (got ${stepRpm})`)
  const grid: number[] = []
  if (!(toRpm >= fromRpm)) return grid
  // The small slack keeps 2500.0000000001 from dropping the 2500 grid point.
  const first = Math.ceil(fromRpm / stepRpm - 1e-9)
  const last = Math.floor(toRpm / stepRpm + 1e-9)
  for (let k = first; k <= last; k++) grid.push(k * stepRpm)
  return grid
}

function lerp(a: number, b: number, t: number): number {
  return t === 1 ? b : a + (b - a) * t
}

function between(lo: PullPoint, hi: PullPoint, rpm: number): PullPoint {
  const t = hi.rpm === lo.rpm ? 0 : (rpm - lo.rpm) / (hi.rpm - lo.rpm)
  const p: PullPoint = { rpm, torqueLbFt: lerp(lo.torqueLbFt, hi.torqueLbFt, t), powerHp: lerp(lo.powerHp, hi.powerHp, t) }
  if (lo.vacuumInHg !== undefined && hi.vacuumInHg !== undefined) p.vacuumInHg = lerp(lo.vacuumInHg, hi.vacuumInHg, t)
  if (lo.afr !== undefined && hi.afr !== undefined) p.afr = lerp(lo.afr, hi.afr, t)
  return p
}

/** Samples at the multiples of stepRpm inside the pull's range (narrowed by fromRpm/toRpm). */
export function resample(points: readonly PullPoint[], stepRpm: number, fromRpm?: number, toRpm?: number): PullPoint[] {
  const sorted = ascending(points)
  const first = sorted[0]
  const last = sorted[sorted.length - 1]
  if (!first || !last) return []
  const grid = rpmGrid(stepRpm, Math.max(first.rpm, fromRpm ?? -Infinity), Math.min(last.rpm, toRpm ?? Infinity))
  const out: PullPoint[] = []
  let i = 0
  for (const rpm of grid) {
    while (i < sorted.length - 2 && (sorted[i + 1]?.rpm ?? Infinity) < rpm) i++
    const lo = sorted[i]
    const hi = sorted[Math.min(i + 1, sorted.length - 1)]
    if (!lo || !hi) continue
    out.push(rpm <= lo.rpm ? between(lo, lo, rpm) : between(lo, hi, rpm))
  }
  return out
}

/** One channel of a pull at any rpm inside its range, interpolated; undefined outside it. */
export function valueAt(points: readonly PullPoint[], rpm: number, channel: 'torqueLbFt' | 'powerHp'): number | undefined {
  const sorted = ascending(points) as readonly ({ rpm: number } & Record<'torqueLbFt' | 'powerHp', number>)[]
  return interpolateAt(sorted, rpm, channel) ?? undefined
}
