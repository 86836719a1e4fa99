// Linear interpolation of a curve between its points: the one place a value between
// samples is worked out (resampling, the readout beside a graph, graph data tables).

/** A curve's value at an rpm, linear between its points; null outside its range or off the end of the data. */
export function interpolateAt<K extends string>(points: readonly ({ rpm: number } & Record<K, number>)[], rpm: number, channel: K): number | null {
  if (!Number.isFinite(rpm) || points.length === 0) return null
  let lo = 0
  let hi = points.length - 1
  if (rpm < points[lo]!.rpm || rpm > points[hi]!.rpm) return null
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (points[mid]!.rpm <= rpm) lo = mid
    else hi = mid
  }
  const a = points[lo]!
  const b = points[hi]!
  if (rpm === a.rpm || b.rpm === a.rpm) return a[channel]
  if (rpm === b.rpm) return b[channel]
  return a[channel] + ((b[channel] - a[channel]) * (rpm - a.rpm)) / (b.rpm - a.rpm)
}
