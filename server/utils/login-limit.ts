import type { H3Event } from 'h3'

// Common practice: a handful of tries per account, more per address (shared NATs).
const WINDOW_MINUTES = 15
const MAX_PER_ACCOUNT = 5
const MAX_PER_IP = 20

export function clientIp(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: process.env.TRUST_PROXY === '1' }) ?? 'unknown'
}

/** Throws 429 with a retry time when this account or address has failed too often. */
export async function assertLoginAllowed(event: H3Event, email: string, ip: string): Promise<void> {
  const db = useDb()
  const since = db.raw('NOW(3) - INTERVAL ? MINUTE', [WINDOW_MINUTES])
  const [byEmail, byIp] = await Promise.all([
    db('login_failures').where('email', email).where('failed_at', '>', since).count({ n: '*' }).min({ first: 'failed_at' }).first(),
    db('login_failures').where('ip', ip).where('failed_at', '>', since).count({ n: '*' }).min({ first: 'failed_at' }).first(),
  ])
  const blocked = [
    { n: Number(byEmail?.n ?? 0), first: byEmail?.first, max: MAX_PER_ACCOUNT },
    { n: Number(byIp?.n ?? 0), first: byIp?.first, max: MAX_PER_IP },
  ].filter(b => b.n >= b.max)
  if (blocked.length === 0) return
  const firstMs = Math.min(...blocked.map(b => new Date(b.first as unknown as string).getTime()))
  const retryAfterSeconds = Math.max(1, Math.ceil((firstMs + WINDOW_MINUTES * 60_000 - Date.now()) / 1000))
  setResponseHeader(event, 'Retry-After', retryAfterSeconds)
  throw createError({
    statusCode: 429,
    statusMessage: 'Too Many Requests',
    message: `Too many failed sign-ins. Try again in ${Math.ceil(retryAfterSeconds / 60)} minute(s).`,
    data: { retryAfterSeconds },
  })
}

export async function recordLoginFailure(email: string, ip: string): Promise<void> {
  await useDb()('login_failures').insert({ email: email.slice(0, 254), ip: ip.slice(0, 64) })
}

export async function clearLoginFailures(email: string): Promise<void> {
  await useDb()('login_failures').where('email', email).delete()
}
