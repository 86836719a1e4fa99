// Keeps eligible answers (marked by server/middleware/05.page-cache.ts) and drops
// the cache when the stories change. Polling one small aggregate is the seam: it
// sees publish, withdraw, edit and the scheduled job on every app server, whoever
// made the change, without the stories code having to know about caches.
const POLL_MS = 2000

function asCacheableBody(body: unknown): string | Buffer | null {
  if (typeof body === 'string' || Buffer.isBuffer(body)) return body
  if (body && typeof body === 'object' && Object.getPrototypeOf(body) === Object.prototype) return JSON.stringify(body)
  return null
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('beforeResponse', (event, response) => {
    const target = event.context.pageCache
    if (!target || event.context.currentUser) return
    const res = event.node.res
    if (res.getHeader('set-cookie')) return
    const body = asCacheableBody(response.body)
    if (body === null) return
    const headers = res.getHeaders() as Record<string, unknown>
    // h3 serialises objects after this hook; keep them the way it will send them.
    if (!Buffer.isBuffer(response.body) && typeof response.body !== 'string') headers['content-type'] ??= 'application/json'
    storePage(target.key, target.slug, res.statusCode, headers, body)
  })

  let fingerprint: string | null = null
  const check = async () => {
    try {
      const row = await useDb()('stories').first(useDb().raw('COUNT(*) AS n, MAX(updated_at) AS changed, MAX(published_at) AS published')) as { n: number, changed: Date | null, published: Date | null } | undefined
      const next = JSON.stringify(row ?? null)
      if (fingerprint !== null && next !== fingerprint) invalidateStoryCache()
      fingerprint = next
    }
    catch {
      // The database being away is reported elsewhere; keep what we have until it is back.
    }
  }
  const timer = setInterval(check, POLL_MS)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
