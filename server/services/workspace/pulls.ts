// Pulls of a bench test: listing with repeatability per setup, one pull with its
// points or its original file, and the writer's changes (exclude with a reason,
// weather, move to another setup), each with the version read.
import type { Db } from '../../utils/db'
import { REPEATABILITY_PCT, assertWeather, pullFactor, scalePoints, setupCurve, type CorrectionStandard, type PowerUnit, type Problem, type TorqueUnit, type VacuumUnit } from '../../../shared/dyno/index'
import type { PullDetail, PullList, PullSummary, SetupRepeatability, UpdatePullInput } from '../../../shared/types/pulls'
import { loadGridPoints, weatherOf, loadPullMeta } from './analysis'
import { decodePoints } from './pull-points'
import { bumpLiveMark } from './live-marks'
import { httpError, invalidField, missing, staleVersion } from '../../utils/http-errors'
import { asBool, isoTimeRequired, parseJsonColumn } from '../../utils/rows'

interface PullRow {
  id: number
  bench_test_id: number
  setup_id: number
  file_name: string
  uploaded_at: Date | string
  uploaded_by_user_id: number | null
  uploader_name: string | null
  operator_link_id: number | null
  link_label: string | null
  baro_inhg: number | null
  air_temp_f: number | null
  humidity_pct: number | null
  dyno_corrected: number
  included: number
  exclusion_reason: string
  problems: string
  torque_unit: string | null
  power_unit: string | null
  vacuum_unit: string | null
  row_count: number
  point_count: number
  rpm_from: number
  rpm_to: number
  peak_power_hp: number
  peak_power_rpm: number
  peak_torque_lbft: number
  peak_torque_rpm: number
  version: number
  pull_number: number
}

const SUMMARY_COLUMNS = [
  'pulls.id', 'pulls.bench_test_id', 'pulls.setup_id', 'pulls.file_name', 'pulls.uploaded_at', 'pulls.uploaded_by_user_id', 'pulls.operator_link_id',
  'pulls.baro_inhg', 'pulls.air_temp_f', 'pulls.humidity_pct', 'pulls.dyno_corrected', 'pulls.included', 'pulls.exclusion_reason', 'pulls.problems',
  'pulls.torque_unit', 'pulls.power_unit', 'pulls.vacuum_unit', 'pulls.row_count', 'pulls.point_count', 'pulls.rpm_from', 'pulls.rpm_to',
  'pulls.peak_power_hp', 'pulls.peak_power_rpm', 'pulls.peak_torque_lbft', 'pulls.peak_torque_rpm', 'pulls.version',
]

function pullQuery(db: Db, benchTestId: number) {
  return db('pulls')
    .join('setups', 'setups.id', 'pulls.setup_id')
    .leftJoin('users as uploader', 'uploader.id', 'pulls.uploaded_by_user_id')
    .leftJoin('operator_links as link', 'link.id', 'pulls.operator_link_id')
    .where('pulls.bench_test_id', benchTestId)
    .whereNull('setups.deleted_at')
    .select(...SUMMARY_COLUMNS, 'uploader.display_name as uploader_name', 'link.label as link_label',
      db.raw('(SELECT COUNT(*) FROM pulls p2 WHERE p2.setup_id = pulls.setup_id AND p2.id <= pulls.id) AS pull_number'))
}

function toPullSummary(row: PullRow): PullSummary {
  const units: PullSummary['units'] = {}
  if (row.torque_unit) units.torque = row.torque_unit as TorqueUnit
  if (row.power_unit) units.power = row.power_unit as PowerUnit
  if (row.vacuum_unit) units.vacuum = row.vacuum_unit as VacuumUnit
  const problems = parseJsonColumn<unknown>(row.problems, [])
  return {
    id: row.id,
    setupId: row.setup_id,
    number: Number(row.pull_number),
    fileName: row.file_name,
    uploadedAt: isoTimeRequired(row.uploaded_at),
    uploadedBy: row.operator_link_id !== null
      ? { kind: 'operator-link', linkId: row.operator_link_id, label: row.link_label ?? '' }
      : { kind: 'user', userId: row.uploaded_by_user_id ?? 0, name: row.uploader_name ?? '' },
    weather: weatherOf(row),
    dynoCorrected: asBool(row.dyno_corrected),
    included: asBool(row.included),
    exclusionReason: row.exclusion_reason,
    rowCount: Number(row.row_count),
    pointCount: Number(row.point_count),
    rpmFrom: Number(row.rpm_from),
    rpmTo: Number(row.rpm_to),
    units,
    peakPower: { value: Number(row.peak_power_hp), rpm: Number(row.peak_power_rpm) },
    peakTorque: { value: Number(row.peak_torque_lbft), rpm: Number(row.peak_torque_rpm) },
    problems: Array.isArray(problems) ? problems as Problem[] : [],
    version: row.version,
  }
}

export async function pullSummaries(db: Db, benchTestId: number, ids?: readonly number[]): Promise<PullSummary[]> {
  const query = pullQuery(db, benchTestId).orderBy('setups.position').orderBy('pulls.id')
  if (ids) query.whereIn('pulls.id', ids)
  const rows = await query as PullRow[]
  const summaries = rows.map(toPullSummary)
  if (!ids) return summaries
  const byId = new Map(summaries.map(s => [s.id, s]))
  return ids.map(id => byId.get(id)).filter((s): s is PullSummary => s !== undefined)
}

