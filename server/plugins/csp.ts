import { createHash } from 'node:crypto'
import { contentSecurityPolicy, inlineScriptBodies } from '#shared/utils/csp'

// Pages get a CSP that allows exactly the inline scripts they carry (by hash).
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.dev) return // Vite's dev client injects scripts of its own
  const { s3 } = appConfig()
  const imageOrigins = [s3.endpoint, process.env.PHOTO_CDN_URL].filter((u): u is string => Boolean(u)).map(u => new URL(u).origin)
  nitroApp.hooks.hook('render:response', (response) => {
    if (typeof response.body !== 'string') return
    const hashes = inlineScriptBodies(response.body).map(body => createHash('sha256').update(body, 'utf8').digest('base64'))
    response.headers = { ...response.headers, 'content-security-policy': contentSecurityPolicy(hashes, imageOrigins) }
  })
})
