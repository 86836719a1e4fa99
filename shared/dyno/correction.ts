// Atmospheric correction: observed torque and power x CF bring a pull to one standard
// atmosphere so pulls made on different days compare. Formulas and marks as in
// shared/check-sources.md; the observed data and the weather stay the truth.

import type { CorrectionStandard, Problem, PullPoint, Weather } from './types'
import { KPA_PER_INHG, fToC, fToK, fToR } from './units'
import { dryAirPressureKPa } from './vapor'

type StandardShape = {
  id: CorrectionStandard
  label: string
  /** Reference conditions, in words, for labels and the methodology page. */
  reference: string
  referenceAirTempC: number | null
  referencePressureKPa: number | null
  /** Whether the formula uses dry-air pressure (baro - vapour pressure) or the total baro. */
  pressureBasis: 'dry' | 'total' | null
  formula: string
  /** How the formula was checked (shared/check-sources.md marks). */
  mark: 'published' | 'secondary' | 'from memory' | null
}

/**
 * The standards the app offers, in the order it offers them. `as const` so the app can
 * build a zod enum (`z.enum(CORRECTION_STANDARD_IDS)`) and its select options from it.
 */
export const CORRECTION_STANDARDS = [
  {
    id: 'sae-j1349-1990',
    label: 'SAE J1349 (JUN1990)',
    reference: '25 °C (77 °F), 99 kPa dry air',
    referenceAirTempC: 25,
    referencePressureKPa: 99,
    pressureBasis: 'dry',
    formula: 'CF = 1.18 × (99 / Pd[kPa]) × √(T[K] / 298) − 0.18',
    mark: 'secondary',
  },
  {
    id: 'iso-1585',
    label: 'ISO 1585 / ECE R85 (spark ignition)',
    reference: '25 °C (77 °F), 99 kPa dry air',
    referenceAirTempC: 25,
    referencePressureKPa: 99,
    pressureBasis: 'dry',
    formula: 'CF = (99 / Pd[kPa])^1.2 × (T[K] / 298)^0.6, stated valid for 0.93 to 1.07',
    mark: 'from memory',
  },
  {
    id: 'std-60f',
    label: 'STD (60 °F, 29.92 inHg dry air)',
    reference: '60 °F (15.6 °C), 29.92 inHg dry air',
    referenceAirTempC: (60 - 32) * (5 / 9),
    referencePressureKPa: 29.92 * KPA_PER_INHG,
    pressureBasis: 'dry',
    formula: 'CF = (29.92 / Pd[inHg]) × √((t[°F] + 459.67) / 519.67)',
    mark: 'secondary',
  },
  {
    id: 'din-70020',
    label: 'DIN 70020',
    reference: '20 °C (68 °F), 1013 mbar total pressure, humidity not used',
    referenceAirTempC: 20,
    referencePressureKPa: 101.3,
    pressureBasis: 'total',
    formula: 'CF = (1013 / p[mbar]) × √(T[K] / 293)',
    mark: 'secondary',
  },
  {
    id: 'none',
    label: 'Observed (no correction)',
    reference: 'the weather of the pull',
    referenceAirTempC: null,
    referencePressureKPa: null,
    pressureBasis: null,
    formula: 'CF = 1',
    mark: null,
  },
] as const satisfies readonly StandardShape[]

export const CORRECTION_STANDARD_IDS = [
  'sae-j1349-1990',
  'iso-1585',
  'std-60f',
  'din-70020',
  'none',
] as const satisfies readonly CorrectionStandard[]

export type CorrectionStandardInfo = (typeof CORRECTION_STANDARDS)[number]

// Compile-time guard: the tuple lists every standard of the union, and nothing else.
type Ids = (typeof CORRECTION_STANDARDS)[number]['id']
const _allListed: [CorrectionStandard] extends [Ids] ? true : never = true
const _idsListed: [CorrectionStandard] extends [(typeof CORRECTION_STANDARD_IDS)[number]] ? true : never = true
void _allListed
void _idsListed

