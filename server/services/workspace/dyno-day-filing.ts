// Files the operator sends during a dyno day, filed straight into the plan's current
// step. Kept apart from dyno-day.ts because the upload path (and the demo seed, under
// plain tsx) imports it: only the import core and the live counter come along.
import type { Knex } from 'knex'
import type { CorrectionStandard, Weather } from '../../../shared/dyno/index'
import { checkPullBatch, insertCheckedPulls } from './pull-import'

/** Files from the operator link go straight to the current step only this long after the day was started. */
export const DAY_FILING_HOURS = 24

function completeWeather(w: Partial<Weather> | null | undefined): Weather | null {
  return w && typeof w.baroInHg === 'number' && typeof w.airTempF === 'number' && typeof w.humidityPct === 'number'
    ? { baroInHg: w.baroInHg, airTempF: w.airTempF, humidityPct: w.humidityPct }
    : null
}

/**
 * A file the operator just sent, filed as a pull of the current step's setup when the
 * day is running and the file passes the import's checks with its own weather lines.
 * Inside the upload's transaction. Returns the setup's label, or null: the file then
 * waits in the inbox as before.
 */
export async function fileArrivalIntoPlan(trx: Knex.Transaction, benchTestId: number, linkId: number, inboxFileId: number, file: { name: string, text: string, bytes: number, weather: Partial<Weather> | null | undefined }): Promise<string | null> {
  const target = await trx('test_plans').join('test_plan_steps', 'test_plan_steps.id', 'test_plans.current_step_id')
    .join('setups', 'setups.id', 'test_plan_steps.setup_id')
    .where('test_plans.bench_test_id', benchTestId).whereNull('setups.deleted_at').whereNull('test_plan_steps.skipped_at')
    .where('test_plans.day_started_at', '>', trx.raw(`NOW(3) - INTERVAL ${DAY_FILING_HOURS} HOUR`))
    .join('bench_tests', 'bench_tests.id', 'test_plans.bench_test_id')
    .first('setups.id as setup_id', 'setups.label as label', 'bench_tests.default_standard as standard') as { setup_id: number, label: string, standard: CorrectionStandard } | undefined
  const weather = completeWeather(file.weather)
  if (!target || !weather) return null
  let checked
  try {
    checked = checkPullBatch([{ name: file.name, text: file.text, bytes: file.bytes, setupId: target.setup_id, weather }], target.standard)
  }
  catch (e) {
    if ((e as { statusCode?: number }).statusCode === 422) return null
    throw e
  }
  const [pullId] = await insertCheckedPulls(trx, benchTestId, checked, { operatorLinkId: linkId })
  await trx('inbox_files').where({ id: inboxFileId }).update({ state: 'assigned', pull_id: pullId, handled_at: trx.raw('NOW(3)') })
  return target.label
}
