// The results table as CSV, through shared/dyno's writer (RFC 4180 quoting, formula
// injection guarded). Every figure is rounded as the results table on the page rounds
// it (peaks and rpm whole, averages, gains, vacuum and spread to one decimal; half away
// from zero, from unrounded values), and the header row says so (issue 15 item 8).
import { correctedPulls, reportFixed, rpmGrid, setupCurve, unitScale, valueAt, writeCsv, type CsvCell, type PullPoint } from '../../../shared/dyno/index'
import { ANALYSIS_GRID } from '../../../shared/types/analysis'
import type { StoryData } from '../../../shared/types/story-data'
import type { AnalysisGains, AnalysisResponse } from '../../../shared/types/analysis-results'

const num = (v: number | null | undefined, places = 1): CsvCell => (v === null || v === undefined || !Number.isFinite(v) ? '' : Number(reportFixed(v, places)))
const rpms = (list: readonly number[] | undefined): CsvCell => (list ?? []).map(r => reportFixed(r, 0)).join(' / ')
const flag = (v: boolean | null | undefined): CsvCell => (v === true ? 'within repeatability' : v === false ? 'beyond repeatability' : '')

export const CSV_ROUNDING_NOTE = 'Values rounded as on the page (half away from zero)'

export function analysisCsv(a: AnalysisResponse): string {
  const P = a.units.power
  const T = a.units.torque
  const band = `${reportFixed(a.table.band.fromRpm, 0)}-${reportFixed(a.table.band.toRpm, 0)} rpm`
  const header: CsvCell[] = [
    'Setup', 'Corrected to',
    `Peak power (${P})`, 'Peak power at (rpm)', `Peak torque (${T})`, 'Peak torque at (rpm)',
    `Average power ${band} (${P})`, `Average torque ${band} (${T})`,
    'Power band from (rpm)', 'Power band to (rpm)', 'Idle vacuum (inHg)', 'Pull spread (%)',
  ]
  for (const vs of ['baseline', 'previous']) {
    header.push(
      `Peak power gain vs ${vs} (${P})`, `Peak power gain vs ${vs} (%)`, `Peak torque gain vs ${vs} (${T})`, `Peak torque gain vs ${vs} (%)`,
      `Average power gain vs ${vs} (${P})`, `Average torque gain vs ${vs} (${T})`,
      `Largest power gain vs ${vs} (${P})`, `Largest power gain vs ${vs} at (rpm)`, `Largest power loss vs ${vs} (${P})`, `Largest power loss vs ${vs} at (rpm)`,
      `Torque crossover vs ${vs} (rpm)`, `Idle vacuum change vs ${vs} (inHg)`, `Peak power gain vs ${vs}: repeatability`, `Average power gain vs ${vs}: repeatability`,
    )
  }
  header.push(CSV_ROUNDING_NOTE)
  const gains = (g: AnalysisGains | null): CsvCell[] => [
    num(g?.peakPower), num(g?.peakPowerPct), num(g?.peakTorque), num(g?.peakTorquePct),
    num(g?.averagePower), num(g?.averageTorque),
    num(g?.largestGain.power.value), num(g?.largestGain.power.rpm, 0), num(g?.largestLoss.power.value), num(g?.largestLoss.power.rpm, 0),
    rpms(g?.crossovers.torqueRpm), num(g?.idleVacuumInHg), flag(g?.withinRepeatability.peakPower), flag(g?.withinRepeatability.averagePower),
  ]
  const rows = a.table.rows.map(r => [
    r.label, a.standardLabel,
    num(r.peakPower.value, 0), num(r.peakPower.rpm, 0), num(r.peakTorque.value, 0), num(r.peakTorque.rpm, 0),
    num(r.averagePower), num(r.averageTorque),
    num(r.powerBand.fromRpm, 0), num(r.powerBand.toRpm, 0), num(r.idleVacuumInHg), num(r.spreadPct),
    ...gains(r.vsBaseline), ...gains(r.vsPrevious),
  ])
  return writeCsv([header, ...rows])
}

/**
 * "Download the data" of a story, from its edition: what a reader needs to redo the
 * analysis. Sections one after another, each under a title row: the standard and
 * units, every included pull with its weather and correction factor, each setup's
 * averaged curve on the 100 rpm grid, each pull corrected on the same grid, and the
 * results table. Built by the same pipeline functions the figures come from.
 */
export function storyDataCsv(data: StoryData, a: AnalysisResponse): string {
  const standard = a.standard
  const scale = unitScale(a.units.id)
  const step = ANALYSIS_GRID.compareStepRpm
  const P = a.units.power
  const T = a.units.torque
  const shown = data.bench.setups.filter(s => a.setups.some(x => x.setupId === s.setupId))
  const rows: CsvCell[][] = [
    ['Story data', data.benchTest.title],
    ['Corrected to', a.standardLabel],
    ['Units', `${P} and ${T}`],
    [],
    ['Pulls'],
    ['Setup', 'Pull', 'File', 'Barometer (inHg)', 'Air temperature (F)', 'Humidity (%)', 'Corrected by the dyno', 'Correction factor'],
  ]
  const perSetup = shown.map((s) => {
    const pulls = correctedPulls(s, standard)
    return { setup: s, pulls, average: setupCurve(pulls.map(p => p.points)).points }
  })
  for (const { setup, pulls } of perSetup) {
    for (const { pull, factor } of pulls) {
      rows.push([setup.label, pull.number, pull.fileName, pull.weather?.baroInHg, pull.weather?.airTempF, pull.weather?.humidityPct, pull.dynoCorrected ? 'yes' : 'no', num(factor, 4)])
    }
  }
  const gridOf = (curves: PullPoint[][]): number[] => {
    const lo = Math.min(...curves.map(c => c[0]?.rpm ?? Infinity))
    const hi = Math.max(...curves.map(c => c.at(-1)?.rpm ?? -Infinity))
    return Number.isFinite(lo) && Number.isFinite(hi) ? rpmGrid(step, lo, hi) : []
  }
  const section = (title: string, named: { name: string, points: PullPoint[] }[]) => {
    rows.push([], [title], ['rpm', ...named.flatMap(n => [`${n.name} power (${P})`, `${n.name} torque (${T})`])])
    for (const rpm of gridOf(named.map(n => n.points))) {
      rows.push([rpm, ...named.flatMap((n) => {
        const power = valueAt(n.points, rpm, 'powerHp')
        const torque = valueAt(n.points, rpm, 'torqueLbFt')
        return [power === undefined ? '' : num(power * scale.power, 2), torque === undefined ? '' : num(torque * scale.torque, 2)]
      })])
    }
  }
  section(`Averaged curves, every ${step} rpm`, perSetup.map(p => ({ name: p.setup.label, points: p.average })))
  section(`Each pull corrected, every ${step} rpm`, perSetup.flatMap(p => p.pulls.map(x => ({ name: `${p.setup.label} pull ${x.pull.number}`, points: x.points }))))
  rows.push([], ['Results'])
  return writeCsv(rows) + analysisCsv(a)
}
