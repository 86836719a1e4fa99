// The one import path for pulls: the writer's import, the inbox assignment and the
// demo seed all come through here. The core takes its connection (db first) and imports what it
// uses explicitly, because the seed runs under plain tsx, outside Nitro.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { ColumnRole, CorrectionStandard, Problem, Weather } from '../../../shared/dyno/index'
import type { CheckedPullFile } from './pull-check'
import { checkPullBatchFiles } from './pull-batch-check'
import { encodePoints } from './pull-points'
import { httpError } from '../../utils/http-errors'
import { bumpLiveMark } from './live-marks'

export interface PullToImport {
  name: string
  text: string
  /** UTF-8 size when known (uploaded bytes); otherwise measured from the text. */
  bytes?: number
  mapping?: Record<string, ColumnRole>
  setupId: number
  weather: Weather | null
  dynoCorrected?: boolean
}

export type PullUploader = { userId: number } | { operatorLinkId: number }

export interface CheckedPull {
  input: PullToImport
  checked: CheckedPullFile
  /** Warnings kept with the pull (errors refuse the batch). */
  problems: Problem[]
  /**
   * The points already encoded (encodePoints) when the check ran in the pool: a string
   * crosses back to the server's thread in one copy, a million point objects do not.
   */
  encodedPoints?: string
}

/** checkPullBatchFiles, a refused batch thrown as 422 with every file's preview. */
export function checkPullBatch(files: readonly PullToImport[], standard: CorrectionStandard): CheckedPull[] {
  const result = checkPullBatchFiles(files, standard)
  if (!result.ok) throw httpError(422, result.message, result.data)
  return result.pulls
}

/**
 * Saves checked pulls inside the caller's transaction. Each setup must be a live setup
 * of this bench test; it is share-locked so it cannot be deleted while the batch commits.
 * A refusal throws, and the caller's transaction rolls back what went in before.
 */
export async function insertCheckedPulls(trx: Knex.Transaction, benchTestId: number, pulls: readonly CheckedPull[], uploader: PullUploader, issuePath = (index: number) => `files.${index}.setupId`): Promise<number[]> {
  const ids: number[] = []
  for (const [index, { input, checked, problems, encodedPoints }] of pulls.entries()) {
    const setup = await trx('setups').where({ id: input.setupId, bench_test_id: benchTestId }).whereNull('deleted_at').forShare().first('id')
    if (!setup) {
      const message = `${input.name}: setup ${input.setupId} is not a setup of this bench test (or it was deleted); nothing was saved`
      throw httpError(409, message, { issues: [{ path: issuePath(index), message }] })
    }
    const parsed = checked.parsed!
    const preview = checked.preview
    const [id] = await trx('pulls').insert({
      bench_test_id: benchTestId,
      setup_id: input.setupId,
      file_name: input.name,
      original_text: input.text,
      original_bytes: checked.bytes,
      uploaded_by_user_id: 'userId' in uploader ? uploader.userId : null,
      operator_link_id: 'operatorLinkId' in uploader ? uploader.operatorLinkId : null,
      baro_inhg: input.weather?.baroInHg ?? null,
      air_temp_f: input.weather?.airTempF ?? null,
      humidity_pct: input.weather?.humidityPct ?? null,
      dyno_corrected: input.dynoCorrected === true,
      problems: JSON.stringify(problems),
      points: encodedPoints ?? encodePoints(parsed.points),
      column_mapping: input.mapping ? JSON.stringify(input.mapping) : null,
      torque_unit: parsed.units.torque ?? null,
      power_unit: parsed.units.power ?? null,
      vacuum_unit: parsed.units.vacuum ?? null,
      row_count: checked.rowCount,
      point_count: preview.pointCount,
      rpm_from: preview.rpmFrom,
      rpm_to: preview.rpmTo,
      peak_power_hp: preview.peakPower!.value,
      peak_power_rpm: preview.peakPower!.rpm,
      peak_torque_lbft: preview.peakTorque!.value,
      peak_torque_rpm: preview.peakTorque!.rpm,
    })
    ids.push(Number(id))
  }
  // The dyno day view follows this counter (server/services/workspace/live-marks.ts).
  if (ids.length) await bumpLiveMark(trx, benchTestId)
  return ids
}

async function standardOf(db: Db, benchTestId: number): Promise<CorrectionStandard> {
  const row = await db('bench_tests').where({ id: benchTestId }).first('default_standard')
  return (row?.default_standard ?? 'sae-j1349-1990') as CorrectionStandard
}

/** Checks every file, then saves all of them in one transaction, or none. Returns the new pull ids in order. */
export async function importPulls(db: Db, benchTestId: number, files: readonly PullToImport[], uploader: PullUploader): Promise<number[]> {
  const checked = checkPullBatch(files, await standardOf(db, benchTestId))
  return db.transaction(trx => insertCheckedPulls(trx, benchTestId, checked, uploader))
}
