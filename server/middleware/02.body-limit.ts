import { bodyLimitFor, bodyUntouched, lingerAfterAnswer, readLimitedBody } from '../utils/body-limit'

// h3's readRawBody (under readBody, readValidatedBody, readMultipartFormData, and
// readFormData through getRequestWebStream) takes a body already set on the request
// under this symbol, resolving it as a thenable. Handing it the limited reader makes
// every route's body go through it. It is lazy: nothing is read until a handler asks,
// so a route checks its token or its user before a byte of the body is taken in.
const RAW_BODY = Symbol.for('h3RawBody')

export default defineEventHandler((event) => {
  const req = event.node.req as typeof event.node.req & Record<symbol | string, unknown>
  // Without either header there is no body (h3's readers answer undefined themselves):
  // the page cache's hot path pays nothing more.
  if (req.headers['content-length'] === undefined && req.headers['transfer-encoding'] === undefined) return
  // Requests Nitro makes to itself ($fetch inside a render) carry their body in memory already.
  if ('__unenv__' in req || 'body' in req || 'rawBody' in req || RAW_BODY in req) return
  // Whatever the route does, a body it leaves unread is dropped, bounded, after the answer.
  event.node.res.once('finish', () => {
    if (bodyUntouched(event) && !req.complete) lingerAfterAnswer(event)
  })
  const maxBytes = bodyLimitFor(event.path)
  let reading: Promise<Buffer> | undefined
  const lazyBody: PromiseLike<Buffer> = {
    then(onFulfilled, onRejected) {
      reading ??= readLimitedBody(event, maxBytes)
      return reading.then(onFulfilled, onRejected)
    },
  }
  req[RAW_BODY] = lazyBody
})
