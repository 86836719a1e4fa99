// Content-Security-Policy for rendered pages. Nuxt puts a few inline scripts in
// each page (its runtime config, hydration helpers); instead of 'unsafe-inline'
// each one present in the page is allowed by its own SHA-256 hash.
const SCRIPT_OPEN = /<script\b([^>]*)>/gi
const SCRIPT_CLOSE = /<\/script>/gi

/** The bodies of inline scripts that a browser would execute (not src=, not JSON data). */
export function inlineScriptBodies(html: string): string[] {
  // Tag by tag, each end found by a plain search: a lazy [\s\S]*? over the page's
  // JSON payload (tens of KB) was a noticeable part of every server render.
  const bodies: string[] = []
  const open = new RegExp(SCRIPT_OPEN)
  const close = new RegExp(SCRIPT_CLOSE)
  for (let match = open.exec(html); match; match = open.exec(html)) {
    close.lastIndex = open.lastIndex
    const end = close.exec(html)
    if (!end) break
    const attrs = match[1] ?? ''
    const body = html.slice(open.lastIndex, end.index)
    open.lastIndex = close.lastIndex
    if (/\bsrc\s*=/i.test(attrs)) continue
    const type = /\btype\s*=\s*["']?([^"'\s>]+)/i.exec(attrs)?.[1]?.toLowerCase()
    if (type && type !== 'module' && type !== 'text/javascript' && type !== 'application/javascript') continue
    if (body.trim()) bodies.push(body)
  }
  return bodies
}

/** `imageOrigins`: where photos may come from besides this site (an S3 endpoint or CDN). */
export function contentSecurityPolicy(scriptHashes: string[], imageOrigins: string[] = []): string {
  return [
    `default-src 'self'`,
    `script-src 'self' ${scriptHashes.map(h => `'sha256-${h}'`).join(' ')}`.trim(),
    // Vue binds style attributes and ECharts sets inline styles.
    `style-src 'self' 'unsafe-inline'`,
    `img-src 'self' data: blob: ${imageOrigins.join(' ')}`.trim(),
    `font-src 'self'`,
    `connect-src 'self'`,
    `object-src 'none'`,
    `base-uri 'self'`,
    `form-action 'self'`,
    `frame-ancestors 'none'`,
  ].join('; ')
}

/**
 * The embed page's policy (/embed/<slug>/<n>, one figure in another site's iframe):
 * any site may frame it, and it may reach nothing but this site's scripts, styles,
 * fonts and data; no forms, no plugins, no base URL, nothing from elsewhere.
 */
export function embedContentSecurityPolicy(scriptHashes: string[]): string {
  return [
    `default-src 'none'`,
    `script-src 'self' ${scriptHashes.map(h => `'sha256-${h}'`).join(' ')}`.trim(),
    `style-src 'self' 'unsafe-inline'`,
    `img-src 'self' data:`,
    `font-src 'self'`,
    `connect-src 'self'`,
    `object-src 'none'`,
    `base-uri 'none'`,
    `form-action 'none'`,
    `frame-ancestors *`,
  ].join('; ')
}

/** Pages other sites may frame: only the embed route. */
export function isEmbedPath(path: string): boolean {
  return /^\/embed\//.test(path)
}

/**
 * The headers every answer carries (server/middleware/00.security-headers.ts, and the
 * page cache's early answers in server/utils/page-cache-hits.ts): nothing may be
 * framed by another site except the embed pages, whose CSP says frame-ancestors *.
 */
export function baseSecurityHeaders(path: string): Record<string, string> {
  return {
    'X-Content-Type-Options': 'nosniff',
    'Referrer-Policy': 'strict-origin-when-cross-origin',
    ...(isEmbedPath(path) ? {} : { 'X-Frame-Options': 'DENY' }),
  }
}
