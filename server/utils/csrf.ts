import type { H3Event } from 'h3'
import { csrfReason } from '#shared/utils/access'

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

/** nuxt-auth-utils does no CSRF protection; browsers send Origin on every fetch POST. */
export function csrfRejection(event: H3Event): string | null {
  return csrfReason({
    method: event.method,
    origin: getRequestHeader(event, 'origin'),
    hasSessionCookie: (getRequestHeader(event, 'cookie') ?? '').includes('pullsheet-session='),
    ownOrigins: ownOrigins(event),
  })
}
