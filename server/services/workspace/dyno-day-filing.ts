// Files the operator sends during a dyno day, filed straight into the plan's current
// step. Kept apart from dyno-day.ts because the upload path (and the demo seed, under
// plain tsx) imports it: only the import core, the check pool and the live counter come along.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { CorrectionStandard, Weather } from '../../../shared/dyno/index'
import { insertCheckedPulls, type CheckedPull } from './pull-import'
import { checkStoredPullBatch } from './pull-pool'

/** Files from the operator link go straight to the current step only this long after the day was started. */
export const DAY_FILING_HOURS = 24

interface DayTarget { setupId: number, label: string, standard: CorrectionStandard }

/** A file checked for the step that was current before the upload's transaction. */
export interface PlannedFiling { target: DayTarget, pull: CheckedPull }

function completeWeather(w: Partial<Weather> | null | undefined): Weather | null {
  return w && typeof w.baroInHg === 'number' && typeof w.airTempF === 'number' && typeof w.humidityPct === 'number'
    ? { baroInHg: w.baroInHg, airTempF: w.airTempF, humidityPct: w.humidityPct }
    : null
}

/** The running day's current step (its setup and the bench test's standard), or null. */
async function currentTarget(db: Db, benchTestId: number): Promise<DayTarget | null> {
  const row = await db('test_plans').join('test_plan_steps', 'test_plan_steps.id', 'test_plans.current_step_id')
    .join('setups', 'setups.id', 'test_plan_steps.setup_id')
    .where('test_plans.bench_test_id', benchTestId).whereNull('setups.deleted_at').whereNull('test_plan_steps.skipped_at')
    .where('test_plans.day_started_at', '>', db.raw(`NOW(3) - INTERVAL ${DAY_FILING_HOURS} HOUR`))
    .join('bench_tests', 'bench_tests.id', 'test_plans.bench_test_id')
    .first('setups.id as setup_id', 'setups.label as label', 'bench_tests.default_standard as standard') as { setup_id: number, label: string, standard: CorrectionStandard } | undefined
  return row ? { setupId: row.setup_id, label: row.label, standard: row.standard } : null
}

/**
 * Before the upload's transaction: when a day is running, each file that passed the
 * upload's check and carries complete weather lines is checked as a pull of the current
 * step's setup, in the pull-check pool (never on the server's thread). null for a file
 * that will wait in the inbox.
 */
export async function planArrivals(db: Db, benchTestId: number, files: readonly { name: string, bytes: Uint8Array, ok: boolean, weather: Partial<Weather> | null | undefined }[]): Promise<(PlannedFiling | null)[]> {
  const target = files.some(f => f.ok) ? await currentTarget(db, benchTestId) : null
  if (!target) return files.map(() => null)
  const planned: (PlannedFiling | null)[] = []
  // One at a time: each file is its own batch (a refused one waits in the inbox alone), and the pool's queue stays for others.
  for (const file of files) {
    const weather = completeWeather(file.weather)
    if (!file.ok || !weather) {
      planned.push(null)
      continue
    }
    try {
      const [pull] = await checkStoredPullBatch([{ name: file.name, bytes: file.bytes, setupId: target.setupId, weather }], target.standard)
      planned.push({ target, pull: pull! })
    }
    catch (e) {
      if ((e as { statusCode?: number }).statusCode !== 422) throw e
      planned.push(null)
    }
  }
  return planned
}

/**
 * A file the operator just sent, filed as a pull of the current step's setup when the
 * day still stands where planArrivals found it (same setup, same standard). Inside the
 * upload's transaction. Returns the setup's label, or null: the file then waits in the
 * inbox as before.
 */
export async function fileArrivalIntoPlan(trx: Knex.Transaction, benchTestId: number, linkId: number, inboxFileId: number, planned: PlannedFiling | null): Promise<string | null> {
  if (!planned) return null
  const target = await currentTarget(trx, benchTestId)
  if (!target || target.setupId !== planned.target.setupId || target.standard !== planned.target.standard) return null
  const [pullId] = await insertCheckedPulls(trx, benchTestId, [planned.pull], { operatorLinkId: linkId })
  await trx('inbox_files').where({ id: inboxFileId }).update({ state: 'assigned', pull_id: pullId, handled_at: trx.raw('NOW(3)') })
  return target.label
}
