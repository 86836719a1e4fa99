// The results table of a story: one row per setup, each against the baseline (the
// first setup) and against the setup before it. Averages are taken over the band
// every setup covers, so the averages and their gains in one table agree.

import type { AtRpm, PullPoint, RpmRange } from './types'
import { averageOver, peakOf, powerBand } from './band'
import { DEFAULT_STEP_RPM, comparePulls, sharedRange } from './compare'
import { withinRepeatability } from './repeat'
import { reportFixed } from './round'
import { writeCsv, type CsvCell } from './csv-write'

export type SetupResult = {
  name: string
  /** The setup's curve: usually averagePulls(...).points, corrected. */
  points: readonly PullPoint[]
  /** Spread of its repeat pulls, percent (averagePulls' spreadPct); absent for a single pull. */
  spreadPct?: number
  /** Measured at idle by the operator; passed through. */
  idleVacuumInHg?: number
}

export type RowGains = {
  peakPowerHp: number
  peakPowerPct: number
  peakTorqueLbFt: number
  peakTorquePct: number
  averagePowerHp: number
  averagePowerPct: number
  averageTorqueLbFt: number
  averageTorquePct: number
  maxGain: { powerHp: AtRpm, torqueLbFt: AtRpm }
  maxLoss: { powerHp: AtRpm, torqueLbFt: AtRpm }
  crossovers: { powerRpm: number[], torqueRpm: number[] }
  /** Change of idle vacuum, inHg, when both setups have one. */
  idleVacuumInHg?: number
  /** Gains no bigger than the larger spread of the two setups' pulls; null when neither has a spread. */
  withinRepeatability: { peakPower: boolean | null, peakTorque: boolean | null, averagePower: boolean | null, averageTorque: boolean | null }
}

export type ResultsRow = {
  name: string
  peakPowerHp: AtRpm
  peakTorqueLbFt: AtRpm
  averagePowerHp: number
  averageTorqueLbFt: number
  powerBand: RpmRange
  spreadPct?: number
  idleVacuumInHg?: number
  vsBaseline?: RowGains
  vsPrevious?: RowGains
}

export type ResultsTable = { band: RpmRange, rows: ResultsRow[] }

function gains(a: SetupResult, rowA: ResultsRow, b: SetupResult, rowB: ResultsRow, stepRpm: number): RowGains {
  const cmp = comparePulls(a.points, b.points, { stepRpm })
  const pct = (gain: number, base: number): number => (gain / base) * 100
  const spreadA = a.spreadPct
  const spreadB = b.spreadPct
  const peakPowerHp = rowB.peakPowerHp.value - rowA.peakPowerHp.value
  const peakTorqueLbFt = rowB.peakTorqueLbFt.value - rowA.peakTorqueLbFt.value
  const averagePowerHp = rowB.averagePowerHp - rowA.averagePowerHp
  const averageTorqueLbFt = rowB.averageTorqueLbFt - rowA.averageTorqueLbFt
  const out: RowGains = {
    peakPowerHp,
    peakPowerPct: pct(peakPowerHp, rowA.peakPowerHp.value),
    peakTorqueLbFt,
    peakTorquePct: pct(peakTorqueLbFt, rowA.peakTorqueLbFt.value),
    averagePowerHp,
    averagePowerPct: pct(averagePowerHp, rowA.averagePowerHp),
    averageTorqueLbFt,
    averageTorquePct: pct(averageTorqueLbFt, rowA.averageTorqueLbFt),
    maxGain: cmp.maxGain,
    maxLoss: cmp.maxLoss,
    crossovers: cmp.crossovers,
    withinRepeatability: {
      peakPower: withinRepeatability(pct(peakPowerHp, rowA.peakPowerHp.value), spreadA, spreadB),
      peakTorque: withinRepeatability(pct(peakTorqueLbFt, rowA.peakTorqueLbFt.value), spreadA, spreadB),
      averagePower: withinRepeatability(pct(averagePowerHp, rowA.averagePowerHp), spreadA, spreadB),
      averageTorque: withinRepeatability(pct(averageTorqueLbFt, rowA.averageTorqueLbFt), spreadA, spreadB),
    },
  }
  if (a.idleVacuumInHg !== undefined && b.idleVacuumInHg !== undefined) out.idleVacuumInHg = b.idleVacuumInHg - a.idleVacuumInHg
  return out
}

