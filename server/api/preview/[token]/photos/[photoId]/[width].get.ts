import { z } from 'zod'
import { parseStoredVariants } from '~~/server/services/photos/photos'
import { streamPhotoObject } from '~~/server/services/photos/storage'
import { previewPhoto, previewTokenParam } from '~~/server/services/stories/preview'

const Params = z.object({ photoId: z.coerce.number().int().positive(), width: z.coerce.number().int().positive() })

/** A web size of a photo the previewed story uses (photos are not public before publication). */
export default defineEventHandler(async (event) => {
  setResponseHeaders(event, { 'X-Robots-Tag': 'noindex, nofollow', 'Referrer-Policy': 'no-referrer' })
  const token = previewTokenParam(event)
  const params = Params.safeParse(getRouterParams(event))
  if (!params.success) notFound('No such photo.')
  const row = await previewPhoto(useDb(), token, params.data.photoId)
  const variant = row.status === 'ready' ? parseStoredVariants(row.variants).find(v => v.width === params.data.width) : undefined
  if (!variant) notFound('No such photo size.')
  const object = await streamPhotoObject(variant.key)
  if (!object) notFound('No such photo.')
  setResponseHeaders(event, {
    'Content-Type': 'image/jpeg',
    'X-Content-Type-Options': 'nosniff',
    'Content-Security-Policy': 'default-src \'none\'; img-src \'self\'; style-src \'unsafe-inline\'; sandbox',
    'Cache-Control': 'private, no-store',
  })
  if (object.contentLength !== undefined) setResponseHeader(event, 'Content-Length', object.contentLength)
  return sendStream(event, object.body)
})
