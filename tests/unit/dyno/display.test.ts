import { describe, expect, it } from 'vitest'
import { downsampleForDisplay, peakOf, syntheticPull } from '../../../shared/dyno/index'

// LTTB (published: Steinarsson 2013, MSc thesis, University of Iceland), via npm `downsample`.
describe('downsampleForDisplay', () => {
  const { points } = syntheticPull({
    seed: 7, fromRpm: 2500, toRpm: 7000, samples: 4000, peakTorqueLbFt: 450, peakTorqueRpm: 4500,
    widthLowRpm: 2600, widthHighRpm: 2200, weather: { baroInHg: 29.92, airTempF: 60, humidityPct: 0 }, standard: 'none',
  })
  const small = downsampleForDisplay(points, 300)

  it('returns at most maxPoints original samples, ascending, first and last kept', () => {
    expect(small).toHaveLength(300)
    expect(small[0]).toBe(points[0])
    expect(small.at(-1)).toBe(points.at(-1))
    for (const p of small) expect(points).toContain(p)
    for (let i = 1; i < small.length; i++) expect(small[i]!.rpm).toBeGreaterThan(small[i - 1]!.rpm)
  })
  it('keeps the shape: the displayed power peak is within 0.5 % of the real one', () => {
    const real = peakOf(points, 'powerHp').value
    expect(Math.abs(peakOf(small, 'powerHp').value - real) / real).toBeLessThan(0.005)
  })
  it('short pulls come back whole; 2 points are the ends; fewer is refused', () => {
    expect(downsampleForDisplay(points.slice(0, 50), 300)).toHaveLength(50)
    expect(downsampleForDisplay(points, 2)).toEqual([points[0], points.at(-1)])
    expect(() => downsampleForDisplay(points, 1)).toThrow(RangeError)
  })
})
