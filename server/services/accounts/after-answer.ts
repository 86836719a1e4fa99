// Work that must not be part of an answer: the account routes that must not tell
// whether an address has an account (server/services/accounts/requests.ts) answer first
// and do their per-address work after.
import type { H3Event } from 'h3'

/** Longest wait for the answer to go out before the work starts anyway (a response that never reports its end). */
export const AFTER_ANSWER_FALLBACK_MS = 10_000

/**
 * Runs work once the answer has been sent (the response's 'finish', or 'close' when the
 * asker hung up): nothing of it, not even its first query, happens before, so the answer
 * and its timing cannot depend on the address. A failure is logged, never shown to the asker.
 */
export function afterAnswer(event: H3Event, what: string, work: () => Promise<void>): void {
  const res = event.node.res
  const sent = new Promise<void>((resolve) => {
    if (res.writableFinished) return resolve()
    const timer = setTimeout(resolve, AFTER_ANSWER_FALLBACK_MS)
    timer.unref?.()
    const done = () => {
      clearTimeout(timer)
      resolve()
    }
    res.once('finish', done)
    res.once('close', done)
  })
  event.waitUntil(sent.then(work).catch((error) => {
    console.error(`[account] ${what} failed: ${(error as Error)?.message ?? error}`)
  }))
}
