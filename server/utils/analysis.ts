// The analysis of chosen setups: each pull corrected to one standard with its own
// weather, repeat pulls averaged, then shared/dyno's results table. Figures come from
// the full averaged curves; only the curves sent for drawing are thinned (LTTB).
import type { Knex } from 'knex'
import {
  averagePulls, comparePulls, correctionFactor, correctionStandardInfo, downsampleForDisplay, hpToKw, lbFtToNm, repeatSpread, resample, resultsTable,
  type AtRpm, type CorrectionStandard, type PullPoint, type ResultsRow, type RowGains, type Weather,
} from '../../shared/dyno/index'
import { ANALYSIS_GRID, ANALYSIS_UNITS, type AnalysisUnits } from '../../shared/types/analysis'
import type {
  AnalysisGains, AnalysisQueryInput, AnalysisResponse, AnalysisRow, AnalysisSetup, BenchTest, CurvePoint, GainCurve,
} from '../../shared/types/workspace'
import { LruCache } from '#shared/utils/lru-cache'
import { decodePoints } from './pull-points'
import { httpError, invalidField } from './workspace-http'
import { asBool } from './workspace-rows'

type Db = Knex | Knex.Transaction

export const DEFAULT_MAX_POINTS = 400

export interface PullMeta {
  id: number
  setupId: number
  /** 1, 2, 3 ... by upload order within the setup. */
  number: number
  version: number
  included: boolean
  fileName: string
  weather: Weather | null
  dynoCorrected: boolean
  /** Observed peak power of the pull's own samples. */
  peakPower: AtRpm
}

interface PullMetaRow { id: number, setup_id: number, version: number, included: number, file_name: string, baro_inhg: number | null, air_temp_f: number | null, humidity_pct: number | null, dyno_corrected: number, peak_power_hp: number, peak_power_rpm: number }

export function weatherOf(row: { baro_inhg: number | null, air_temp_f: number | null, humidity_pct: number | null }): Weather | null {
  if (row.baro_inhg === null || row.air_temp_f === null || row.humidity_pct === null) return null
  return { baroInHg: Number(row.baro_inhg), airTempF: Number(row.air_temp_f), humidityPct: Number(row.humidity_pct) }
}

/** Every pull of these setups (without points), numbered within its setup. */
export async function loadPullMeta(db: Db, setupIds: readonly number[]): Promise<PullMeta[]> {
  if (setupIds.length === 0) return []
  const rows = await db<PullMetaRow>('pulls').whereIn('setup_id', setupIds).orderBy('id')
    .select('id', 'setup_id', 'version', 'included', 'file_name', 'baro_inhg', 'air_temp_f', 'humidity_pct', 'dyno_corrected', 'peak_power_hp', 'peak_power_rpm')
  const seen = new Map<number, number>()
  return rows.map((r) => {
    const number = (seen.get(r.setup_id) ?? 0) + 1
    seen.set(r.setup_id, number)
    return { id: r.id, setupId: r.setup_id, number, version: r.version, included: asBool(r.included), fileName: r.file_name, weather: weatherOf(r), dynoCorrected: asBool(r.dyno_corrected), peakPower: { value: Number(r.peak_power_hp), rpm: Number(r.peak_power_rpm) } }
  })
}

// Points of a pull never change after import, so the pull id alone is the key. What
// is kept is the pull on the analysis grid (resample at 10 rpm multiples): every figure
// is computed on that grid anyway, resampling it again at the same or coarser multiples
// gives the very same values, and a 20,000-row pull shrinks to a few hundred points.
// Bounded by points held (about 80 bytes each).
const gridCache = new LruCache<PullPoint[]>(1_000_000, points => points.length + 1)

/** Observed points of pulls on the analysis grid, from the cache or the database. */
export async function loadGridPoints(db: Db, ids: readonly number[]): Promise<Map<number, PullPoint[]>> {
  const out = new Map<number, PullPoint[]>()
  const wanted: number[] = []
  for (const id of ids) {
    const hit = gridCache.get(String(id))
    if (hit) out.set(id, hit)
    else wanted.push(id)
  }
  if (wanted.length) {
    const rows = await db('pulls').whereIn('id', wanted).select('id', 'points') as { id: number, points: string }[]
    for (const row of rows) {
      const grid = resample(decodePoints(row.points), ANALYSIS_GRID.curveStepRpm)
      gridCache.set(String(row.id), grid)
      out.set(row.id, grid)
    }
  }
  return out
}

