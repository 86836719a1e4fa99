import { retryAfterOf } from '~~/server/services/workspace/pull-pool'
// A refusal that says when to come back (a full check pool, a rate limit) carries
// data.retryAfterSeconds; it becomes the Retry-After header, whichever route threw it.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error, { event }) => {
    const seconds = retryAfterOf(error)
    if (seconds && event && !event.node.res.headersSent) setResponseHeader(event, 'Retry-After', seconds)
  })
})
