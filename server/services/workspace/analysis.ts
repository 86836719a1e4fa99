// The live data of a bench test's setups, loaded for shared/dyno's one analysis
// pipeline (analyse.ts): setups as they are now, included pulls with their points on
// the analysis grid. Answers are kept per process, keyed by every version they hang on.
import type { Db } from '../../utils/db'
import {
  AnalysisInputError, analyseBench, resample,
  type AnalyseOptions, type AtRpm, type BenchAnalysis, type BenchData, type PullPoint, type Weather,
} from '../../../shared/dyno/index'
import { ANALYSIS_GRID } from '../../../shared/types/analysis'
import type { AnalysisQueryInput, AnalysisResponse } from '../../../shared/types/analysis-results'
import type { BenchTest } from '../../../shared/types/bench-tests'
import { LruCache } from '#shared/utils/lru-cache'
import { decodePoints } from './pull-points'
import { httpError, invalidField } from '../../utils/http-errors'
import { asBool } from '../../utils/rows'

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

/**
 * The bench data of these live setups (in the bench test's order) with each included
 * pull's grid points, and a key that changes whenever anything it holds changes.
 */
export async function loadBenchData(db: Db, benchTest: Pick<BenchTest, 'id' | 'version' | 'defaultStandard'>, setupIds?: readonly number[]): Promise<{ data: BenchData, key: string }> {
  const live = await liveSetups(db, benchTest.id)
  const byId = new Map(live.map(s => [s.id, s]))
  for (const id of setupIds ?? []) if (!byId.has(id)) invalidField('setups', `Setup ${id} is not a setup of this bench test.`)
  const chosen = setupIds ? live.filter(s => setupIds.includes(s.id)) : live
  const metas = await loadPullMeta(db, chosen.map(s => s.id))
  const included = metas.filter(m => m.included)
  const points = await loadGridPoints(db, included.map(m => m.id))
  // Everything the data depends on: the chosen setups as they are now (label, version,
  // order, baseline, idle vacuum) and every pull's version and inclusion.
  const key = JSON.stringify([benchTest.id, benchTest.version, benchTest.defaultStandard, chosen, metas.map(m => [m.id, m.version, m.included, m.setupId])])
  const data: BenchData = {
    benchTestId: benchTest.id,
    defaultStandard: benchTest.defaultStandard,
    setups: chosen.map(s => ({
      setupId: s.id,
      label: s.label,
      position: s.position,
      isBaseline: s.isBaseline,
      idleVacuumInHg: s.idleVacuumInHg,
      pulls: included.filter(m => m.setupId === s.id).map(m => ({
        pullId: m.id, number: m.number, fileName: m.fileName, weather: m.weather, dynoCorrected: m.dynoCorrected, peakPower: m.peakPower,
        points: points.get(m.id) ?? [],
      })),
    })),
  }
  return { data, key }
}

/** shared/dyno's analysis of the data, its refusals as 400s. */
export function analyseOrRefuse(data: BenchData, opts: AnalyseOptions): BenchAnalysis {
  try { return analyseBench(data, opts) }
  catch (e) {
    if (e instanceof AnalysisInputError) throw httpError(400, e.message)
    throw e
  }
}

export async function runAnalysis(db: Db, benchTest: BenchTest, query: AnalysisQueryInput): Promise<AnalysisResponse> {
  const { data, key: dataKey } = await loadBenchData(db, benchTest, query.setups)
  if (query.baseline !== undefined && !data.setups.some(s => s.setupId === query.baseline && s.pulls.length)) {
    invalidField('baseline', `Setup ${query.baseline} is not among the chosen setups with pulls.`)
  }
  const key = JSON.stringify([dataKey, query.standard, query.units, query.maxPoints, query.baseline])
  const cached = analysisCache.get(key)
  if (cached) return cached
  const { comparisons: _none, ...response } = analyseOrRefuse(data, {
    standard: query.standard, units: query.units, maxPoints: query.maxPoints, baseline: query.baseline, pairs: 'baseline',
  })
  analysisCache.set(key, response)
  return response
}
