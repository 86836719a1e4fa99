// The one analysis pipeline: from stored pulls (points on the analysis grid, weather)
// to what every page shows. Each included pull is corrected to the standard with its
// own weather, a setup's repeat pulls are averaged, the results table and the gains
// come from those full curves, and only the copy sent for drawing is thinned and
// rounded. The workspace's analysis, the story editor's preview, the desk, preview
// links and the reader's page all call analyseBench, so they cannot disagree.
// Sources of the formulas: shared/dyno/README.md.
import { ANALYSIS_GRID, ANALYSIS_UNITS, type AnalysisUnits } from '../types/analysis'
import type { AnalysisGains, AnalysisResponse, AnalysisRow, AnalysisSetup, CurvePoint, GainCurve } from '../types/analysis-results'
import { comparePulls, averagePulls } from './compare'
import { correctionFactor, correctionStandardInfo } from './correction'
import { downsampleForDisplay } from './display'
import { repeatSpread } from './repeat'
import { resultsTable, type ResultsRow, type RowGains } from './table'
import type { AtRpm, CorrectionStandard, PullPoint, Weather } from './types'
import { unitScale, type UnitScale } from './unit-scale'

export { interpolateAt } from './interpolate'
// Unit scaling lives apart so the reader's page can scale curves without this module's imports.
export { scaleCurve, unitScale, type UnitScale } from './unit-scale'

/** One included pull as stored: its points on the analysis grid (ANALYSIS_GRID.curveStepRpm). */
export interface BenchPull {
  pullId: number
  /** 1, 2, 3 ... by upload order within the setup. */
  number: number
  fileName: string
  weather: Weather | null
  dynoCorrected: boolean
  /** Observed peak power of the pull's own samples. */
  peakPower: AtRpm
  points: PullPoint[]
}

export interface BenchSetup {
  setupId: number
  label: string
  position: number
  /** The bench test's own baseline flag. */
  isBaseline: boolean
  idleVacuumInHg: number | null
  /** Included pulls only; a setup without any is left out with a note. */
  pulls: BenchPull[]
}

/** Everything an analysis is computed from: plain data, serialisable (a story's edition holds one). */
export interface BenchData {
  benchTestId: number
  defaultStandard: CorrectionStandard
  /** In the bench test's order. */
  setups: BenchSetup[]
}

export interface AnalyseOptions {
  standard?: CorrectionStandard
  units?: AnalysisUnits
  /** Setup the gains are taken against; default the flagged baseline, else the first with pulls. */
  baseline?: number
  /** Points per drawn curve (LTTB). */
  maxPoints?: number
  /**
   * 'baseline': gain curves of each setup against the baseline (the workspace);
   * 'all': every ordered pair, with its gains (stories, where any pair may be compared).
   */
  pairs?: 'baseline' | 'all'
}

/** Gains of one ordered pair of setups (setup minus vs), from the full corrected curves. */
export interface PairGains { setupId: number, vsSetupId: number, gains: AnalysisGains }

export interface BenchAnalysis extends AnalysisResponse {
  /** Only with pairs 'all': every ordered pair's gains. */
  comparisons: PairGains[]
}

/** Data that cannot be analysed (no pulls, weather out of range ...); the message is fit to show. */
export class AnalysisInputError extends Error {}

export const DEFAULT_MAX_POINTS = 400
/** Drawn curves carry two decimals: far below the 0.1 a readout shows, and pages stay light. */
export const DRAWN_CURVE_PLACES = 2

/** The factor a pull is corrected by: 1 when the dyno already corrected it, or for 'none'. */
export function pullFactor(pull: Pick<BenchPull, 'weather' | 'dynoCorrected'>, standard: CorrectionStandard): number {
  if (pull.dynoCorrected || standard === 'none' || !pull.weather) return 1
  return correctionFactor(standard, pull.weather)
}

export function scalePoints(points: readonly PullPoint[], factor: number): PullPoint[] {
  return points.map(p => ({ ...p, torqueLbFt: p.torqueLbFt * factor, powerHp: p.powerHp * factor }))
}

export interface SetupCurve {
  points: PullPoint[]
  spreadPct?: number
  rpmOfLargestSpread?: number
  outlier: { index: number, deviationPct: number, beyondRepeatability: boolean } | null
}

