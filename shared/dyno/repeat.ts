// Repeatability of repeat pulls of one setup. Common practice: repeat pulls of a
// good engine agree within about 0.5 to 1 percent, and a gain smaller than the
// spread of the pulls is not a gain.

import type { PullPoint } from './types'
import { DEFAULT_STEP_RPM, onSharedGrid } from './compare'

/** Common practice: pulls further apart than this are suspect. */
export const REPEATABILITY_PCT = 1

export type RepeatSpread = {
  byRpm: { rpm: number, minHp: number, maxHp: number, meanHp: number, spreadPct: number }[]
  /** Largest spread on the grid, percent (the same figure averagePulls gives). */
  spreadPct: number
  rpmOfLargestSpread: number
  /**
   * The pull that sits furthest from the mean of the others (mean absolute
   * difference over the grid, percent of that mean). Needs 3 pulls: with 2 there is
   * no telling which one is off.
   */
  outlier: { index: number, deviationPct: number, beyondRepeatability: boolean } | null
}

export function repeatSpread(pulls: readonly (readonly PullPoint[])[], stepRpm = DEFAULT_STEP_RPM): RepeatSpread {
  const grids = onSharedGrid(pulls, stepRpm)
  const first = grids[0] ?? []
  let spreadPct = 0
  let rpmOfLargestSpread = first[0]?.rpm ?? Number.NaN
  const byRpm = first.map((p0, i) => {
    const powers = grids.map(g => g[i]?.powerHp ?? Number.NaN)
    const minHp = Math.min(...powers)
    const maxHp = Math.max(...powers)
    const meanHp = powers.reduce((a, b) => a + b, 0) / powers.length
    const pct = meanHp > 0 ? ((maxHp - minHp) / meanHp) * 100 : 0
    if (pct > spreadPct) {
      spreadPct = pct
      rpmOfLargestSpread = p0.rpm
    }
    return { rpm: p0.rpm, minHp, maxHp, meanHp, spreadPct: pct }
  })

  let outlier: RepeatSpread['outlier'] = null
  if (grids.length >= 3) {
    grids.forEach((grid, index) => {
      let sumPct = 0
      let n = 0
      grid.forEach((p, i) => {
        const total = byRpm[i] ? byRpm[i].meanHp * grids.length : Number.NaN
        const othersMean = (total - p.powerHp) / (grids.length - 1)
        if (othersMean > 0) {
          sumPct += (Math.abs(p.powerHp - othersMean) / othersMean) * 100
          n++
        }
      })
      const deviationPct = n > 0 ? sumPct / n : 0
      if (!outlier || deviationPct > outlier.deviationPct) {
        outlier = { index, deviationPct, beyondRepeatability: deviationPct > REPEATABILITY_PCT }
      }
    })
  }
  return { byRpm, spreadPct, rpmOfLargestSpread, outlier }
}

/**
 * A gain is within repeatability when its size, in percent, is no larger than the
 * spread of the setups' repeat pulls. With no spread known for any setup (single
 * pulls) there is nothing to judge by, so the answer is null.
 */
export function withinRepeatability(gainPct: number, ...spreadsPct: (number | undefined)[]): boolean | null {
  const known = spreadsPct.filter((s): s is number => s !== undefined && Number.isFinite(s))
  if (known.length === 0) return null
  return Math.abs(gainPct) <= Math.max(...known)
}
