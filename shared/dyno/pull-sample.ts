// The sample pull file offered beside every place pull files go in: drawn from the
// documented synthetic model (synthetic.ts), so it is invented data and says so, and
// written with writeCsv (formula-safe). Its columns are the import page's examples.
import { writeCsv } from './csv-write'
import { PULL_FILE_COLUMNS, PULL_FILE_WEATHER_LINES, SAMPLE_PULL_WEATHER } from './pull-format'
import { syntheticPull, type TorqueModel } from './synthetic'

// A plausible small-block V8 on a mild cam (invented), pulled 2,500-6,500 rpm every 100 rpm.
const SAMPLE_MODEL: TorqueModel = { peakTorqueLbFt: 430, peakTorqueRpm: 4400, widthLowRpm: 2600, widthHighRpm: 1900 }
const SAMPLE_SEED = 20261204

/** A pull file to copy the shape of: synthetic (invented) data, formula-safe CSV. */
export function samplePullCsv(): string {
  const pull = syntheticPull({ ...SAMPLE_MODEL, seed: SAMPLE_SEED, fromRpm: 2500, toRpm: 6500, stepRpm: 100, weather: SAMPLE_PULL_WEATHER, wotVacuumInHg: 1.2 })
  const lines = [
    ...PULL_FILE_WEATHER_LINES.map(w => w.line),
    '# note: a sample pull file for Pullsheet; synthetic pull, invented data',
  ]
  const table = writeCsv([
    PULL_FILE_COLUMNS.map(c => c.example),
    ...pull.points.map(p => [p.rpm, p.torqueLbFt, p.powerHp, p.vacuumInHg, p.afr]),
  ])
  return `${lines.join('\r\n')}\r\n${table}`
}
