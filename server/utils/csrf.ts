import type { H3Event } from 'h3'

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

/** The origins this server answers as: the configured base URL and the Host it was reached by. */
function ownOrigins(event: H3Event): Set<string> {
  const origins = new Set<string>([new URL(appConfig().baseUrl).origin])
  const host = getRequestHeader(event, 'host')
  if (host) {
    const proto = getRequestProtocol(event, { xForwardedProto: process.env.TRUST_PROXY === '1' })
    origins.add(`${proto}://${host}`)
  }
  return origins
}

/**
 * nuxt-auth-utils does no CSRF protection. A state-changing request is refused
 * when its Origin is foreign, or when it carries a session cookie but no Origin
 * (browsers always send Origin on cross-site and same-origin fetch POSTs).
 */
export function csrfRejection(event: H3Event): string | null {
  if (SAFE_METHODS.has(event.method)) return null
  const origin = getRequestHeader(event, 'origin')
  if (origin) return ownOrigins(event).has(origin) ? null : `Cross-origin request from ${origin} refused.`
  const hasSession = (getRequestHeader(event, 'cookie') ?? '').includes('pullsheet-session=')
  return hasSession ? 'Request without an Origin header refused.' : null
}
