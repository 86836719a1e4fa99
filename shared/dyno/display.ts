// Thinning a pull for drawing only: Largest-Triangle-Three-Buckets (Steinarsson,
// 2013, MSc thesis, University of Iceland) via the `downsample` package. Peaks and
// gains always come from the full data, never from this copy.

import { createLTTB } from 'downsample'
import type { PullPoint } from './types'
import { ascending } from './resample'

// Buckets are chosen on power, the curve a reader looks at first; torque shares
// the same rpm samples, so both lines are drawn from the same points.
const lttbOnPower = createLTTB<PullPoint>({ x: p => p.rpm, y: p => p.powerHp })

/** At most maxPoints of the pull (its first and last always kept), for graphs. */
export function downsampleForDisplay(points: readonly PullPoint[], maxPoints: number): PullPoint[] {
  if (!Number.isInteger(maxPoints) || maxPoints < 2) throw new RangeError(`maxPoints must be a whole number from 2 (got ${maxPoints})`)
  const sorted = [...ascending(points)]
  if (sorted.length <= maxPoints) return sorted
  // downsample's LTTB picks the second point instead of the last when asked for 2.
  const first = sorted[0]
  const last = sorted[sorted.length - 1]
  if (maxPoints === 2 && first && last) return [first, last]
  const picked = Array.from(lttbOnPower(sorted, maxPoints))
  // downsample 1.4 sizes its buckets in floating point; when (n - 2) / (k - 2) x (k - 2)
  // comes out a hair under n - 2, it drops the last centre point and returns the
  // second-to-last sample where LTTB's fixed last point belongs. Put the real one back.
  if (last && picked[picked.length - 1] !== last) picked[picked.length - 1] = last
  return picked
}
