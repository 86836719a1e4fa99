import { describe, expect, it } from 'vitest'
import {
  correctionFactor, gaussian, modelTorqueLbFt, mulberry32, parsePullCsv, powerHp, syntheticPull,
  type SyntheticPullOptions,
} from '../../../shared/dyno/index'

const opts: SyntheticPullOptions = {
  seed: 42, fromRpm: 2500, toRpm: 6500, stepRpm: 10, peakTorqueLbFt: 450, peakTorqueRpm: 4500, widthLowRpm: 2800, widthHighRpm: 2200,
}

describe('synthetic pulls (documented model in synthetic.ts; invented demo data)', () => {
  it('mulberry32 is seeded and uniform enough: same seed, same stream; mean 0.5, variance 1/12', () => {
    const a = mulberry32(1)
    const b = mulberry32(1)
    const xs = Array.from({ length: 20000 }, () => a())
    expect(xs.slice(0, 5)).toEqual(Array.from({ length: 5 }, () => b()))
    expect(xs.every(x => x >= 0 && x < 1)).toBe(true)
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length
    expect(mean).toBeCloseTo(0.5, 2)
    expect(xs.reduce((s, x) => s + (x - mean) ** 2, 0) / xs.length).toBeCloseTo(1 / 12, 2)
    expect(mulberry32(2)()).not.toBe(mulberry32(1)())
  })
  it('gaussian draws have mean 0 and standard deviation 1', () => {
    const r = mulberry32(9)
    const zs = Array.from({ length: 20000 }, () => gaussian(r))
    const mean = zs.reduce((s, z) => s + z, 0) / zs.length
    expect(Math.abs(mean)).toBeLessThan(0.03)
    expect(Math.sqrt(zs.reduce((s, z) => s + (z - mean) ** 2, 0) / zs.length)).toBeCloseTo(1, 1)
  })
  it('the model peaks at its peak and falls by e^-1/2 one width away on each side', () => {
    expect(modelTorqueLbFt(opts, 4500)).toBe(450)
    expect(modelTorqueLbFt(opts, 4500 - 2800)).toBeCloseTo(450 * Math.exp(-0.5), 9)
    expect(modelTorqueLbFt(opts, 4500 + 2200)).toBeCloseTo(450 * Math.exp(-0.5), 9)
  })
  it('is deterministic for a seed and differs between seeds', () => {
    expect(syntheticPull(opts).csv).toBe(syntheticPull(opts).csv)
    expect(syntheticPull({ ...opts, seed: 43 }).csv).not.toBe(syntheticPull(opts).csv)
  })
  it('without noise, observed torque is the model divided by CF for the weather', () => {
    const weather = { baroInHg: 28.9, airTempF: 88, humidityPct: 50 }
    const p = syntheticPull({ ...opts, noisePct: 0, pullOffsetPct: 0, weather, decimals: 6 })
    const cf = correctionFactor('sae-j1349-1990', weather)
    for (const pt of p.points.filter((_, i) => i % 50 === 0)) {
      expect(pt.torqueLbFt).toBeCloseTo(modelTorqueLbFt(opts, pt.rpm) / cf, 5)
      expect(pt.powerHp).toBeCloseTo(powerHp(modelTorqueLbFt(opts, pt.rpm) / cf, pt.rpm), 5)
    }
  })
  it('noise has about the requested size', () => {
    const p = syntheticPull({ ...opts, noisePct: 0.5, pullOffsetPct: 0, weather: { baroInHg: 29.92, airTempF: 60, humidityPct: 0 }, standard: 'none', decimals: 6 })
    const rel = p.points.map(pt => pt.torqueLbFt / modelTorqueLbFt(opts, pt.rpm) - 1)
    const sd = Math.sqrt(rel.reduce((s, x) => s + x * x, 0) / rel.length)
    expect(sd).toBeGreaterThan(0.004)
    expect(sd).toBeLessThan(0.006)
  })
  it('writes our CSV format, which reads back clean with its weather', () => {
    const p = syntheticPull({ ...opts, samples: 4000 })
    const back = parsePullCsv(p.csv)
    expect(back.problems).toEqual([])
    expect(back.points).toHaveLength(4000)
    expect(back.weather).toEqual(p.weather)
    expect(back.points[100]).toEqual(p.points[100])
    expect(p.csv).toMatch(/invented data/)
  })
})
