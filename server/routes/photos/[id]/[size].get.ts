import { z } from 'zod'
import { findReadablePhoto } from '~~/server/services/photos/access'
import { parseStoredVariants } from '~~/server/services/photos/photos'
import { streamPhotoObject, whilePhotoStorageAnswers } from '~~/server/services/photos/storage'

const Params = z.object({
  id: z.coerce.number().int().positive(),
  size: z.union([z.literal('original'), z.coerce.number().int().positive()]),
})

const EXTENSIONS: Record<string, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' }

/**
 * The image bytes, streamed from S3: a web size (`/photos/12/960`) or, for the
 * desk only, the original (`/photos/12/original`). Anyone the photo is not for
 * gets 404, the same as for a photo that does not exist.
 */
export default defineEventHandler(async (event) => {
  const params = Params.safeParse(getRouterParams(event))
  if (!params.success) notFound('No such photo.')
  const { id, size } = params.data
  const found = await findReadablePhoto(useDb(), await getCurrentUser(event), id)
  if (!found) notFound('No such photo.')
  const { row, desk } = found

  let key: string
  let contentType: string
  if (size === 'original') {
    if (!desk) notFound('No such photo.')
    key = row.original_key
    contentType = row.mime
    setResponseHeader(event, 'Content-Disposition', `attachment; filename="photo-${row.id}-original.${EXTENSIONS[row.mime] ?? 'bin'}"`)
  }
  else {
    const variant = row.status === 'ready' ? parseStoredVariants(row.variants).find(v => v.width === size) : undefined
    if (!variant) notFound('No such photo size.')
    key = variant.key
    contentType = 'image/jpeg'
    setResponseHeader(event, 'Content-Disposition', 'inline')
  }

  const object = await whilePhotoStorageAnswers(() => streamPhotoObject(key, getRequestHeader(event, 'if-none-match') || undefined))
  if (!object) notFound('No such photo.')
  setResponseHeaders(event, {
    'Content-Type': contentType,
    'X-Content-Type-Options': 'nosniff',
    // Opened on its own, an image gets no scripts, no plugins, no origin.
    'Content-Security-Policy': 'default-src \'none\'; img-src \'self\'; style-src \'unsafe-inline\'; sandbox',
    'Cache-Control': desk ? 'private, max-age=300' : 'public, max-age=86400',
    ...(object.etag ? { ETag: object.etag } : {}),
  })
  if (object.notModified) {
    setResponseStatus(event, 304)
    return null
  }
  if (object.contentLength !== undefined) setResponseHeader(event, 'Content-Length', object.contentLength)
  return sendStream(event, object.body)
})
