import { describe, expect, it } from 'vitest'
import {
  CORRECTION_STANDARDS, CORRECTION_STANDARD_IDS, KPA_PER_INHG, applyCorrection, correctionFactor,
  correctionProblems, correctionStandardInfo, type Weather,
} from '../../../shared/dyno/index'

const inHg = (kPa: number): number => kPa / KPA_PER_INHG
// Exact reference temperatures of the formulas (298 K, 293 K) in F.
const kelvinToF = (k: number): number => ((k - 273.15) * 9) / 5 + 32

describe('each standard gives 1.000 at its own reference conditions', () => {
  it('SAE J1349 JUN1990 at 25 C and 99 kPa dry air (secondary); exactly 1 at 298 K', () => {
    expect(correctionFactor('sae-j1349-1990', { baroInHg: inHg(99), airTempF: 77, humidityPct: 0 })).toBeCloseTo(1, 3)
    expect(correctionFactor('sae-j1349-1990', { baroInHg: inHg(99), airTempF: kelvinToF(298), humidityPct: 0 })).toBeCloseTo(1, 12)
  })
  it('ISO 1585 at 25 C and 99 kPa dry air (from memory); exactly 1 at 298 K', () => {
    expect(correctionFactor('iso-1585', { baroInHg: inHg(99), airTempF: 77, humidityPct: 0 })).toBeCloseTo(1, 3)
    expect(correctionFactor('iso-1585', { baroInHg: inHg(99), airTempF: kelvinToF(298), humidityPct: 0 })).toBeCloseTo(1, 12)
  })
  it('STD at 60 F and 29.92 inHg dry air (secondary)', () => {
    expect(correctionFactor('std-60f', { baroInHg: 29.92, airTempF: 60, humidityPct: 0 })).toBeCloseTo(1, 12)
  })
  it('DIN 70020 at 20 C and 1013 mbar, humidity ignored (secondary); exactly 1 at 293 K', () => {
    expect(correctionFactor('din-70020', { baroInHg: inHg(101.3), airTempF: 68, humidityPct: 0 })).toBeCloseTo(1, 3)
    expect(correctionFactor('din-70020', { baroInHg: inHg(101.3), airTempF: kelvinToF(293), humidityPct: 80 })).toBeCloseTo(1, 12)
  })
  it('humidity lowers dry-air pressure, so a humid reference day corrects upward (SAE, ISO, STD use dry air)', () => {
    for (const s of ['sae-j1349-1990', 'iso-1585', 'std-60f'] as const) {
      expect(correctionFactor(s, { baroInHg: 29.92, airTempF: 60, humidityPct: 60 })).toBeGreaterThan(
        correctionFactor(s, { baroInHg: 29.92, airTempF: 60, humidityPct: 0 }),
      )
    }
  })
  it('none is always 1', () => {
    expect(correctionFactor('none', { baroInHg: 25, airTempF: 100, humidityPct: 90 })).toBe(1)
  })
})

// Worked by hand from the formulas in check-sources.md (a desk calculator, not this code):
// Day A: 29.31 inHg, 78 F, 41 % RH
//   baro = 29.31 x 3.386388640341 = 99.255051 kPa; 78 F = 25.555556 C = 298.705556 K
//   psat(25.5556 C) = 3.275707 kPa (ASHRAE eq. 6); pv = 0.41 x 3.275707 = 1.343040 kPa
//   Pd = 99.255051 - 1.343040 = 97.912011 kPa = 28.913401 inHg
//   SAE = 1.18 x 99/97.912011 x sqrt(298.705556/298) - 0.18 = 1.014524
//   ISO = (99/97.912011)^1.2 x (298.705556/298)^0.6 = 1.014788
//   STD = 29.92/28.913401 x sqrt(537.67/519.67) = 1.052583
//   DIN = 1013/992.55051 x sqrt(298.705556/293) = 1.030492
// Day B: 24.90 inHg, 95 F, 0 % RH (high and hot): Pd = 84.321077 kPa, 308.15 K
//   SAE 1.228815, ISO 1.236991, STD 1.241411, DIN 1.232028
// Day C: 30.40 inHg, 40 F, 30 % RH (cold, dense): baro 102.946215 kPa, 277.594444 K,
//   psat(4.4444 C) = 0.839255 kPa, pv = 0.251776, Pd = 102.694438 kPa = 30.325650 inHg
//   SAE 0.917912, ISO 0.917113, STD 0.967452, DIN 0.957791
const days: [string, Weather, Record<'sae-j1349-1990' | 'iso-1585' | 'std-60f' | 'din-70020', number>][] = [
  ['A', { baroInHg: 29.31, airTempF: 78, humidityPct: 41 }, { 'sae-j1349-1990': 1.014524, 'iso-1585': 1.014788, 'std-60f': 1.052583, 'din-70020': 1.030492 }],
  ['B', { baroInHg: 24.9, airTempF: 95, humidityPct: 0 }, { 'sae-j1349-1990': 1.228815, 'iso-1585': 1.236991, 'std-60f': 1.241411, 'din-70020': 1.232028 }],
  ['C', { baroInHg: 30.4, airTempF: 40, humidityPct: 30 }, { 'sae-j1349-1990': 0.917912, 'iso-1585': 0.917113, 'std-60f': 0.967452, 'din-70020': 0.957791 }],
]