/** Rows for N setups, the first being the baseline. */
export function resultsTable(
  setups: readonly SetupResult[],
  opts: { stepRpm?: number, fractionOfPeak?: number } = {},
): ResultsTable {
  if (setups.length === 0) throw new RangeError('a results table needs at least one setup')
  const stepRpm = opts.stepRpm ?? DEFAULT_STEP_RPM
  const band = sharedRange(setups.map(s => s.points))
  const rows: ResultsRow[] = setups.map((s) => {
    const row: ResultsRow = {
      name: s.name,
      peakPowerHp: peakOf(s.points, 'powerHp'),
      peakTorqueLbFt: peakOf(s.points, 'torqueLbFt'),
      averagePowerHp: averageOver(s.points, 'powerHp', band.fromRpm, band.toRpm),
      averageTorqueLbFt: averageOver(s.points, 'torqueLbFt', band.fromRpm, band.toRpm),
      powerBand: powerBand(s.points, opts.fractionOfPeak),
    }
    if (s.spreadPct !== undefined) row.spreadPct = s.spreadPct
    if (s.idleVacuumInHg !== undefined) row.idleVacuumInHg = s.idleVacuumInHg
    return row
  })
  const base = setups[0]
  const baseRow = rows[0]
  setups.forEach((s, i) => {
    const row = rows[i]
    const prev = setups[i - 1]
    const prevRow = rows[i - 1]
    if (i === 0 || !row || !base || !baseRow || !prev || !prevRow) return
    row.vsBaseline = gains(base, baseRow, s, row, stepRpm)
    row.vsPrevious = i === 1 ? row.vsBaseline : gains(prev, prevRow, s, row, stepRpm)
  })
  return { band, rows }
}

/** The table as CSV for download: figures to one decimal, rpm whole, crossovers joined by " / ". */
export function resultsTableCsv(table: ResultsTable, opts: { decimals?: number } = {}): string {
  const d = opts.decimals ?? 1
  const num = (v: number | undefined, places = d): CsvCell => (v === undefined || !Number.isFinite(v) ? '' : Number(reportFixed(v, places)))
  const flag = (v: boolean | null | undefined): CsvCell => (v === true ? 'within repeatability' : v === false ? 'beyond repeatability' : '')
  const rpms = (list: number[] | undefined): CsvCell => (list ?? []).map(r => reportFixed(r, 0)).join(' / ')
  const band = `${reportFixed(table.band.fromRpm, 0)}-${reportFixed(table.band.toRpm, 0)} rpm`
  const header: CsvCell[] = [
    'Setup',
    'Peak power (hp)', 'Peak power at (rpm)', 'Peak torque (lb-ft)', 'Peak torque at (rpm)',
    `Average power ${band} (hp)`, `Average torque ${band} (lb-ft)`,
    'Power band from (rpm)', 'Power band to (rpm)', 'Idle vacuum (inHg)', 'Pull spread (%)',
  ]
  for (const vs of ['baseline', 'previous']) {
    header.push(
      `Peak power gain vs ${vs} (hp)`, `Peak power gain vs ${vs} (%)`, `Peak torque gain vs ${vs} (lb-ft)`,
      `Average power gain vs ${vs} (hp)`, `Average torque gain vs ${vs} (lb-ft)`,
      `Torque crossover vs ${vs} (rpm)`, `Peak power gain vs ${vs}: repeatability`,
    )
  }
  const body = table.rows.map((r) => {
    const cells: CsvCell[] = [
      r.name,
      num(r.peakPowerHp.value), num(r.peakPowerHp.rpm, 0), num(r.peakTorqueLbFt.value), num(r.peakTorqueLbFt.rpm, 0),
      num(r.averagePowerHp), num(r.averageTorqueLbFt),
      num(r.powerBand.fromRpm, 0), num(r.powerBand.toRpm, 0), num(r.idleVacuumInHg), num(r.spreadPct),
    ]
    for (const g of [r.vsBaseline, r.vsPrevious]) {
      cells.push(
        num(g?.peakPowerHp), num(g?.peakPowerPct), num(g?.peakTorqueLbFt),
        num(g?.averagePowerHp), num(g?.averageTorqueLbFt),
        rpms(g?.crossovers.torqueRpm), flag(g?.withinRepeatability.peakPower),
      )
    }
    return cells
  })
  return writeCsv([header, ...body])
}
