// The built server's entry: Nitro's own node-server entry (nitropack's
// presets/node/runtime/node-server.mjs, 2.13) with one change. Node's 'request'
// listener first offers the request to answerPageCacheHit (server/utils/page-cache-hits.ts),
// which answers an anonymous reader's in-process page-cache hit with prepared headers
// and stored bytes; anything it does not answer goes to Nitro's listener exactly as
// before. A hit so costs no H3Event, no promise and none of the app's hooks. The
// preset's WebSocket upgrade is left out: the app has no WebSocket routes.
// nuxt.config.ts makes this the entry of the node-server preset only (`nuxi dev` and
// the prerenderer keep their own). PAGE_CACHE_EARLY_HITS=off hands hits to the
// middleware instead, to measure what this saves (docs/bench/reader.md).
import '#nitro-internal-pollyfills'
import type { IncomingMessage, ServerResponse } from 'node:http'
import { Server as HttpServer } from 'node:http'
import { Server as HttpsServer } from 'node:https'
import destr from 'destr'
import { toNodeListener } from 'h3'
import { useNitroApp, useRuntimeConfig } from 'nitropack/runtime'
import { setupGracefulShutdown, startScheduleRunner, trapUnhandledNodeErrors } from 'nitropack/runtime/internal/index'
import { answerPageCacheHit } from './utils/page-cache-hits'

const cert = process.env.NITRO_SSL_CERT
const key = process.env.NITRO_SSL_KEY
const nitroApp = useNitroApp()
const nitroListener = toNodeListener(nitroApp.h3App)
const listener = process.env.PAGE_CACHE_EARLY_HITS === 'off'
  ? nitroListener
  : (req: IncomingMessage, res: ServerResponse) => {
      let answered = false
      try {
        answered = answerPageCacheHit(req, res)
      }
      catch (error) {
        // A fault in the early answer must not cost the reader the page: before
        // anything is sent, the request goes the long way (the middleware serves it).
        console.error('[page cache] early answer failed', error)
        if (res.headersSent) {
          res.destroy()
          return
        }
      }
      if (!answered) nitroListener(req, res)
    }
const server = cert && key ? new HttpsServer({ key, cert }, listener) : new HttpServer(listener)
const _port = destr<number | string | undefined>(process.env.NITRO_PORT || process.env.PORT)
const port = _port === 0 ? 0 : Number(_port) || 3000
const host = process.env.NITRO_HOST || process.env.HOST
const path = process.env.NITRO_UNIX_SOCKET
const listening = server.listen(path ? { path } : { port, host }, () => {
  const protocol = cert && key ? 'https' : 'http'
  const addressInfo = listening.address()
  if (typeof addressInfo === 'string') {
    console.log(`Listening on unix socket ${addressInfo}`)
    return
  }
  const baseURL = (useRuntimeConfig().app.baseURL || '').replace(/\/$/, '')
  const url = `${protocol}://${addressInfo?.family === 'IPv6' ? `[${addressInfo.address}]` : addressInfo?.address}:${addressInfo?.port}${baseURL}`
  console.log(`Listening on ${url}`)
})
trapUnhandledNodeErrors()
setupGracefulShutdown(listening, nitroApp)
if (import.meta._tasks) {
  startScheduleRunner()
}
export default {}