describe('worked cases computed by hand from the formulas (SAE, STD, DIN: secondary; ISO: from memory)', () => {
  for (const [name, weather, expected] of days) {
    for (const [standard, cf] of Object.entries(expected)) {
      it(`day ${name}, ${standard}: ${cf}`, () => {
        expect(correctionFactor(standard as keyof typeof expected, weather)).toBeCloseTo(cf, 5)
      })
    }
  }
})

describe('impossible weather is a RangeError with a clear message', () => {
  const ok: Weather = { baroInHg: 29.92, airTempF: 60, humidityPct: 0 }
  it.each([
    [{ ...ok, baroInHg: 0 }, /barometric pressure/],
    [{ ...ok, baroInHg: -29 }, /barometric pressure/],
    [{ ...ok, baroInHg: Number.NaN }, /barometric pressure/],
    [{ ...ok, humidityPct: 101 }, /relative humidity/],
    [{ ...ok, humidityPct: -1 }, /relative humidity/],
    [{ ...ok, airTempF: -500 }, /air temperature/],
    [{ baroInHg: 2, airTempF: 200, humidityPct: 100 }, /vapour pressure .* exceeds the barometric pressure/],
  ])('%o', (weather, message) => {
    for (const s of ['sae-j1349-1990', 'iso-1585', 'std-60f', 'din-70020'] as const) {
      expect(() => correctionFactor(s, weather)).toThrow(RangeError)
      expect(() => correctionFactor(s, weather)).toThrow(message)
    }
  })
})

describe('correction warnings', () => {
  it('day B is outside 0.90..1.10 (common practice) and outside ISO 0.93..1.07 (from memory)', () => {
    const iso = correctionProblems('iso-1585', days[1]![1])
    expect(iso.map(p => p.severity)).toEqual(['warning', 'warning'])
    expect(iso[0]!.message).toMatch(/0\.93 to 1\.07/)
    expect(iso[1]!.message).toMatch(/0\.90 to 1\.10/)
    expect(correctionProblems('sae-j1349-1990', days[1]![1])).toHaveLength(1)
  })
  it('day A draws no warning; impossible weather is an error', () => {
    expect(correctionProblems('sae-j1349-1990', days[0]![1])).toEqual([])
    expect(correctionProblems('std-60f', { baroInHg: 0, airTempF: 60, humidityPct: 0 })[0]?.severity).toBe('error')
  })
})

describe('applyCorrection and the list of standards', () => {
  it('multiplies torque and power by CF and leaves rpm, vacuum and AFR alone', () => {
    const points = [{ rpm: 4000, torqueLbFt: 400, powerHp: 304.67, vacuumInHg: 0.6, afr: 12.8 }]
    const [p] = applyCorrection(points, 'sae-j1349-1990', days[0]![1])
    expect(p?.torqueLbFt).toBeCloseTo(400 * 1.014524, 3)
    expect(p?.powerHp).toBeCloseTo(304.67 * 1.014524, 3)
    expect(p).toMatchObject({ rpm: 4000, vacuumInHg: 0.6, afr: 12.8 })
    expect(points[0]!.torqueLbFt).toBe(400) // observed data untouched
    expect(applyCorrection(points, 'none', days[0]![1])).toEqual(points)
  })
  it('lists every standard once, ids matching CORRECTION_STANDARD_IDS, with reference conditions', () => {
    expect(CORRECTION_STANDARDS.map(s => s.id)).toEqual([...CORRECTION_STANDARD_IDS])
    expect(correctionStandardInfo('std-60f').referencePressureKPa).toBeCloseTo(101.32, 2)
    expect(correctionStandardInfo('din-70020').pressureBasis).toBe('total')
    expect(() => correctionStandardInfo('sae-j1349-2004' as never)).toThrow(RangeError)
  })
})
