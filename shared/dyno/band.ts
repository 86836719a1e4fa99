// Figures of one curve: its peaks, its average over an rpm band and its power band.
// All from the full data, never from a display copy.

import type { AtRpm, PullPoint, RpmRange } from './types'
import { ascending, valueAt } from './resample'

export type Channel = 'torqueLbFt' | 'powerHp'

/** Highest sample of a channel and its rpm (the first, if the peak repeats). */
export function peakOf(points: readonly PullPoint[], channel: Channel): AtRpm {
  let best: AtRpm | undefined
  for (const p of points) if (!best || p[channel] > best.value) best = { value: p[channel], rpm: p.rpm }
  if (!best) throw new RangeError('a peak needs at least one point')
  return best
}

/**
 * Average of a channel over [fromRpm, toRpm]: trapezoid area / band width, with the
 * band limits interpolated when they fall between samples (not the plain mean of
 * the samples, which would weight densely sampled stretches more).
 */
export function averageOver(points: readonly PullPoint[], channel: Channel, fromRpm: number, toRpm: number): number {
  const sorted = ascending(points)
  const atFrom = valueAt(sorted, fromRpm, channel)
  const atTo = valueAt(sorted, toRpm, channel)
  if (atFrom === undefined || atTo === undefined) {
    throw new RangeError(`the band ${fromRpm}..${toRpm} rpm is not inside the pull's range`)
  }
  if (toRpm === fromRpm) return atFrom
  if (toRpm < fromRpm) throw new RangeError(`the band ${fromRpm}..${toRpm} rpm runs backwards`)
  let area = 0
  let prevRpm = fromRpm
  let prevValue = atFrom
  for (const p of sorted) {
    if (p.rpm <= fromRpm) continue
    if (p.rpm >= toRpm) break
    area += ((prevValue + p[channel]) / 2) * (p.rpm - prevRpm)
    prevRpm = p.rpm
    prevValue = p[channel]
  }
  area += ((prevValue + atTo) / 2) * (toRpm - prevRpm)
  return area / (toRpm - fromRpm)
}

/**
 * The rpm range around the power peak where power stays at or above fractionOfPeak
 * of the peak, with each edge interpolated between the samples that straddle it.
 * An edge that never drops below the threshold is the end of the data.
 */
export function powerBand(points: readonly PullPoint[], fractionOfPeak = 0.9): RpmRange {
  if (!(fractionOfPeak > 0 && fractionOfPeak <= 1)) {
    throw new RangeError(`the power band fraction must be above 0 and at most 1 (got ${fractionOfPeak})`)
  }
  const sorted = ascending(points)
  const peak = peakOf(sorted, 'powerHp')
  const threshold = peak.value * fractionOfPeak
  const peakIndex = sorted.findIndex(p => p.rpm === peak.rpm)
  const edge = (inside: PullPoint, outside: PullPoint): number =>
    inside.rpm + ((outside.rpm - inside.rpm) * (inside.powerHp - threshold)) / (inside.powerHp - outside.powerHp)
  let fromRpm = sorted[0]?.rpm ?? peak.rpm
  for (let i = peakIndex; i > 0; i--) {
    const inside = sorted[i]
    const outside = sorted[i - 1]
    if (inside && outside && outside.powerHp < threshold) {
      fromRpm = edge(inside, outside)
      break
    }
  }
  let toRpm = sorted[sorted.length - 1]?.rpm ?? peak.rpm
  for (let i = peakIndex; i < sorted.length - 1; i++) {
    const inside = sorted[i]
    const outside = sorted[i + 1]
    if (inside && outside && outside.powerHp < threshold) {
      toRpm = edge(inside, outside)
      break
    }
  }
  return { fromRpm, toRpm }
}
