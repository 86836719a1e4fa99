// The results table as CSV, through shared/dyno's writer (RFC 4180 quoting, formula
// injection guarded). Every figure is rounded as the results table on the page rounds
// it (peaks and rpm whole, averages, gains, vacuum and spread to one decimal; half away
// from zero, from unrounded values), and the header row says so (issue 15 item 8).
import { reportFixed, writeCsv, type CsvCell } from '../../shared/dyno/index'
import type { AnalysisGains, AnalysisResponse } from '../../shared/types/workspace'

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
