// Shared shapes of the dyno library. Every quantity carries its unit in its name;
// the library works internally in lb-ft, hp, inHg and deg F, the units the trade
// publishes in, and converts at the edges (csv import, display).

/** One sample of a pull, observed (or corrected, when it came out of applyCorrection). */
export type PullPoint = {
  rpm: number
  torqueLbFt: number
  powerHp: number
  vacuumInHg?: number
  afr?: number
  /** Unrecognised numeric columns of the imported file, by header. Dropped by resampling. */
  extra?: Record<string, number>
}

/** Weather of one pull: barometric (total) pressure, intake air temperature, relative humidity. */
export type Weather = { baroInHg: number, airTempF: number, humidityPct: number }

export type CorrectionStandard = 'sae-j1349-1990' | 'iso-1585' | 'std-60f' | 'din-70020' | 'none'

export type Problem = {
  severity: 'error' | 'warning'
  /** 1-based line of the file */
  line?: number
  /** header of the column, as written in the file */
  column?: string
  message: string
  /** The kind of problem, where lines of one kind are summed up together. */
  code?: string
  /** The line's own figure for the summary (for a disagreement: percent). */
  value?: number
  rpm?: number
  /** Set on a summary of one kind of problem repeated on many lines; `detail` lists them (capped). */
  group?: ProblemGroup
  detail?: Problem[]
}

export type ProblemGroup = { count: number, firstLine: number, lastLine: number, fromRpm?: number, toRpm?: number, typicalValue?: number }

export type AtRpm = { value: number, rpm: number }

export type PeakGain = { baseline: AtRpm, candidate: AtRpm, gain: number, gainPct: number }

export type RpmRange = { fromRpm: number, toRpm: number }

export type TorqueUnit = 'lb-ft' | 'N-m'
export type PowerUnit = 'hp' | 'kW' | 'PS'
export type VacuumUnit = 'inHg' | 'kPa'
