import { describe, expect, it } from 'vitest'
import { averagePulls, repeatSpread, withinRepeatability, type PullPoint } from '../../../shared/dyno/index'

const K = 33000 / (2 * Math.PI)
const curve = (scale: number, from = 2500, to = 6500, step = 10): PullPoint[] => {
  const out: PullPoint[] = []
  for (let r = from; r <= to; r += step) {
    const t = scale * (420 - 2e-5 * (r - 4400) ** 2)
    out.push({ rpm: r, torqueLbFt: t, powerHp: (t * r) / K, vacuumInHg: 0.5, afr: 12.5 * scale })
  }
  return out
}

describe('averagePulls (issue definition: mean on the shared grid; spread = max (max - min)/mean of power)', () => {
  it('three pulls at 0.99, 1.00 and 1.01 of one curve: mean is the curve, spread is exactly 2 %', () => {
    const { points, spreadPct } = averagePulls([curve(0.99), curve(1), curve(1.01)])
    const one = curve(1)
    for (const p of points) {
      const ref = one.find(q => q.rpm === p.rpm)!
      expect(p.torqueLbFt).toBeCloseTo(ref.torqueLbFt, 9)
      expect(p.powerHp).toBeCloseTo(ref.powerHp, 9)
      expect(p.afr).toBeCloseTo(12.5, 9)
      expect(p.vacuumInHg).toBeCloseTo(0.5, 9)
    }
    expect(spreadPct).toBeCloseTo(2, 9)
  })
  it('uses only the grid every pull covers', () => {
    const { points } = averagePulls([curve(1, 2500, 6500), curve(1, 2710, 6800), curve(1, 2000, 6390)], 100)
    expect(points[0]?.rpm).toBe(2800)
    expect(points.at(-1)?.rpm).toBe(6300)
  })
  it('a single pull has no spread', () => {
    expect(averagePulls([curve(1)]).spreadPct).toBe(0)
  })
  it('pulls that share no range are refused', () => {
    expect(() => averagePulls([curve(1, 2000, 3000), curve(1, 4000, 5000)])).toThrow(RangeError)
    expect(() => averagePulls([])).toThrow(RangeError)
  })
})

describe('repeatSpread: spread at each rpm and the outlier pull', () => {
  it('finds the pull that sits 3 % high (common practice: good pulls agree within 0.5 to 1 %)', () => {
    const r = repeatSpread([curve(1), curve(1.002), curve(1.03), curve(0.999)])
    expect(r.outlier?.index).toBe(2)
    expect(r.outlier?.beyondRepeatability).toBe(true)
    // the 3 % pull against the mean of the other three (1.000333): 2.965 %
    expect(r.outlier?.deviationPct).toBeCloseTo(((1.03 - (1 + 1.002 + 0.999) / 3) / ((1 + 1.002 + 0.999) / 3)) * 100, 6)
    expect(r.spreadPct).toBeCloseTo(((1.03 - 0.999) / ((1 + 1.002 + 1.03 + 0.999) / 4)) * 100, 6)
    for (const row of r.byRpm) expect(row.maxHp).toBeGreaterThanOrEqual(row.minHp)
  })
  it('three good pulls: the furthest one is still named, but within repeatability', () => {
    const r = repeatSpread([curve(1), curve(1.003), curve(0.998)])
    expect(r.outlier?.index).toBe(1)
    expect(r.outlier?.beyondRepeatability).toBe(false)
  })
  it('with two pulls there is no telling which one is off', () => {
    expect(repeatSpread([curve(1), curve(1.05)]).outlier).toBeNull()
  })
  it('reports where the largest spread is', () => {
    const bent = curve(1).map(p => (p.rpm === 5200 ? { ...p, powerHp: p.powerHp * 1.02 } : p))
    const r = repeatSpread([curve(1), bent, curve(1)])
    expect(r.rpmOfLargestSpread).toBe(5200)
    expect(r.spreadPct).toBeCloseTo((0.02 / (1 + 0.02 / 3)) * 100, 6)
  })
})

describe('withinRepeatability (common practice: a gain smaller than the spread is not a gain)', () => {
  it('compares the size of the gain with the larger spread', () => {
    expect(withinRepeatability(0.6, 0.8, 0.5)).toBe(true)
    expect(withinRepeatability(-0.6, 0.8)).toBe(true)
    expect(withinRepeatability(2.0, 0.8, 0.5)).toBe(false)
    expect(withinRepeatability(2.0, undefined, 0.5)).toBe(false)
    expect(withinRepeatability(2.0)).toBeNull()
  })
})
