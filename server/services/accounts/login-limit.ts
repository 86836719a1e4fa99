import type { H3Event } from 'h3'
import type { Db } from '../../utils/db'

// One limiter for every account route: attempts are rows in MariaDB (so the limit
// holds across app servers), counted per address (e-mail) and per client IP over a
// window. Sign-ins and wrong current passwords count failures; registrations and
// reset requests count every request (each one sends a mail); reset confirmations
// count the tries with a link that does not work.
export type AttemptKind = 'login' | 'register' | 'reset-request' | 'reset-confirm'

interface AttemptRule {
  windowMinutes: number
  /** Per e-mail address; absent when the attempt has none (a reset link). */
  perAddress?: number
  perIp: number
  refusal: string
}

// Common practice: a handful of tries per account, more per IP (shared NATs); mails
// to one address are few per hour.
export const ATTEMPT_RULES: Record<AttemptKind, AttemptRule> = {
  'login': { windowMinutes: 15, perAddress: 5, perIp: 20, refusal: 'Too many failed sign-ins.' },
  'register': { windowMinutes: 60, perAddress: 3, perIp: 10, refusal: 'Too many sign-ups from here.' },
  'reset-request': { windowMinutes: 60, perAddress: 3, perIp: 10, refusal: 'Too many password reset requests.' },
  'reset-confirm': { windowMinutes: 15, perIp: 10, refusal: 'Too many tries with links that do not work.' },
}

export function clientIp(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: process.env.TRUST_PROXY === '1' }) ?? 'unknown'
}

const normalAddress = (email: string) => email.trim().toLowerCase().slice(0, 254)

/** Throws 429 with a retry time when this address or IP has used up the kind's attempts. */
export async function assertAttemptAllowed(db: Db, event: H3Event, kind: AttemptKind, email: string | null, ip: string): Promise<void> {
  const rule = ATTEMPT_RULES[kind]
  const since = db.raw('NOW(3) - INTERVAL ? MINUTE', [rule.windowMinutes])
  const counted = (column: 'email' | 'ip', value: string) => db('login_failures').where({ kind, [column]: value })
    .where('failed_at', '>', since).count({ n: '*' }).min({ first: 'failed_at' }).first()
  const [byAddress, byIp] = await Promise.all([
    email !== null && rule.perAddress ? counted('email', normalAddress(email)) : undefined,
    counted('ip', ip.slice(0, 64)),
  ])
  const blocked = [
    { n: Number(byAddress?.n ?? 0), first: byAddress?.first, max: rule.perAddress ?? Infinity },
    { n: Number(byIp?.n ?? 0), first: byIp?.first, max: rule.perIp },
  ].filter(b => b.n >= b.max)
  if (blocked.length === 0) return
  const firstMs = Math.min(...blocked.map(b => new Date(b.first as unknown as string).getTime()))
  const retryAfterSeconds = Math.max(1, Math.ceil((firstMs + rule.windowMinutes * 60_000 - Date.now()) / 1000))
  setResponseHeader(event, 'Retry-After', retryAfterSeconds)
  throw createError({
    statusCode: 429,
    statusMessage: 'Too Many Requests',
    message: `${rule.refusal} Try again in ${Math.ceil(retryAfterSeconds / 60)} minute(s).`,
    data: { retryAfterSeconds },
  })
}

export async function recordAttempt(db: Db, kind: AttemptKind, email: string | null, ip: string): Promise<void> {
  await db('login_failures').insert({ kind, email: email === null ? '' : normalAddress(email), ip: ip.slice(0, 64) })
}

export async function clearAttempts(db: Db, kind: AttemptKind, email: string): Promise<void> {
  await db('login_failures').where({ kind, email: normalAddress(email) }).delete()
}

export const assertLoginAllowed = (db: Db, event: H3Event, email: string, ip: string) => assertAttemptAllowed(db, event, 'login', email, ip)
export const recordLoginFailure = (db: Db, email: string, ip: string) => recordAttempt(db, 'login', email, ip)
export const clearLoginFailures = (db: Db, email: string) => clearAttempts(db, 'login', email)