export async function getPullSummary(db: Db, benchTestId: number, pullId: number): Promise<PullSummary> {
  const row = await pullQuery(db, benchTestId).where('pulls.id', pullId).first() as PullRow | undefined
  if (!row) missing('No such pull in this bench test.')
  return toPullSummary(row)
}

export async function getPullDetail(db: Db, benchTestId: number, pullId: number): Promise<PullDetail> {
  const summary = await getPullSummary(db, benchTestId, pullId)
  const row = await db('pulls').where({ id: pullId }).first('points') as { points: string }
  const points = decodePoints(row.points, { extra: true })
  const extraColumns = [...new Set(points.flatMap(p => Object.keys(p.extra ?? {})))]
  return {
    ...summary,
    points: points.map(({ rpm, torqueLbFt, powerHp, vacuumInHg, afr }) => ({ rpm, torqueLbFt, powerHp, ...(vacuumInHg === undefined ? {} : { vacuumInHg }), ...(afr === undefined ? {} : { afr }) })),
    extraColumns,
  }
}

export async function getPullFile(db: Db, benchTestId: number, pullId: number): Promise<{ fileName: string, text: string }> {
  const summary = await getPullSummary(db, benchTestId, pullId)
  const row = await db('pulls').where({ id: pullId }).first('original_text') as { original_text: string }
  return { fileName: summary.fileName, text: row.original_text }
}

/** Spread and outlier of each setup's included pulls, corrected to the given standard. */
export async function repeatabilityBySetup(db: Db, setupIds: readonly number[], standard: CorrectionStandard): Promise<SetupRepeatability[]> {
  const metas = (await loadPullMeta(db, setupIds)).filter(m => m.included)
  const points = await loadGridPoints(db, metas.map(m => m.id))
  return setupIds.map((setupId) => {
    const pulls = metas.filter(m => m.setupId === setupId)
    const empty: SetupRepeatability = { setupId, includedPulls: pulls.length, spreadPct: null, rpmOfLargestSpread: null, outlier: null, withinLimit: null, problem: null }
    if (pulls.length < 2) return empty
    try {
      const curve = setupCurve(pulls.map(m => scalePoints(points.get(m.id) ?? [], pullFactor(m, standard))))
      const outlier = curve.outlier ? { pullId: pulls[curve.outlier.index]!.id, deviationPct: curve.outlier.deviationPct, beyondRepeatability: curve.outlier.beyondRepeatability } : null
      return { ...empty, spreadPct: curve.spreadPct ?? null, rpmOfLargestSpread: curve.rpmOfLargestSpread ?? null, outlier, withinLimit: curve.spreadPct !== undefined ? curve.spreadPct <= REPEATABILITY_PCT : null }
    }
    catch (e) {
      return { ...empty, problem: (e as Error).message }
    }
  })
}

export async function listPulls(db: Db, benchTestId: number, standard: CorrectionStandard): Promise<PullList> {
  const pulls = await pullSummaries(db, benchTestId)
  const setupIds = await db('setups').where({ bench_test_id: benchTestId }).whereNull('deleted_at').orderBy('position').pluck('id') as number[]
  return { pulls, repeatability: await repeatabilityBySetup(db, setupIds, standard), standard }
}

export async function updatePull(db: Db, benchTestId: number, pullId: number, input: UpdatePullInput): Promise<PullSummary> {
  const current = await getPullSummary(db, benchTestId, pullId)
  const patch: Record<string, unknown> = {}
  if (input.included !== undefined) {
    patch.included = input.included
    patch.exclusion_reason = input.included ? '' : input.exclusionReason ?? ''
  }
  else if (input.exclusionReason !== undefined && !current.included) patch.exclusion_reason = input.exclusionReason
  if (input.weather !== undefined) {
    if (input.weather) {
      try { assertWeather(input.weather) }
      catch (e) { invalidField('weather', (e as Error).message) }
    }
    patch.baro_inhg = input.weather?.baroInHg ?? null
    patch.air_temp_f = input.weather?.airTempF ?? null
    patch.humidity_pct = input.weather?.humidityPct ?? null
  }
  if (input.dynoCorrected !== undefined) patch.dyno_corrected = input.dynoCorrected
  const weatherAfter = input.weather !== undefined ? input.weather : current.weather
  const correctedAfter = input.dynoCorrected ?? current.dynoCorrected
  if (!weatherAfter && !correctedAfter) invalidField('weather', 'A pull needs its weather unless the dyno already corrected it.')
  if (input.setupId !== undefined && input.setupId !== current.setupId) {
    const target = await db('setups').where({ id: input.setupId, bench_test_id: benchTestId }).whereNull('deleted_at').first('id')
    if (!target) throw httpError(409, `Setup ${input.setupId} is not a setup of this bench test (or it was deleted).`, { issues: [{ path: 'setupId', message: 'Not a setup of this bench test' }] })
    patch.setup_id = input.setupId
  }
  return db.transaction(async (trx) => {
    const n = await trx('pulls').where({ id: pullId, bench_test_id: benchTestId, version: input.version }).update({ ...patch, version: trx.raw('version + 1') })
    if (!n) staleVersion(await getPullSummary(trx, benchTestId, pullId), 'pull')
    await bumpLiveMark(trx, benchTestId)
    return getPullSummary(trx, benchTestId, pullId)
  })
}
