// Content-Security-Policy for rendered pages. Nuxt puts a few inline scripts in
// each page (its runtime config, hydration helpers); instead of 'unsafe-inline'
// each one present in the page is allowed by its own SHA-256 hash.
const INLINE_SCRIPT = /<script\b([^>]*)>([\s\S]*?)<\/script>/gi

/** The bodies of inline scripts that a browser would execute (not src=, not JSON data). */
export function inlineScriptBodies(html: string): string[] {
  const bodies: string[] = []
  for (const match of html.matchAll(INLINE_SCRIPT)) {
    const attrs = match[1] ?? ''
    const body = match[2] ?? ''
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
