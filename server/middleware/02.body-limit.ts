import { bodyLimitFor, readLimitedBody } from '../utils/body-limit'

const BODY_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

// Every route's body goes through the limited reader: h3's readRawBody (under readBody,
// readValidatedBody and readMultipartFormData) takes `event._requestBody` when it is
// set, and resolves it as a thenable. Nothing is read until a handler asks, so a route
// can check its token or its user before a byte of the body is taken in.
export default defineEventHandler((event) => {
  if (!BODY_METHODS.has(event.method)) return
  const maxBytes = bodyLimitFor(event.path)
  let reading: Promise<Buffer> | undefined
  const lazyBody: PromiseLike<Buffer> = {
    then(onFulfilled, onRejected) {
      reading ??= readLimitedBody(event, maxBytes)
      return reading.then(onFulfilled, onRejected)
    },
  }
  ;(event as unknown as { _requestBody: unknown })._requestBody = lazyBody
})
