// Water vapour in the intake air. Saturation vapour pressure follows ASHRAE Handbook
// Fundamentals (2017) ch. 1, eqs. 5 (over ice) and 6 (over liquid water), the
// Hyland-Wexler fits; the ice branch is used at and below the triple point
// (0.01 deg C), as PsychroLib does, so the two agree to rounding.

import type { Weather } from './types'
import { KPA_PER_INHG, fToC } from './units'

const MIN_C = -100
const MAX_C = 200
const TRIPLE_POINT_C = 0.01

/** Saturation vapour pressure over water (over ice at or below 0.01 C), kPa. Valid -100..200 C. */
export function saturationVaporPressureKPa(tempC: number): number {
  if (!Number.isFinite(tempC) || tempC < MIN_C || tempC > MAX_C) {
    throw new RangeError(`saturation vapour pressure is defined here for ${MIN_C}..${MAX_C} C, got ${tempC} C`)
  }
  const t = tempC + 273.15
  const lnPa
    = tempC <= TRIPLE_POINT_C
      ? -5.6745359e3 / t + 6.3925247 - 9.677843e-3 * t + 6.2215701e-7 * t ** 2
      + 2.0747825e-9 * t ** 3 - 9.484024e-13 * t ** 4 + 4.1635019 * Math.log(t)
      : -5.8002206e3 / t + 1.3914993 - 4.8640239e-2 * t + 4.1764768e-5 * t ** 2
        - 1.4452093e-8 * t ** 3 + 6.5459673 * Math.log(t)
  return Math.exp(lnPa) / 1000
}

/** Partial pressure of water vapour: relative humidity x saturation pressure at the air temperature. */
export function vaporPressureKPa(weather: Pick<Weather, 'airTempF' | 'humidityPct'>): number {
  return (weather.humidityPct / 100) * saturationVaporPressureKPa(fToC(weather.airTempF))
}

/** Dry-air pressure = barometric pressure - vapour pressure, kPa. */
export function dryAirPressureKPa(weather: Weather): number {
  return weather.baroInHg * KPA_PER_INHG - vaporPressureKPa(weather)
}
