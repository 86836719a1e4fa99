// The pull file Pullsheet reads, described for the people who make one: the columns
// with the header names and units parsePullCsv (csv.ts) recognises, the weather lines,
// and the sample file's name and weather (the file: pull-sample.ts). The unit
// tests parse every example header and the sample with parsePullCsv, so this page of
// help cannot drift from the parser.
// Constants only: the import page's bundle takes no computation from here; the sample
// file itself is made by pull-sample.ts.
import type { Weather } from './types'

export interface PullFileColumn {
  /** What the column holds, in the trade's words. */
  name: string
  /** A header the parser reads as this column, as it would appear in a file. */
  example: string
  /** Units accepted in the header's brackets; the first is the one assumed when none is written. */
  units: string[]
  need: 'required' | 'one of the two' | 'optional'
  note?: string
}

export const PULL_FILE_COLUMNS: readonly PullFileColumn[] = [
  { name: 'Engine speed', example: 'RPM', units: ['rpm'], need: 'required', note: 'Also "Engine speed (rpm)". Rows in any order; at least 10 rows over 1,000 rpm or more.' },
  { name: 'Torque', example: 'Torque (lb-ft)', units: ['lb-ft', 'ft-lb', 'N-m'], need: 'one of the two', note: 'Observed (uncorrected) unless the file is marked as corrected by the dyno.' },
  { name: 'Power', example: 'Power (hp)', units: ['hp', 'kW', 'PS'], need: 'one of the two', note: 'With both columns, each row is checked against hp = lb-ft × rpm ÷ 5,252.' },
  { name: 'Manifold vacuum', example: 'Vacuum (inHg)', units: ['inHg', 'kPa'], need: 'optional' },
  { name: 'Air-fuel ratio', example: 'AFR', units: [], need: 'optional' },
]

// The sample file's day: a plausible test cell, invented.
export const SAMPLE_PULL_WEATHER: Weather = { baroInHg: 29.42, airTempF: 77, humidityPct: 38 }

export const PULL_FILE_WEATHER_LINES: readonly { line: string, units: string }[] = [
  { line: `# baro: ${SAMPLE_PULL_WEATHER.baroInHg} inHg`, units: 'inHg, kPa or mbar' },
  { line: `# air temp: ${SAMPLE_PULL_WEATHER.airTempF} F`, units: 'F or C' },
  { line: `# humidity: ${SAMPLE_PULL_WEATHER.humidityPct} %`, units: '%' },
]

export const PULL_FILE_RULES: readonly string[] = [
  'Comma, semicolon or tab between values; with semicolons or tabs a decimal comma is read too.',
  'Column names in any case, the unit in brackets; other columns are kept as extra channels.',
  'Weather lines before the header are optional: the weather can also be typed in after the check.',
]

export const SAMPLE_PULL_FILE_NAME = 'pullsheet-sample-pull.csv'
