import { describe, expect, it } from 'vitest'
import {
  averageOver, comparePulls, findCrossings, modelTorqueLbFt, powerBand, syntheticPull, torqueLbFt,
  type PullPoint, type TorqueModel,
} from '../../../shared/dyno/index'

// Curves with answers known exactly (common practice method, check-sources "Curves":
// common grid, linear interpolation, trapezoid average, interpolated crossovers).
const K = 33000 / (2 * Math.PI) // hp = lb-ft x rpm / K (published: NIST SP 811)
const c = 3e-5
// Baseline torque, a parabola peaking at 607.5 lb-ft at 4500 rpm. Its power r T(r)/K
// has dP/dr = 0 where T + r T' = 0: at 6000 rpm, since 607.5 = c (1500^2 + 2 x 6000 x 1500).
const baseT = (r: number): number => 607.5 - c * (r - 4500) ** 2
// Candidate = baseline + alpha + beta r. beta = 200 c moves the torque peak to 4600 rpm;
// alpha = -(T(6100) + 6100 beta + 6100 (T'(6100) + beta)) = -18.3 puts the power peak at 6100 rpm.
const beta = 200 * c
const alpha = -(baseT(6100) + beta * 6100 + 6100 * (-2 * c * (6100 - 4500) + beta))
const candT = (r: number): number => baseT(r) + alpha + beta * r
const crossing = -alpha / beta // where the torque gain alpha + beta r is zero: 3050 rpm

function sample(torque: (r: number) => number, fromRpm: number, toRpm: number, stepRpm: number): PullPoint[] {
  const out: PullPoint[] = []
  for (let r = fromRpm; r <= toRpm + 1e-9; r += stepRpm) out.push({ rpm: r, torqueLbFt: torque(r), powerHp: (torque(r) * r) / K })
  return out
}

// Exact trapezoid mean of the power gain (alpha r + beta r^2)/K over [a, b] with step h:
// the exact mean plus h^2 f''/12 (Euler-Maclaurin, exact for a quadratic; f'' = 2 beta / K).
function trapezoidPowerGain(a: number, b: number, h: number): number {
  const exact = ((alpha * (b ** 2 - a ** 2)) / 2 + (beta * (b ** 3 - a ** 3)) / 3) / K / (b - a)
  return exact + (h ** 2 * ((2 * beta) / K)) / 12
}

