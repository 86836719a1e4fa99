import type { Role } from '../types/roles'

export type AccessDecision = { ok: true } | { ok: false, status: 401 | 403, message: string }

/** The role rule behind requireRole: signed out is 401, a role not listed is 403. */
export function decideAccess(user: { role: Role } | null | undefined, allowed: readonly Role[]): AccessDecision {
  if (!user) return { ok: false, status: 401, message: 'Sign in first.' }
  if (!allowed.includes(user.role)) return { ok: false, status: 403, message: 'Your role may not do this.' }
  return { ok: true }
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

/**
 * The CSRF rule: a state-changing request is refused when its Origin is foreign,
 * or when it carries a session cookie but no Origin at all. Returns the reason, or null.
 */
export function csrfReason(req: { method: string, origin?: string, hasSessionCookie: boolean, ownOrigins: ReadonlySet<string> }): string | null {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return null
  if (req.origin) return req.ownOrigins.has(req.origin) ? null : `Cross-origin request from ${req.origin} refused.`
  return req.hasSessionCookie ? 'Request without an Origin header refused.' : null
}