/** Mean of a setup's corrected pulls on the fine grid; spread and outlier at 100 rpm steps. */
export function setupCurve(pulls: readonly (readonly PullPoint[])[]): SetupCurve {
  const { points } = averagePulls(pulls, ANALYSIS_GRID.curveStepRpm)
  if (pulls.length < 2) return { points, outlier: null }
  const spread = repeatSpread(pulls, ANALYSIS_GRID.compareStepRpm)
  return { points, spreadPct: spread.spreadPct, rpmOfLargestSpread: spread.rpmOfLargestSpread, outlier: spread.outlier }
}

// ---------- units ----------

const at = (a: AtRpm, k: number): AtRpm => ({ value: a.value * k, rpm: a.rpm })

function roundTo(value: number, places: number): number {
  const scale = 10 ** places
  return Math.round(value * scale) / scale
}

function drawnCurve(points: readonly PullPoint[], s: UnitScale, places: number): CurvePoint[] {
  return points.map(p => ({ rpm: p.rpm, torque: roundTo(p.torqueLbFt * s.torque, places), power: roundTo(p.powerHp * s.power, places) }))
}

function toGains(g: RowGains | undefined, s: UnitScale): AnalysisGains | null {
  if (!g) return null
  return {
    peakPower: g.peakPowerHp * s.power,
    peakPowerPct: g.peakPowerPct,
    peakTorque: g.peakTorqueLbFt * s.torque,
    peakTorquePct: g.peakTorquePct,
    averagePower: g.averagePowerHp * s.power,
    averagePowerPct: g.averagePowerPct,
    averageTorque: g.averageTorqueLbFt * s.torque,
    averageTorquePct: g.averageTorquePct,
    largestGain: { power: at(g.maxGain.powerHp, s.power), torque: at(g.maxGain.torqueLbFt, s.torque) },
    largestLoss: { power: at(g.maxLoss.powerHp, s.power), torque: at(g.maxLoss.torqueLbFt, s.torque) },
    crossovers: g.crossovers,
    idleVacuumInHg: g.idleVacuumInHg ?? null,
    withinRepeatability: g.withinRepeatability,
  }
}

function toRow(row: ResultsRow, setupId: number, isBaseline: boolean, s: UnitScale): AnalysisRow {
  return {
    setupId,
    label: row.name,
    isBaseline,
    peakPower: at(row.peakPowerHp, s.power),
    peakTorque: at(row.peakTorqueLbFt, s.torque),
    averagePower: row.averagePowerHp * s.power,
    averageTorque: row.averageTorqueLbFt * s.torque,
    powerBand: row.powerBand,
    spreadPct: row.spreadPct ?? null,
    idleVacuumInHg: row.idleVacuumInHg ?? null,
    vsBaseline: toGains(row.vsBaseline, s),
    vsPrevious: toGains(row.vsPrevious, s),
  }
}

/** Each included pull of a setup corrected to the standard (the curves the average is made of). */
export function correctedPulls(setup: BenchSetup, standard: CorrectionStandard): { pull: BenchPull, factor: number, points: PullPoint[] }[] {
  return setup.pulls.map((pull) => {
    let factor: number
    try { factor = pullFactor(pull, standard) }
    catch (e) { throw new AnalysisInputError(`${setup.label}: a pull's weather cannot be corrected (${(e as Error).message}).`) }
    return { pull, factor, points: scalePoints(pull.points, factor) }
  })
}

function tableOf(ordered: readonly BenchSetup[], curves: ReadonlyMap<number, SetupCurve>) {
  try {
    return resultsTable(ordered.map((s) => {
      const c = curves.get(s.setupId)!
      return {
        name: s.label,
        points: c.points,
        ...(c.spreadPct !== undefined ? { spreadPct: c.spreadPct } : {}),
        ...(s.idleVacuumInHg !== null ? { idleVacuumInHg: s.idleVacuumInHg } : {}),
      }
    }), { stepRpm: ANALYSIS_GRID.compareStepRpm })
  }
  catch (e) { throw new AnalysisInputError(`The chosen setups cannot be compared: ${(e as Error).message}.`) }
}

function gainCurve(vs: SetupCurve, setup: SetupCurve, s: UnitScale): CurvePoint[] {
  return comparePulls(vs.points, setup.points, { stepRpm: ANALYSIS_GRID.compareStepRpm }).byRpm
    .map(r => ({ rpm: r.rpm, torque: roundTo(r.gain.torqueLbFt * s.torque, DRAWN_CURVE_PLACES), power: roundTo(r.gain.powerHp * s.power, DRAWN_CURVE_PLACES) }))
}

