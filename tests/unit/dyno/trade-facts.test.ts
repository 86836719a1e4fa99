import { describe, expect, it } from 'vitest'
import {
  comparePulls, findCrossings, hpToKw, lbFtToNm, powerHp, reportFixed, reportRound, resultsTable,
  syntheticPull, type PullPoint,
} from '../../../shared/dyno/index'

// Facts of the trade, usable as check values (common practice).
const K = 33000 / (2 * Math.PI)

describe('facts of the trade (common practice)', () => {
  it('torque in lb-ft and power in hp cross at 5252 rpm on any curve (common practice)', () => {
    const { points } = syntheticPull({
      seed: 5, fromRpm: 3000, toRpm: 7500, stepRpm: 10, noisePct: 0, pullOffsetPct: 0,
      peakTorqueLbFt: 480, peakTorqueRpm: 4600, widthLowRpm: 2800, widthHighRpm: 2300,
      weather: { baroInHg: 29.92, airTempF: 60, humidityPct: 0 }, standard: 'none', decimals: 6,
    })
    const crossings = findCrossings(points.map(p => ({ rpm: p.rpm, d: p.powerHp - p.torqueLbFt })))
    expect(crossings).toHaveLength(1)
    expect(Math.abs(crossings[0]! - 5252.11)).toBeLessThan(0.5)
  })

  it('in kW and N-m the crossing is at 9549 rpm (common practice; published: 60000 / 2 pi)', () => {
    for (const t of [100, 350.5, 700]) expect(hpToKw(powerHp(t, 9549.2966))).toBeCloseTo(lbFtToNm(t), 4)
  })

  it('a peak of 631.6 hp is reported as 632 (common practice)', () => {
    expect(reportRound(631.6)).toBe(632)
  })

  it('an intake swap from 598 to 610 hp peak is a 12 hp, 2.0 % peak-to-peak gain although it lost low-rpm torque, crossing just under 5000 rpm (common practice)', () => {
    // Baseline: parabolic torque peaking at 4500 rpm, sized so power peaks at exactly
    // 598 hp at 6000 rpm: c = P K / (2 R^2 (R - rpk)), Tpk = c ((R - rpk)^2 + 2 R (R - rpk)).
    const c = (598 * K) / (2 * 6000 ** 2 * 1500)
    const tpk = c * (1500 ** 2 + 2 * 6000 * 1500)
    const base = (r: number): number => tpk - c * (r - 4500) ** 2
    // The single-plane swap: loses torque below 4950 rpm, gains above (0.0094 lb-ft per rpm).
    const swap = (r: number): number => base(r) + 0.0094 * (r - 4950)
    const sample = (t: (r: number) => number): PullPoint[] => {
      const out: PullPoint[] = []
      for (let r = 2500; r <= 7000; r += 50) out.push({ rpm: r, torqueLbFt: t(r), powerHp: (t(r) * r) / K })
      return out
    }
    const cmp = comparePulls(sample(base), sample(swap))
    expect(reportRound(cmp.peakPower.baseline.value)).toBe(598)
    expect(cmp.peakPower.baseline.rpm).toBe(6000)
    expect(reportRound(cmp.peakPower.candidate.value)).toBe(610)
    expect(cmp.peakPower.candidate.rpm).toBeGreaterThan(6000) // each peak where it falls
    expect(reportRound(cmp.peakPower.gain)).toBe(12)
    expect(reportFixed(cmp.peakPower.gainPct, 1)).toBe('2.0')
    expect(cmp.maxLoss.torqueLbFt.rpm).toBe(2500)
    expect(cmp.maxLoss.torqueLbFt.value).toBeCloseTo(-23.03, 6)
    expect(cmp.crossovers.torqueRpm).toHaveLength(1)
    expect(cmp.crossovers.torqueRpm[0]).toBeGreaterThan(4900)
    expect(cmp.crossovers.torqueRpm[0]).toBeLessThan(5000)
    expect(Math.abs(cmp.crossovers.powerRpm[0]! - cmp.crossovers.torqueRpm[0]!)).toBeLessThan(1) // same zero of the gain
  })

  it('longer-duration cams give lower idle vacuum: 14.3, mid-11, high-6 inHg pass through the results table in order (common practice)', () => {
    const curve = (scale: number): PullPoint[] => {
      const out: PullPoint[] = []
      for (let r = 2500; r <= 6500; r += 100) out.push({ rpm: r, torqueLbFt: 400 * scale, powerHp: (400 * scale * r) / K })
      return out
    }
    const cams = [
      { name: 'Cam 1, 212 deg at 0.050', durationDeg: 212, idleVacuumInHg: 14.3 },
      { name: 'Cam 2, 230 deg at 0.050', durationDeg: 230, idleVacuumInHg: 11.5 },
      { name: 'Cam 3, 248 deg at 0.050', durationDeg: 248, idleVacuumInHg: 6.9 },
    ]
    const table = resultsTable(cams.map((cam, i) => ({ name: cam.name, points: curve(1 + 0.03 * i), idleVacuumInHg: cam.idleVacuumInHg })))
    const vac = table.rows.map(r => r.idleVacuumInHg!)
    expect(vac).toEqual([14.3, 11.5, 6.9])
    for (let i = 1; i < vac.length; i++) expect(vac[i]!).toBeLessThan(vac[i - 1]!)
    expect(vac[1]).toBeGreaterThan(11.2) // "mid-11"
    expect(vac[1]).toBeLessThan(11.8)
    expect(vac[2]).toBeGreaterThan(6.5) // "high-6 to low-7"
    expect(vac[2]).toBeLessThan(7.3)
    expect(table.rows[1]?.vsBaseline?.idleVacuumInHg).toBeCloseTo(-2.8, 9)
    expect(table.rows[2]?.vsBaseline?.idleVacuumInHg).toBeCloseTo(-7.4, 9)
    expect(table.rows[2]?.vsPrevious?.idleVacuumInHg).toBeCloseTo(-4.6, 9)
  })
})
