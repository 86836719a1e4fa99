// Synthetic pulls for demo data and benchmarks. Invented data, and labelled so in
// the files it writes. Pure: the same options and seed give the same pull.
//
// The model, per sample at engine speed r (rpm):
//
//   corrected torque  T(r) = Tpk x exp(-((r - rpk) / w)^2 / 2)
//                     w = widthLowRpm below the torque peak rpk, widthHighRpm above it
//                     (two half-gaussians meet with zero slope at the peak, so the curve is smooth)
//   observed torque   T(r) x (1 + pull offset) x (1 + sample noise) / CF(weather, standard)
//                     pull offset ~ N(0, pullOffsetPct %) once per pull (pull-to-pull scatter),
//                     sample noise ~ N(0, noisePct %) per sample (the dyno's own jitter),
//                     both from the seeded generator; dividing by CF turns the engine's
//                     standard-day output into what the dyno saw in that weather
//   power             observed torque x r / 5252.113 (as the dyno computes it)
//   vacuum at WOT     wotVacuumInHg x (r / toRpm)^2 + N(0, 0.05) inHg (intake restriction grows with flow)
//   AFR               afr + N(0, 0.1)
//
// Random numbers: mulberry32 (a small 32-bit PRNG; uniform in [0, 1)), and
// Box-Muller for the normal draws.

import type { CorrectionStandard, PullPoint, Weather } from './types'
import { correctionFactor } from './correction'
import { powerHp } from './units'
import { writeCsv } from './csv-write'

/** mulberry32: a seeded uniform generator on [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** A standard normal draw (Box-Muller) from a uniform generator. */
export function gaussian(random: () => number): number {
  const u = 1 - random() // (0, 1]: log stays finite
  const v = random()
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v)
}

export type TorqueModel = { peakTorqueLbFt: number, peakTorqueRpm: number, widthLowRpm: number, widthHighRpm: number }

/** The noiseless standard-day torque of the model at an rpm. */
export function modelTorqueLbFt(model: TorqueModel, rpm: number): number {
  const w = rpm < model.peakTorqueRpm ? model.widthLowRpm : model.widthHighRpm
  const z = (rpm - model.peakTorqueRpm) / w
  return model.peakTorqueLbFt * Math.exp(-(z * z) / 2)
}

export type SyntheticPullOptions = TorqueModel & {
  seed: number
  fromRpm: number
  toRpm: number
  /** Number of samples; overrides stepRpm. */
  samples?: number
  /** rpm between samples, default 10. */
  stepRpm?: number
  /** Per-sample noise, percent (default 0.3). */
  noisePct?: number
  /** Pull-to-pull scatter, percent (default 0.3). */
  pullOffsetPct?: number
  /** Weather of the pull; drawn from the seed (a plausible day) when absent. */
  weather?: Weather
  /** The standard the model's torque is a standard-day figure for (default SAE J1349 JUN1990). */
  standard?: CorrectionStandard
  wotVacuumInHg?: number
  afr?: number
  /** Decimals written for torque, power, vacuum and AFR (default 1; AFR gets 2). */
  decimals?: number
}

/** A plausible test-cell day drawn from a generator: 28.8-30.1 inHg, 60-95 F, 20-70 %. */
export function syntheticWeather(random: () => number): Weather {
  return {
    baroInHg: Number((28.8 + 1.3 * random()).toFixed(2)),
    airTempF: Number((60 + 35 * random()).toFixed(1)),
    humidityPct: Math.round(20 + 50 * random()),
  }
}

export type SyntheticPull = { points: PullPoint[], weather: Weather, csv: string }

export function syntheticPull(opts: SyntheticPullOptions): SyntheticPull {
  const random = mulberry32(opts.seed)
  const weather = opts.weather ?? syntheticWeather(random)
  const cf = correctionFactor(opts.standard ?? 'sae-j1349-1990', weather)
  const noise = (opts.noisePct ?? 0.3) / 100
  const offset = 1 + ((opts.pullOffsetPct ?? 0.3) / 100) * gaussian(random)
  const decimals = opts.decimals ?? 1
  const wotVacuum = opts.wotVacuumInHg ?? 1
  const afr = opts.afr ?? 12.8
  const span = opts.toRpm - opts.fromRpm
  const count = opts.samples ?? Math.floor(span / (opts.stepRpm ?? 10) + 1e-9) + 1
  if (!(span > 0) || !(count >= 2)) throw new RangeError('a synthetic pull needs toRpm above fromRpm and at least 2 samples')
  const step = span / (count - 1)
  const rpmDecimals = Number.isInteger(step) && Number.isInteger(opts.fromRpm) ? 0 : 1
  const round = (v: number, d: number): number => Number(v.toFixed(d))

  const points: PullPoint[] = []
  for (let i = 0; i < count; i++) {
    const rpm = round(opts.fromRpm + i * step, rpmDecimals)
    const torque = (modelTorqueLbFt(opts, rpm) * offset * (1 + noise * gaussian(random))) / cf
    points.push({
      rpm,
      torqueLbFt: round(torque, decimals),
      powerHp: round(powerHp(torque, rpm), decimals),
      vacuumInHg: round(wotVacuum * (rpm / opts.toRpm) ** 2 + 0.05 * gaussian(random), decimals),
      afr: round(afr + 0.1 * gaussian(random), 2),
    })
  }

  const lines = [
    `# baro: ${weather.baroInHg} inHg`,
    `# air temp: ${weather.airTempF} F`,
    `# humidity: ${weather.humidityPct} %`,
    `# note: synthetic pull, invented data (seed ${opts.seed})`,
  ]
  const table = writeCsv([
    ['RPM', 'Torque (lb-ft)', 'Power (hp)', 'Vacuum (inHg)', 'AFR'],
    ...points.map(p => [p.rpm, p.torqueLbFt, p.powerHp, p.vacuumInHg, p.afr]),
  ])
  return { points, weather, csv: `${lines.join('\r\n')}\r\n${table}` }
}