describe('comparePulls on polynomial curves with exact answers', () => {
  it('the test curves are what they claim', () => {
    expect(alpha).toBeCloseTo(-18.3, 9)
    expect(crossing).toBeCloseTo(3050, 6)
    expect(candT(4600)).toBeCloseTo(616.5, 9)
  })

  for (const step of [10, 25, 50, 100]) {
    it(`sampled every ${step} rpm, 2500 to 7000 rpm`, () => {
      const cmp = comparePulls(sample(baseT, 2500, 7000, step), sample(candT, 2500, 7000, step))
      // peaks from each pull's own samples, wherever each falls
      expect(cmp.peakTorque.baseline).toEqual({ value: 607.5, rpm: 4500 })
      expect(cmp.peakTorque.candidate.rpm).toBe(4600)
      expect(cmp.peakTorque.candidate.value).toBeCloseTo(616.5, 9)
      expect(cmp.peakTorque.gain).toBeCloseTo(9, 9)
      expect(cmp.peakTorque.gainPct).toBeCloseTo((9 / 607.5) * 100, 9)
      expect(cmp.peakPower.baseline.rpm).toBe(6000)
      expect(cmp.peakPower.baseline.value).toBeCloseTo((6000 * baseT(6000)) / K, 9)
      expect(cmp.peakPower.candidate.rpm).toBe(6100)
      expect(cmp.peakPower.gain).toBeCloseTo((6100 * candT(6100) - 6000 * baseT(6000)) / K, 9)
      // the grid: multiples of 100 from 2500 to 7000, every one a sample point here
      expect(cmp.byRpm.map(r => r.rpm)).toEqual(Array.from({ length: 46 }, (_, i) => 2500 + 100 * i))
      for (const row of cmp.byRpm) {
        expect(row.gain.torqueLbFt).toBeCloseTo(alpha + beta * row.rpm, 9)
        expect(row.candidate.powerHp).toBeCloseTo((row.rpm * candT(row.rpm)) / K, 9)
      }
      // averages: trapezoid over the grid; exact for the linear torque gain (= gain at mid-band)
      expect(cmp.averageGain).toMatchObject({ fromRpm: 2500, toRpm: 7000 })
      expect(cmp.averageGain.torqueLbFt).toBeCloseTo(alpha + beta * 4750, 9)
      expect(cmp.averageGain.powerHp).toBeCloseTo(trapezoidPowerGain(2500, 7000, 100), 9)
      // largest gain at the top of the grid, largest loss at the bottom
      expect(cmp.maxGain.torqueLbFt).toEqual({ value: expect.closeTo(alpha + beta * 7000, 9), rpm: 7000 })
      expect(cmp.maxLoss.torqueLbFt).toEqual({ value: expect.closeTo(alpha + beta * 2500, 9), rpm: 2500 })
      expect(cmp.maxLoss.powerHp.rpm).toBe(2500)
      expect(cmp.maxLoss.powerHp.value).toBeLessThan(0)
      // crossover: exact for the linear torque gain; for power, the interpolation formula
      // r1 + (r2 - r1) d1 / (d1 - d2) on the exact gains at 3000 and 3100 rpm
      expect(cmp.crossovers.torqueRpm).toHaveLength(1)
      expect(cmp.crossovers.torqueRpm[0]).toBeCloseTo(3050, 6)
      const d1 = (3000 * (alpha + beta * 3000)) / K
      const d2 = (3100 * (alpha + beta * 3100)) / K
      expect(cmp.crossovers.powerRpm).toHaveLength(1)
      expect(cmp.crossovers.powerRpm[0]).toBeCloseTo(3000 + (100 * d1) / (d1 - d2), 6)
      expect(Math.abs(cmp.crossovers.powerRpm[0]! - 3050)).toBeLessThan(1)
    })
  }

  it('a 250 rpm grid (tables) changes the trapezoid term as h^2', () => {
    const cmp = comparePulls(sample(baseT, 2500, 7000, 50), sample(candT, 2500, 7000, 50), { stepRpm: 250 })
    expect(cmp.byRpm).toHaveLength(19)
    expect(cmp.averageGain.powerHp).toBeCloseTo(trapezoidPowerGain(2500, 7000, 250), 9)
  })

  it('ranges that only partly overlap compare on the shared grid only, never extrapolating', () => {
    const cmp = comparePulls(sample(baseT, 2000, 6500, 25), sample(candT, 3000, 7500, 25))
    expect(cmp.averageGain.fromRpm).toBe(3000)
    expect(cmp.averageGain.toRpm).toBe(6500)
    expect(cmp.byRpm[0]?.rpm).toBe(3000)
    expect(cmp.byRpm.at(-1)?.rpm).toBe(6500)
    expect(cmp.averageGain.torqueLbFt).toBeCloseTo(alpha + beta * 4750, 9)
    expect(cmp.averageGain.powerHp).toBeCloseTo(trapezoidPowerGain(3000, 6500, 100), 9)
    // peaks still from each pull's full data
    expect(cmp.peakPower.candidate.rpm).toBe(6100)
    expect(cmp.peakTorque.baseline.rpm).toBe(4500)
    // the torque crossing at 3050 is inside the shared range
    expect(cmp.crossovers.torqueRpm[0]).toBeCloseTo(3050, 6)
  })

  it('samples off the grid: grid values are interpolated (error below c h^2 / 4)', () => {
    const cmp = comparePulls(sample(baseT, 2505, 6995, 10), sample(candT, 2505, 6995, 10))
    expect(cmp.byRpm[0]?.rpm).toBe(2600)
    expect(cmp.byRpm.at(-1)?.rpm).toBe(6900)
    for (const row of cmp.byRpm) expect(Math.abs(row.baseline.torqueLbFt - baseT(row.rpm))).toBeLessThan((c * 10 ** 2) / 4 + 1e-9)
    expect(cmp.crossovers.torqueRpm[0]).toBeCloseTo(3050, 6) // the gain itself is linear: still exact
  })

  it('pulls that share no full step are refused', () => {
    expect(() => comparePulls(sample(baseT, 2000, 3000, 10), sample(candT, 3050, 5000, 10))).toThrow(RangeError)
  })
})

