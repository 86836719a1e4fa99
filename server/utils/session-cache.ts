import type { H3Event } from 'h3'
import { LruCache } from '#shared/utils/lru-cache'

// Unsealing the session cookie (PBKDF2, HMAC and AES through WebCrypto) costs about
// a fifth of a millisecond, and one page render unseals the same cookie again in each
// API call it makes. What a cookie unsealed to is kept here, keyed by the whole sealed
// string (its HMAC is part of it, so only a genuine cookie can hit), for a minute at
// most and never past the session's own max age. Nothing about the user is kept: the
// user row is still read on every request (getCurrentUser).
interface SessionRecord { id: string, createdAt: number, data: Record<string, unknown> }
const KEEP_MS = 60_000
const known = new LruCache<{ session: SessionRecord, until: number }>(2000)

function sessionSettings() {
  const { name, maxAge } = useRuntimeConfig().session as { name: string, maxAge?: number }
  return { name, maxAgeMs: (maxAge ?? 0) * 1000 }
}

const copy = (session: SessionRecord): SessionRecord => ({ id: session.id, createdAt: session.createdAt, data: structuredClone(session.data) })

/**
 * Runs `read` (which unseals the session through h3) with the session already in
 * place when this cookie was unsealed lately, and remembers it when it was not.
 * Without a session cookie there is no session: null, and `read` is not called,
 * since h3 would start an empty session and set its cookie, which would keep an
 * anonymous reader's pages out of every cache.
 */
export async function withKnownSession<T>(event: H3Event, read: () => Promise<T>): Promise<T | null> {
  const { name, maxAgeMs } = sessionSettings()
  const sealed = getCookie(event, name)
  if (!sealed) return null
  const sessions = (event.context.sessions ??= Object.create(null)) as Record<string, SessionRecord>
  if (sessions[name]) return read()
  const now = Date.now()
  const hit = known.get(sealed)
  if (hit && hit.until > now) {
    sessions[name] = copy(hit.session)
    return read()
  }
  const result = await read()
  const session = sessions[name] as SessionRecord | undefined
  // Only a cookie that unsealed to a signed-in session is kept: when unsealing fails h3
  // starts a new, empty session, created now.
  if (session?.id && session.data.user && session.createdAt < now) {
    const until = Math.min(now + KEEP_MS, maxAgeMs ? session.createdAt + maxAgeMs : Infinity)
    if (until > now) known.set(sealed, { session: copy(session), until })
  }
  return result
}
