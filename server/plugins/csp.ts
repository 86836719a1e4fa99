import { createHash } from 'node:crypto'
import { contentSecurityPolicy, embedContentSecurityPolicy, inlineScriptBodies, isEmbedPath } from '../utils/csp'

const sha256 = (body: string) => createHash('sha256').update(body, 'utf8').digest('base64')

// Pages get a CSP that allows exactly the inline scripts they carry (by hash).
// Nuxt's own scripts are in the document's head and after the app; they are
// taken from those parts before the page is joined (scanning the whole page cost
// about 2 % of a server render), and a script inside the app's markup, which we
// never write, is not allowed at all.
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.dev) return // Vite's dev client injects scripts of its own
  const { s3 } = appConfig()
  const imageOrigins = [s3.endpoint, process.env.PHOTO_CDN_URL].filter((u): u is string => Boolean(u)).map(u => new URL(u).origin)
  nitroApp.hooks.hook('render:html', (html, { event }) => {
    event.context.cspScriptHashes = [...html.head, ...html.bodyPrepend, ...html.bodyAppend].flatMap(inlineScriptBodies).map(sha256)
  })
  nitroApp.hooks.hook('render:response', (response, { event }) => {
    if (typeof response.body !== 'string') return
    const hashes = event.context.cspScriptHashes ?? inlineScriptBodies(response.body).map(sha256)
    const policy = isEmbedPath(event.path) ? embedContentSecurityPolicy(hashes) : contentSecurityPolicy(hashes, imageOrigins)
    response.headers = { ...response.headers, 'content-security-policy': policy }
  })
})

declare module 'h3' {
  interface H3EventContext {
    cspScriptHashes?: string[]
  }
}
