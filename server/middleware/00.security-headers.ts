import { isEmbedPath } from '../utils/csp'

// Baseline response headers for every route; pages add their own cache rules.
// Nothing may be framed by another site except the embed pages, whose CSP
// (server/plugins/csp.ts) says frame-ancestors * instead.
export default defineEventHandler((event) => {
  setResponseHeaders(event, {
    'X-Content-Type-Options': 'nosniff',
    'Referrer-Policy': 'strict-origin-when-cross-origin',
  })
  if (!isEmbedPath(event.path)) setResponseHeader(event, 'X-Frame-Options', 'DENY')
  if (event.path.startsWith('/api/')) setResponseHeader(event, 'Cache-Control', 'no-store')
})
