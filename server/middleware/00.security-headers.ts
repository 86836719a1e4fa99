import { baseSecurityHeaders } from '../utils/csp'

// Baseline response headers for every route; pages add their own cache rules.
// Nothing may be framed by another site except the embed pages, whose CSP
// (server/plugins/csp.ts) says frame-ancestors * instead.
export default defineEventHandler((event) => {
  setResponseHeaders(event, baseSecurityHeaders(event.path))
  if (event.path.startsWith('/api/')) setResponseHeader(event, 'Cache-Control', 'no-store')
})
