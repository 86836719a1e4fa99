// Waiting for something another process does (a job, a second server), without a fixed sleep.

/** Polls `probe` every 200 ms until it gives a value; fails with `what` after the timeout. */
export async function until<T>(what: string, probe: () => Promise<T | undefined | false>, timeoutMs = 30_000): Promise<T> {
  const end = Date.now() + timeoutMs
  while (Date.now() < end) {
    const value = await probe()
    if (value) return value
    await sleep(200)
  }
  throw new Error(`${what} did not happen within ${timeoutMs} ms`)
}

export const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))
