// The one import path for pulls: the writer's import, the inbox assignment and the
// demo seed all come through here. The core takes a Knex instance and imports what it
// uses explicitly, because the seed runs under plain tsx, outside Nitro.
import type { Knex } from 'knex'
import type { ColumnRole, CorrectionStandard, Problem, Weather } from '../../shared/dyno/index'
import type { ImportProblem, ImportRefusedData } from '../../shared/types/workspace'
import { capProblems, checkPullFile, weatherProblems, type CheckedPullFile } from './pull-check'
import { encodePoints } from './pull-points'
import { httpError } from './workspace-http'
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
}

/**
 * Checks every file of a batch; when any has an error the whole batch is refused (422)
 * with every file's preview and a message naming the first error's file, line and column.
 */
export function checkPullBatch(files: readonly PullToImport[], standard: CorrectionStandard): CheckedPull[] {
  const checked = files.map((input) => {
    const file = checkPullFile({ name: input.name, text: input.text, bytes: input.bytes, mapping: input.mapping })
    file.preview.problems.push(...weatherProblems(input.name, input.weather, input.dynoCorrected === true, standard))
    file.preview.ok = !file.preview.problems.some(p => p.severity === 'error')
    return file
  })
  const errors: ImportProblem[] = checked.flatMap(c => c.preview.problems.filter(p => p.severity === 'error'))
  if (errors.length) {
    const refusedFiles = new Set(errors.map(e => e.file)).size
    const data: ImportRefusedData = { files: checked.map(c => c.preview), problems: errors }
    throw httpError(422, `Nothing was saved: ${refusedFiles} of ${files.length} file${files.length === 1 ? '' : 's'} ${refusedFiles === 1 ? 'has' : 'have'} errors. ${errors[0]!.text}${errors.length > 1 ? ` (and ${errors.length - 1} more)` : ''}`, data)
  }
  return checked.map((c, i) => ({
    input: files[i]!,
    checked: c,
    problems: capProblems(c.preview.problems.filter(p => p.severity !== 'error').map(({ severity, line, column, message }) => ({ severity, ...(line === undefined ? {} : { line }), ...(column ? { column } : {}), message }))),
  }))
}

/**
 * Saves checked pulls inside the caller's transaction. Each setup must be a live setup
 * of this bench test; it is share-locked so it cannot be deleted while the batch commits.
 * A refusal throws, and the caller's transaction rolls back what went in before.
 */
export async function insertCheckedPulls(trx: Knex.Transaction, benchTestId: number, pulls: readonly CheckedPull[], uploader: PullUploader, issuePath = (index: number) => `files.${index}.setupId`): Promise<number[]> {
  const ids: number[] = []
  for (const [index, { input, checked, problems }] of pulls.entries()) {
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
      points: encodePoints(parsed.points),
      column_mapping: input.mapping ? JSON.stringify(input.mapping) : null,
      torque_unit: parsed.units.torque ?? null,
      power_unit: parsed.units.power ?? null,
      vacuum_unit: parsed.units.vacuum ?? null,
      row_count: checked.rowCount,
      point_count: parsed.points.length,
      rpm_from: preview.rpmFrom,
      rpm_to: preview.rpmTo,
      peak_power_hp: preview.peakPower!.value,
      peak_power_rpm: preview.peakPower!.rpm,
      peak_torque_lbft: preview.peakTorque!.value,
      peak_torque_rpm: preview.peakTorque!.rpm,
    })
    ids.push(Number(id))
  }
  // The dyno day view follows this counter (server/utils/live-marks.ts).
  if (ids.length) await bumpLiveMark(trx, benchTestId)
  return ids
}

async function standardOf(db: Knex | Knex.Transaction, benchTestId: number): Promise<CorrectionStandard> {
  const row = await db('bench_tests').where({ id: benchTestId }).first('default_standard')
  return (row?.default_standard ?? 'sae-j1349-1990') as CorrectionStandard
}

/** Checks every file, then saves all of them in one transaction, or none. Returns the new pull ids in order. */
export async function importPulls(db: Knex, benchTestId: number, files: readonly PullToImport[], uploader: PullUploader): Promise<number[]> {
  const checked = checkPullBatch(files, await standardOf(db, benchTestId))
  return db.transaction(trx => insertCheckedPulls(trx, benchTestId, checked, uploader))
}