describe('noisy pulls (synthetic model, seeded)', () => {
  const weather = { baroInHg: 29.92, airTempF: 60, humidityPct: 0 }
  const a: TorqueModel = { peakTorqueLbFt: 450, peakTorqueRpm: 4200, widthLowRpm: 2600, widthHighRpm: 2400 }
  const b: TorqueModel = { peakTorqueLbFt: 462, peakTorqueRpm: 4900, widthLowRpm: 2200, widthHighRpm: 2600 }
  const pull = (m: TorqueModel, seed: number, noisePct = 0.5): PullPoint[] =>
    syntheticPull({ ...m, seed, fromRpm: 2500, toRpm: 7000, stepRpm: 10, noisePct, pullOffsetPct: 0, weather, standard: 'none', decimals: 3 }).points
  const truth = (m: TorqueModel): PullPoint[] => {
    const out: PullPoint[] = []
    for (let r = 2500; r <= 7000; r += 1) out.push({ rpm: r, torqueLbFt: modelTorqueLbFt(m, r), powerHp: (modelTorqueLbFt(m, r) * r) / K })
    return out
  }

  it('peaks and average gain land within the noise of the noiseless answer', () => {
    const exact = comparePulls(truth(a), truth(b))
    const noisy = comparePulls(pull(a, 11), pull(b, 12))
    expect(noisy.peakTorque.gain).toBeCloseTo(exact.peakTorque.gain, -1) // within 5 lb-ft of 12
    expect(Math.abs(noisy.peakPower.candidate.value - exact.peakPower.candidate.value) / exact.peakPower.candidate.value).toBeLessThan(0.02)
    // averaging over the band cancels most of the sample noise
    expect(Math.abs(noisy.averageGain.torqueLbFt - exact.averageGain.torqueLbFt)).toBeLessThan(1)
  })

  it('the crossover of noisy pulls sits near the true one', () => {
    const exact = comparePulls(truth(a), truth(b))
    const noisy = comparePulls(pull(a, 21), pull(b, 22))
    expect(exact.crossovers.torqueRpm).toHaveLength(1)
    const trueRpm = exact.crossovers.torqueRpm[0]!
    expect(trueRpm).toBeGreaterThan(3500)
    expect(trueRpm).toBeLessThan(4800)
    expect(noisy.crossovers.torqueRpm.length).toBeGreaterThanOrEqual(1)
    for (const r of noisy.crossovers.torqueRpm) expect(Math.abs(r - trueRpm)).toBeLessThan(300)
  })

  it('identical models with different noise show no real gain anywhere', () => {
    const cmp = comparePulls(pull(a, 31, 0.3), pull(a, 32, 0.3))
    expect(Math.abs(cmp.averageGain.powerHp)).toBeLessThan(1)
    expect(Math.abs(cmp.peakPower.gainPct)).toBeLessThan(1.5)
  })
})

describe('findCrossings', () => {
  it('interpolates sign changes and counts a run of zeros once, at its middle', () => {
    expect(findCrossings([{ rpm: 0, d: -1 }, { rpm: 100, d: 3 }])).toEqual([25])
    expect(findCrossings([{ rpm: 0, d: 2 }, { rpm: 100, d: 0 }, { rpm: 200, d: 0 }, { rpm: 300, d: -1 }])).toEqual([150])
    expect(findCrossings([{ rpm: 0, d: 2 }, { rpm: 100, d: 0 }, { rpm: 200, d: 1 }])).toEqual([]) // touches, does not cross
  })
})

// A power curve of straight pieces: 100 hp at 2000 rising to 500 hp at 6000, falling to 300 at 7000.
const tri = (r: number): number => (r <= 6000 ? 100 + 0.1 * (r - 2000) : 500 - 0.2 * (r - 6000))
const triangle = (step: number): PullPoint[] => {
  const out: PullPoint[] = []
  for (let r = 2000; r <= 7000; r += step) out.push({ rpm: r, powerHp: tri(r), torqueLbFt: torqueLbFt(tri(r), r) })
  return out
}

describe('power band and band averages (check-sources "Curves")', () => {
  it.each([10, 25, 50, 100])('90 %% power band of the straight-piece curve is 5500 to 6250 rpm (sampled every %d rpm)', (step) => {
    // 450 hp = 100 + 0.1 (r - 2000) at 5500; = 500 - 0.2 (r - 6000) at 6250
    const band = powerBand(triangle(step))
    expect(band.fromRpm).toBeCloseTo(5500, 9)
    expect(band.toRpm).toBeCloseTo(6250, 9)
  })
  it('edges between samples are interpolated, and an edge never crossed is the end of the data', () => {
    const band = powerBand(triangle(400), 0.8) // 400 hp at 5000 and 6500 rpm, both between samples
    expect(band.fromRpm).toBeCloseTo(5000, 9)
    expect(band.toRpm).toBeCloseTo(6500, 9)
    expect(powerBand(triangle(100), 0.2)).toEqual({ fromRpm: expect.closeTo(2000, 9), toRpm: 7000 })
  })
  it('average over 2550..6420 rpm is trapezoid area / width with interpolated limits: 341.6628 hp (by hand)', () => {
    // (155 + 500)/2 x 3450 + (500 + 416)/2 x 420 = 1,322,235 hp-rpm over 3870 rpm
    expect(averageOver(triangle(100), 'powerHp', 2550, 6420)).toBeCloseTo(1322235 / 3870, 9)
    // ...not the plain mean of the samples inside the band
    const inside = triangle(100).filter(p => p.rpm >= 2550 && p.rpm <= 6420)
    const plain = inside.reduce((s, p) => s + p.powerHp, 0) / inside.length
    expect(Math.abs(plain - 1322235 / 3870)).toBeGreaterThan(0.5)
  })
  it('averages are independent of sampling density', () => {
    const dense = [...triangle(10).filter(p => p.rpm < 4000), ...triangle(500).filter(p => p.rpm >= 4000)]
    expect(averageOver(dense, 'powerHp', 2000, 7000)).toBeCloseTo(averageOver(triangle(100), 'powerHp', 2000, 7000), 9)
  })
  it('refuses a band outside the pull', () => {
    expect(() => averageOver(triangle(100), 'powerHp', 1500, 6000)).toThrow(RangeError)
  })
})
