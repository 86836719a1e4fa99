import type { Db } from './db'

export interface JobRow { id: number, kind: string, payload: unknown, attempts: number, max_attempts: number }
// Each handler validates its own payload (it was written by this app, but rows outlive releases).
export type JobHandler = (payload: unknown, job: JobRow) => Promise<void>

/** Queues a job, inside the caller's transaction when given one. */
export async function enqueueJob(db: Db, kind: string, payload: unknown, opts: { runAt?: Date, maxAttempts?: number } = {}): Promise<number> {
  const [id] = await db('jobs').insert({
    kind,
    payload: JSON.stringify(payload),
    run_at: opts.runAt ?? db.raw('CURRENT_TIMESTAMP(3)'),
    max_attempts: opts.maxAttempts ?? 3,
  })
  return Number(id)
}

function parsePayload(raw: unknown): unknown {
  // MariaDB JSON is LONGTEXT: parse defensively.
  if (typeof raw !== 'string') return raw
  try { return JSON.parse(raw) }
  catch { return null }
}

/**
 * Claims one due job of the given kinds: pending ones whose time has come, and
 * running ones whose lease ran out (their process died). SKIP LOCKED lets two
 * app servers claim side by side without waiting or taking the same row.
 */
export async function claimJob(kinds: string[], leaseSeconds: number): Promise<JobRow | undefined> {
  return useDb().transaction(async (trx) => {
    const row = await trx('jobs')
      .whereIn('kind', kinds)
      .where(q => q
        .where(p => p.where('status', 'pending').where('run_at', '<=', trx.raw('NOW(3)')))
        .orWhere(p => p.where('status', 'running').where('lease_until', '<', trx.raw('NOW(3)'))))
      .orderBy('run_at')
      .limit(1)
      .forUpdate()
      .skipLocked()
      .first()
    if (!row) return undefined
    await trx('jobs').where({ id: row.id }).update({
      status: 'running',
      attempts: trx.raw('attempts + 1'),
      lease_until: trx.raw('NOW(3) + INTERVAL ? SECOND', [leaseSeconds]),
    })
    return { id: Number(row.id), kind: row.kind, payload: parsePayload(row.payload), attempts: Number(row.attempts) + 1, max_attempts: Number(row.max_attempts) }
  })
}

export async function finishJob(id: number): Promise<void> {
  await useDb()('jobs').where({ id }).update({ status: 'done', finished_at: useDb().raw('NOW(3)'), lease_until: null })
}

/** A failed try is retried later (with backoff) until max_attempts, then marked failed. */
export async function failJob(job: JobRow, error: unknown, retryDelaySeconds = 10 * job.attempts): Promise<'retry' | 'failed'> {
  const db = useDb()
  const final = job.attempts >= job.max_attempts
  await db('jobs').where({ id: job.id }).update({
    status: final ? 'failed' : 'pending',
    last_error: String((error as Error)?.message ?? error).slice(0, 1000),
    run_at: db.raw('NOW(3) + INTERVAL ? SECOND', [final ? 0 : retryDelaySeconds]),
    lease_until: null,
    finished_at: final ? db.raw('NOW(3)') : null,
  })
  return final ? 'failed' : 'retry'
}

/** Runs one due job with its handler; true when a job was found. */
export async function runOneJob(handlers: Record<string, JobHandler>, leaseSeconds = 300): Promise<boolean> {
  const job = await claimJob(Object.keys(handlers), leaseSeconds)
  if (!job) return false
  try {
    await handlers[job.kind]!(job.payload, job)
    await finishJob(job.id)
  }
  catch (error) {
    await failJob(job, error)
  }
  return true
}
