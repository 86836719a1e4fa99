import { describe, expect, it } from 'vitest'
import { resample, rpmGrid, valueAt, type PullPoint } from '../../../shared/dyno/index'

// Linear data: interpolation must reproduce it exactly (common practice: linear interpolation on a grid).
const line = (from: number, to: number, step: number): PullPoint[] => {
  const out: PullPoint[] = []
  for (let r = from; r <= to; r += step) out.push({ rpm: r, torqueLbFt: 300 + 0.02 * r, powerHp: 0.1 * r, vacuumInHg: r / 10000, afr: 12 + r / 10000 })
  return out
}

describe('resample', () => {
  it('grid on multiples of the step inside the pull, never extrapolated', () => {
    const out = resample(line(2537, 6481, 7), 100)
    expect(out[0]?.rpm).toBe(2600)
    expect(out.at(-1)?.rpm).toBe(6400)
    expect(out).toHaveLength(39)
  })
  it('interpolates every channel linearly', () => {
    for (const p of resample(line(2537, 6481, 7), 100)) {
      expect(p.torqueLbFt).toBeCloseTo(300 + 0.02 * p.rpm, 9)
      expect(p.powerHp).toBeCloseTo(0.1 * p.rpm, 9)
      expect(p.vacuumInHg).toBeCloseTo(p.rpm / 10000, 9)
      expect(p.afr).toBeCloseTo(12 + p.rpm / 10000, 9)
    }
  })
  it('grid points on samples take the sample values exactly', () => {
    const src = line(2000, 3000, 50)
    const out = resample(src, 100)
    expect(out.map(p => p.rpm)).toEqual([2000, 2100, 2200, 2300, 2400, 2500, 2600, 2700, 2800, 2900, 3000])
    expect(out[10]).toEqual(src[20])
  })
  it('fromRpm and toRpm narrow the grid but cannot widen it', () => {
    expect(resample(line(2000, 6000, 10), 250, 3100, 4900).map(p => p.rpm)).toEqual([3250, 3500, 3750, 4000, 4250, 4500, 4750])
    expect(resample(line(2000, 3000, 10), 250, 1000, 9000).map(p => p.rpm)).toEqual([2000, 2250, 2500, 2750, 3000])
  })
  it('sorts unsorted input, drops optional channels missing on either side, and refuses a zero step', () => {
    const pts: PullPoint[] = [
      { rpm: 3000, torqueLbFt: 400, powerHp: 228.5, vacuumInHg: 1 },
      { rpm: 2000, torqueLbFt: 380, powerHp: 144.7 },
    ]
    const [mid] = resample(pts, 1000, 2500, 2500)
    expect(resample(pts, 500).map(p => p.rpm)).toEqual([2000, 2500, 3000])
    expect(resample(pts, 500)[1]?.torqueLbFt).toBeCloseTo(390, 9)
    expect(resample(pts, 500)[1]?.vacuumInHg).toBeUndefined()
    expect(mid).toBeUndefined() // 2500 is not a multiple of 1000
    expect(() => resample(pts, 0)).toThrow(RangeError)
    expect(resample([], 100)).toEqual([])
  })
  it('rpmGrid keeps a grid point that floating point put a hair inside the range', () => {
    expect(rpmGrid(100, 2500.0000000001, 2799.9999999999)).toEqual([2500, 2600, 2700, 2800])
  })
  it('valueAt interpolates inside, and says undefined outside', () => {
    const src = line(2000, 3000, 100)
    expect(valueAt(src, 2550, 'torqueLbFt')).toBeCloseTo(300 + 0.02 * 2550, 9)
    expect(valueAt(src, 3000, 'powerHp')).toBeCloseTo(300, 9)
    expect(valueAt(src, 3001, 'powerHp')).toBeUndefined()
  })
})
