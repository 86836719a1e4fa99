// Live changes of a bench test for the dyno day view. Writers bump a counter row in the
// transaction of the change; every app server polls the counters of the bench tests its
// own watchers follow, once a second, and tells those watchers. Nothing travels between
// servers but through MariaDB, so any number of servers can serve watchers.
import type { Db } from '../../utils/db'

/** Call last in the change's transaction: the counter row stays locked until commit. */
export async function bumpLiveMark(db: Db, benchTestId: number): Promise<void> {
  await db.raw('INSERT INTO live_marks (bench_test_id, seq) VALUES (?, 1) ON DUPLICATE KEY UPDATE seq = seq + 1, changed_at = CURRENT_TIMESTAMP(3)', [benchTestId])
}

export async function liveMark(db: Db, benchTestId: number): Promise<number> {
  const row = await db('live_marks').where({ bench_test_id: benchTestId }).first('seq') as { seq: number | string } | undefined
  return row ? Number(row.seq) : 0
}

type Notify = (seq: number) => void

interface Watched { seq: number, watchers: Set<Notify> }

const watched = new Map<number, Watched>()
let timer: ReturnType<typeof setInterval> | null = null
let polling = false
let pollDb: (() => Db) | null = null

/** Per-process figures for the benchmark and the runtime page. */
export const liveStats = { polls: 0, pollMsTotal: 0, notified: 0 }

export function liveWatcherCount(): number {
  let n = 0
  for (const w of watched.values()) n += w.watchers.size
  return n
}

async function poll(): Promise<void> {
  if (polling || !pollDb || watched.size === 0) return
  polling = true
  const started = performance.now()
  try {
    const rows = await pollDb()('live_marks').whereIn('bench_test_id', [...watched.keys()]).select('bench_test_id', 'seq') as { bench_test_id: number, seq: number | string }[]
    for (const row of rows) {
      const w = watched.get(row.bench_test_id)
      const seq = Number(row.seq)
      if (!w || seq === w.seq) continue
      w.seq = seq
      for (const notify of w.watchers) {
        liveStats.notified++
        notify(seq)
      }
    }
  }
  catch {
    // The database is away: the next tick tries again; watchers keep their connection.
  }
  finally {
    liveStats.polls++
    liveStats.pollMsTotal += performance.now() - started
    polling = false
  }
}

/**
 * Follows one bench test's counter from `seq` (what the watcher has seen); returns the
 * function that stops following. The poll runs only while someone watches.
 */
export function watchLiveMark(db: () => Db, benchTestId: number, seq: number, notify: Notify, intervalMs = 1000): () => void {
  pollDb = db
  let w = watched.get(benchTestId)
  if (!w) {
    w = { seq, watchers: new Set() }
    watched.set(benchTestId, w)
  }
  w.seq = Math.max(w.seq, seq)
  w.watchers.add(notify)
  if (!timer) {
    timer = setInterval(() => void poll(), intervalMs)
    timer.unref?.()
  }
  return () => {
    const entry = watched.get(benchTestId)
    entry?.watchers.delete(notify)
    if (entry && entry.watchers.size === 0) watched.delete(benchTestId)
    if (watched.size === 0 && timer) {
      clearInterval(timer)
      timer = null
    }
  }
}