export function correctionStandardInfo(standard: CorrectionStandard): CorrectionStandardInfo {
  const info = CORRECTION_STANDARDS.find(s => s.id === standard)
  if (!info) throw new RangeError(`unknown correction standard "${String(standard)}"`)
  return info
}

/** Common practice: a factor outside this range means conditions far from standard. */
export const CF_WARNING_RANGE = { min: 0.9, max: 1.1 } as const
/** ISO 1585's stated range of validity (from memory). */
export const ISO_1585_VALID_RANGE = { min: 0.93, max: 1.07 } as const

/** Throws a RangeError naming the first impossible value; returns nothing when the weather is usable. */
export function assertWeather(weather: Weather): void {
  const { baroInHg, airTempF, humidityPct } = weather
  if (!Number.isFinite(baroInHg) || baroInHg <= 0) {
    throw new RangeError(`barometric pressure must be a number above 0 inHg (got ${baroInHg})`)
  }
  if (!Number.isFinite(airTempF) || airTempF < -148 || airTempF > 392) {
    throw new RangeError(`air temperature must be between -148 and 392 F (got ${airTempF})`)
  }
  if (!Number.isFinite(humidityPct) || humidityPct < 0 || humidityPct > 100) {
    throw new RangeError(`relative humidity must be between 0 and 100 % (got ${humidityPct})`)
  }
  const dryKPa = dryAirPressureKPa(weather)
  if (!(dryKPa > 0)) {
    throw new RangeError(
      `vapour pressure at ${airTempF} F and ${humidityPct} % exceeds the barometric pressure of ${baroInHg} inHg`,
    )
  }
}

/** Correction factor of a standard for the weather of a pull; RangeError for impossible weather. */
export function correctionFactor(standard: CorrectionStandard, weather: Weather): number {
  if (standard === 'none') return 1
  assertWeather(weather)
  switch (standard) {
    case 'sae-j1349-1990':
      return 1.18 * (99 / dryAirPressureKPa(weather)) * Math.sqrt(fToK(weather.airTempF) / 298) - 0.18
    case 'iso-1585':
      return (99 / dryAirPressureKPa(weather)) ** 1.2 * (fToK(weather.airTempF) / 298) ** 0.6
    case 'std-60f':
      return (29.92 / (dryAirPressureKPa(weather) / KPA_PER_INHG)) * Math.sqrt(fToR(weather.airTempF) / 519.67)
    case 'din-70020':
      return (1013 / (weather.baroInHg * KPA_PER_INHG * 10)) * Math.sqrt(fToK(weather.airTempF) / 293)
    default:
      throw new RangeError(`unknown correction standard "${String(standard satisfies never)}"`)
  }
}

/** Warnings (and errors for impossible weather) about correcting a pull with this standard. */
export function correctionProblems(standard: CorrectionStandard, weather: Weather): Problem[] {
  if (standard === 'none') return []
  let cf: number
  try {
    cf = correctionFactor(standard, weather)
  }
  catch (e) {
    return [{ severity: 'error', message: e instanceof Error ? e.message : String(e) }]
  }
  const problems: Problem[] = []
  const shown = cf.toFixed(3)
  if (standard === 'iso-1585' && (cf < ISO_1585_VALID_RANGE.min || cf > ISO_1585_VALID_RANGE.max)) {
    problems.push({
      severity: 'warning',
      message: `correction factor ${shown} is outside ISO 1585's stated range of 0.93 to 1.07`,
    })
  }
  if (cf < CF_WARNING_RANGE.min || cf > CF_WARNING_RANGE.max) {
    problems.push({
      severity: 'warning',
      message: `correction factor ${shown} is outside 0.90 to 1.10: the test conditions were far from standard (${fToC(weather.airTempF).toFixed(1)} C, ${weather.baroInHg} inHg)`,
    })
  }
  return problems
}

/** Corrected copy of a pull: torque and power x CF; vacuum and AFR are not corrected. */
export function applyCorrection(points: readonly PullPoint[], standard: CorrectionStandard, weather: Weather): PullPoint[] {
  const cf = correctionFactor(standard, weather)
  return points.map(p => ({ ...p, torqueLbFt: p.torqueLbFt * cf, powerHp: p.powerHp * cf }))
}
