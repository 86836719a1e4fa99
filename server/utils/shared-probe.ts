export interface ProbeResult { ok: boolean, checkedAt: string }

/**
 * `/api/health` is public, so each answer must be cheap: a storage probe signs a
 * request and a mail probe opens an SMTP conversation (together most of the ~19 ms of
 * CPU an answer used to cost). Their results are shared for `maxAgeMs`, and callers that
 * arrive while a probe runs wait for that probe rather than starting their own. The
 * database is still asked on every call: it is the part that fails most and costs least.
 */
export function sharedProbe(probe: () => Promise<boolean>, maxAgeMs: number, now: () => number = Date.now): () => Promise<ProbeResult> {
  let last: { result: ProbeResult, at: number } | undefined
  let running: Promise<ProbeResult> | undefined
  return () => {
    if (last && now() - last.at < maxAgeMs) return Promise.resolve(last.result)
    running ??= probe().catch(() => false).then((ok) => {
      const at = now()
      last = { result: { ok, checkedAt: new Date(at).toISOString() }, at }
      running = undefined
      return last.result
    })
    return running
  }
}