/** The analysis of these setups: curves, results table, gains. Throws AnalysisInputError for data it cannot use. */
export function analyseBench(data: BenchData, opts: AnalyseOptions = {}): BenchAnalysis {
  const withPulls = data.setups.filter(s => s.pulls.length > 0)
  const notes = data.setups.filter(s => s.pulls.length === 0).map(s => `${s.label} has no included pulls and is left out.`)
  if (withPulls.length === 0) throw new AnalysisInputError('None of the chosen setups has an included pull yet: import pulls first.')
  if (opts.baseline !== undefined && !withPulls.some(s => s.setupId === opts.baseline)) {
    throw new AnalysisInputError(`Setup ${opts.baseline} is not among the chosen setups with pulls.`)
  }
  const baseline = withPulls.find(s => s.setupId === opts.baseline) ?? withPulls.find(s => s.isBaseline) ?? withPulls[0]!
  const ordered = [baseline, ...withPulls.filter(s => s !== baseline)]
  const standard = opts.standard ?? data.defaultStandard
  const unitsId = opts.units ?? 'hp-lbft'
  const maxPoints = opts.maxPoints ?? DEFAULT_MAX_POINTS
  const scale = unitScale(unitsId)

  const curves = new Map<number, SetupCurve>()
  const setups: AnalysisSetup[] = ordered.map((s) => {
    const corrected = correctedPulls(s, standard)
    let curve: SetupCurve
    try { curve = setupCurve(corrected.map(c => c.points)) }
    catch (e) { throw new AnalysisInputError(`${s.label}: its pulls cannot be averaged (${(e as Error).message}).`) }
    curves.set(s.setupId, curve)
    const outlier = curve.outlier && curve.outlier.beyondRepeatability ? s.pulls[curve.outlier.index]?.pullId ?? null : null
    const first = curve.points[0]
    const last = curve.points[curve.points.length - 1]
    return {
      setupId: s.setupId,
      label: s.label,
      position: s.position,
      isBaseline: s === baseline,
      pulls: corrected.map(({ pull, factor }) => ({
        pullId: pull.pullId, number: pull.number, fileName: pull.fileName, weather: pull.weather, dynoCorrected: pull.dynoCorrected, factor,
        peakPower: at(pull.peakPower, factor * scale.power),
      })),
      spreadPct: curve.spreadPct ?? null,
      outlierPullId: outlier,
      idleVacuumInHg: s.idleVacuumInHg,
      rpmFrom: first?.rpm ?? 0,
      rpmTo: last?.rpm ?? 0,
      curve: drawnCurve(downsampleForDisplay(curve.points, maxPoints), scale, DRAWN_CURVE_PLACES),
    }
  })

  const table = tableOf(ordered, curves)
  const pairs: [BenchSetup, BenchSetup][] = opts.pairs === 'all'
    ? ordered.flatMap(a => ordered.filter(b => b !== a).map(b => [a, b] as [BenchSetup, BenchSetup]))
    : ordered.slice(1).map(s => [s, baseline])
  const gains: GainCurve[] = pairs.map(([s, vs]) => ({ setupId: s.setupId, againstSetupId: vs.setupId, curve: gainCurve(curves.get(vs.setupId)!, curves.get(s.setupId)!, scale) }))

  // Gains against any setup: the results table again with that setup first. The shared
  // band (and so every average) is the same whichever setup leads.
  const comparisons: PairGains[] = []
  if (opts.pairs === 'all') {
    for (const vs of ordered) {
      const rows = vs === baseline ? table.rows : tableOf([vs, ...ordered.filter(s => s !== vs)], curves).rows
      const order = vs === baseline ? ordered : [vs, ...ordered.filter(s => s !== vs)]
      rows.forEach((row, i) => {
        const g = toGains(row.vsBaseline, scale)
        if (i > 0 && g) comparisons.push({ setupId: order[i]!.setupId, vsSetupId: vs.setupId, gains: g })
      })
    }
  }

  const unitInfo = ANALYSIS_UNITS.find(u => u.id === unitsId)!
  return {
    benchTestId: data.benchTestId,
    standard,
    standardLabel: correctionStandardInfo(standard).label,
    units: { id: unitsId, power: unitInfo.power, torque: unitInfo.torque },
    baselineSetupId: baseline.setupId,
    setups,
    gains,
    table: { band: table.band, rows: table.rows.map((row, i) => toRow(row, ordered[i]!.setupId, i === 0, scale)) },
    notes,
    comparisons,
  }
}
