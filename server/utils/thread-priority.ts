// The pull-check thread runs below the server's own thread in the scheduler's eyes:
// on a machine with few cores a check keeps one core busy for seconds, and when
// anything else (the database, another process) wants a core too, the server's thread
// should be the one that gets it. Linux keeps a nice value per thread, and
// setpriority(PRIO_PROCESS, tid) sets one thread's; Node's os.setPriority passes a
// thread id through. Plain Node: the pull-check worker imports it.
import { readlinkSync } from 'node:fs'
import { setPriority } from 'node:os'
import { isMainThread } from 'node:worker_threads'

/** The niceness background work runs at unless its setting says otherwise (0 to 19; 0 leaves it alone). */
export const DEFAULT_CHECK_NICE = 19

/** A nice setting (PULL_CHECK_NICE, PHOTO_WORKER_NICE): a whole number 0-19, else the default. */
export function niceSetting(value: string | undefined): number {
  const n = Number(value ?? DEFAULT_CHECK_NICE)
  return Number.isInteger(n) && n >= 0 && n <= 19 ? n : DEFAULT_CHECK_NICE
}

export function checkThreadNice(value = process.env.PULL_CHECK_NICE): number {
  return niceSetting(value)
}

/**
 * Lowers the calling worker thread's scheduling priority to `nice` (Linux only; a
 * no-op elsewhere, on the main thread, or for 0). Raising a nice value needs no
 * privilege. True when it was set.
 */
export function lowerWorkerThreadPriority(nice = checkThreadNice()): boolean {
  if (isMainThread || nice === 0 || process.platform !== 'linux') return false
  try {
    // "<pid>/task/<tid>": this thread's own id.
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop())
    if (!Number.isInteger(tid) || tid <= 0 || tid === process.pid) return false
    setPriority(tid, nice)
    return true
  }
  catch {
    return false
  }
}
