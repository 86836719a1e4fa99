// Tables that only grow are trimmed here: rows that no rule reads any more are deleted,
// a batch at a time so no statement holds its locks for long. Run by
// server/plugins/housekeeping.ts on every app server (a delete that finds nothing is
// harmless, so servers need not agree who runs it) and on demand by an admin
// (POST /api/admin/housekeeping).
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import { ATTEMPT_RULES } from './login-limit'

export interface HousekeepingReport {
  /** Limiter rows older than the longest window of any account rule. */
  attempts: number
  /** Reset and invitation tokens used or expired over a week ago. */
  userTokens: number
  /** Finished or failed background jobs over 30 days old. */
  jobs: number
  /** Mails sent or given up over 30 days ago. */
  mails: number
}

/** Rows deleted per statement. */
export const PURGE_BATCH = 5000
/** Days a used or expired one-time token, a finished job and a sent mail are kept for looking into. */
export const KEEP_DAYS = { userTokens: 7, jobs: 30, mails: 30 } as const

/** The limiter only counts attempts inside its window; the longest window of any kind. */
export const attemptWindowMinutes = Math.max(...Object.values(ATTEMPT_RULES).map(r => r.windowMinutes))

async function inBatches(db: Db, sql: string, bindings: readonly Knex.RawBinding[]): Promise<number> {
  let total = 0
  for (;;) {
    const [result] = await db.raw(`${sql} LIMIT ${PURGE_BATCH}`, bindings) as [{ affectedRows: number }]
    total += result.affectedRows
    if (result.affectedRows < PURGE_BATCH) return total
  }
}

export async function purgeExpiredRows(db: Db): Promise<HousekeepingReport> {
  return {
    attempts: await inBatches(db, 'DELETE FROM login_failures WHERE failed_at < NOW(3) - INTERVAL ? MINUTE', [attemptWindowMinutes]),
    userTokens: await inBatches(db, 'DELETE FROM user_tokens WHERE (used_at IS NOT NULL AND used_at < NOW(3) - INTERVAL ? DAY) OR expires_at < NOW(3) - INTERVAL ? DAY', [KEEP_DAYS.userTokens, KEEP_DAYS.userTokens]),
    jobs: await inBatches(db, 'DELETE FROM jobs WHERE status IN (\'done\', \'failed\') AND finished_at < NOW(3) - INTERVAL ? DAY', [KEEP_DAYS.jobs]),
    mails: await inBatches(db, 'DELETE FROM mail_outbox WHERE (status = \'sent\' AND sent_at < NOW(3) - INTERVAL ? DAY) OR (status = \'failed\' AND created_at < NOW(3) - INTERVAL ? DAY)', [KEEP_DAYS.mails, KEEP_DAYS.mails]),
  }
}