/** The factor a pull is corrected by: 1 when the dyno already corrected it, or for 'none'. */
export function pullFactor(meta: Pick<PullMeta, 'weather' | 'dynoCorrected'>, standard: CorrectionStandard): number {
  if (meta.dynoCorrected || standard === 'none' || !meta.weather) return 1
  return correctionFactor(standard, meta.weather)
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

type Scale = { power: number, torque: number }

function unitScale(units: AnalysisUnits): Scale {
  return units === 'kw-nm' ? { power: hpToKw(1), torque: lbFtToNm(1) } : { power: 1, torque: 1 }
}

const at = (a: AtRpm, k: number): AtRpm => ({ value: a.value * k, rpm: a.rpm })

function toCurve(points: readonly PullPoint[], s: Scale): CurvePoint[] {
  return points.map(p => ({ rpm: p.rpm, torque: p.torqueLbFt * s.torque, power: p.powerHp * s.power }))
}

function toGains(g: RowGains | undefined, s: Scale): AnalysisGains | null {
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

function toRow(row: ResultsRow, setupId: number, isBaseline: boolean, s: Scale): AnalysisRow {
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

// ---------- the analysis ----------

interface LiveSetup { id: number, label: string, position: number, isBaseline: boolean, version: number, idleVacuumInHg: number | null }

async function liveSetups(db: Db, benchTestId: number): Promise<LiveSetup[]> {
  const rows = await db('setups').where('setups.bench_test_id', benchTestId).whereNull('setups.deleted_at')
    .leftJoin('idle_checks', 'idle_checks.setup_id', 'setups.id')
    .groupBy('setups.id')
    .orderBy('setups.position').orderBy('setups.id')
    .select('setups.id', 'setups.label', 'setups.position', 'setups.is_baseline', 'setups.version', db.raw('AVG(idle_checks.vacuum_inhg) AS idle_vacuum')) as { id: number, label: string, position: number, is_baseline: number, version: number, idle_vacuum: number | null }[]
  return rows.map(r => ({ id: r.id, label: r.label, position: r.position, isBaseline: asBool(r.is_baseline), version: r.version, idleVacuumInHg: r.idle_vacuum === null ? null : Number(r.idle_vacuum) }))
}

// Keyed by every version the answer depends on; bounded by entries.
const analysisCache = new LruCache<AnalysisResponse>(200)

/** For benchmarks and tests: forget computed answers, and the decoded points too unless told otherwise. */
export function clearAnalysisCaches(opts: { points?: boolean } = {}): void {
  analysisCache.clear()
  if (opts.points !== false) gridCache.clear()
}

export async function runAnalysis(db: Db, benchTest: BenchTest, query: AnalysisQueryInput): Promise<AnalysisResponse> {
  const live = await liveSetups(db, benchTest.id)
  const byId = new Map(live.map(s => [s.id, s]))
  for (const id of query.setups ?? []) if (!byId.has(id)) invalidField('setups', `Setup ${id} is not a setup of this bench test.`)
  const chosen = query.setups ? live.filter(s => query.setups!.includes(s.id)) : live
  const metas = await loadPullMeta(db, chosen.map(s => s.id))
  const included = metas.filter(m => m.included)
  const withPulls = chosen.filter(s => included.some(m => m.setupId === s.id))
  const notes = chosen.filter(s => !withPulls.includes(s)).map(s => `${s.label} has no included pulls and is left out.`)
  if (withPulls.length === 0) throw httpError(400, 'None of the chosen setups has an included pull yet: import pulls first.')

  if (query.baseline !== undefined && !withPulls.some(s => s.id === query.baseline)) {
    invalidField('baseline', `Setup ${query.baseline} is not among the chosen setups with pulls.`)
  }
  const baseline = withPulls.find(s => s.id === query.baseline) ?? withPulls.find(s => s.isBaseline) ?? withPulls[0]!
  const ordered = [baseline, ...withPulls.filter(s => s !== baseline)]
  const standard = query.standard ?? benchTest.defaultStandard
  const unitsId = query.units ?? 'hp-lbft'
  const maxPoints = query.maxPoints ?? DEFAULT_MAX_POINTS

  // Everything the answer depends on: the question, the chosen setups as they are now
  // (label, version, order, baseline, idle vacuum) and every pull's version and inclusion.
  const key = JSON.stringify([benchTest.id, benchTest.version, standard, unitsId, maxPoints, baseline.id, chosen, metas.map(m => [m.id, m.version, m.included, m.setupId])])
  const cached = analysisCache.get(key)
  if (cached) return cached

  const points = await loadGridPoints(db, included.map(m => m.id))
  const scale = unitScale(unitsId)
  const curves = new Map<number, SetupCurve>()
  const setups: AnalysisSetup[] = ordered.map((s) => {
    const pulls = included.filter(m => m.setupId === s.id)
    let factors: number[]
    try { factors = pulls.map(m => pullFactor(m, standard)) }
    catch (e) { throw httpError(400, `${s.label}: a pull's weather cannot be corrected (${(e as Error).message}).`) }
    const corrected = pulls.map((m, i) => scalePoints(points.get(m.id) ?? [], factors[i]!))
    let curve: SetupCurve
    try { curve = setupCurve(corrected) }
    catch (e) { throw httpError(400, `${s.label}: its pulls cannot be averaged (${(e as Error).message}).`) }
    curves.set(s.id, curve)
    const outlier = curve.outlier && curve.outlier.beyondRepeatability ? pulls[curve.outlier.index]?.id ?? null : null
    const first = curve.points[0]
    const last = curve.points[curve.points.length - 1]
    return {
      setupId: s.id,
      label: s.label,
      position: s.position,
      isBaseline: s === baseline,
      pulls: pulls.map((m, i) => ({
        pullId: m.id, number: m.number, fileName: m.fileName, weather: m.weather, dynoCorrected: m.dynoCorrected, factor: factors[i]!,
        peakPower: at(m.peakPower, factors[i]! * scale.power),
      })),
      spreadPct: curve.spreadPct ?? null,
      outlierPullId: outlier,
      idleVacuumInHg: s.idleVacuumInHg,
      rpmFrom: first?.rpm ?? 0,
      rpmTo: last?.rpm ?? 0,
      curve: toCurve(downsampleForDisplay(curve.points, maxPoints), scale),
    }
  })

  let table: ReturnType<typeof resultsTable>
  try {
    table = resultsTable(ordered.map(s => ({
      name: s.label,
      points: curves.get(s.id)!.points,
      ...(curves.get(s.id)!.spreadPct !== undefined ? { spreadPct: curves.get(s.id)!.spreadPct } : {}),
      ...(s.idleVacuumInHg !== null ? { idleVacuumInHg: s.idleVacuumInHg } : {}),
    })), { stepRpm: ANALYSIS_GRID.compareStepRpm })
  }
  catch (e) { throw httpError(400, `The chosen setups cannot be compared: ${(e as Error).message}.`) }

  const baseCurve = curves.get(baseline.id)!.points
  const gains: GainCurve[] = ordered.slice(1).map(s => ({
    setupId: s.id,
    againstSetupId: baseline.id,
    curve: comparePulls(baseCurve, curves.get(s.id)!.points, { stepRpm: ANALYSIS_GRID.compareStepRpm }).byRpm
      .map(r => ({ rpm: r.rpm, torque: r.gain.torqueLbFt * scale.torque, power: r.gain.powerHp * scale.power })),
  }))

  const unitInfo = ANALYSIS_UNITS.find(u => u.id === unitsId)!
  const response: AnalysisResponse = {
    benchTestId: benchTest.id,
    standard,
    standardLabel: correctionStandardInfo(standard).label,
    units: { id: unitsId, power: unitInfo.power, torque: unitInfo.torque },
    baselineSetupId: baseline.id,
    setups,
    gains,
    table: { band: table.band, rows: table.rows.map((row, i) => toRow(row, ordered[i]!.id, i === 0, scale)) },
    notes,
  }
  analysisCache.set(key, response)
  return response
}
