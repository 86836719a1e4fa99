import { createHash } from 'node:crypto'
import Busboy from 'busboy'
import type { Readable } from 'node:stream'
import type { H3Event } from 'h3'
import { PHOTO_ACCEPTED_TEXT, PHOTO_MAX_BYTES } from '#shared/types/photos'

export interface PhotoUpload {
  bytes: Buffer
  sha256: string
  /** The name the browser gave, for display only; keys never come from it. */
  filename: string
}

const tooLarge = () => createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: `The file is larger than 40 MB. ${PHOTO_ACCEPTED_TEXT}` })
const badUpload = (message: string) => createError({ statusCode: 400, statusMessage: 'Bad Request', message })

export function cleanUploadName(raw: string | undefined): string {
  const base = (raw ?? '').split(/[/\\]/).pop() ?? ''
  // eslint-disable-next-line no-control-regex
  return base.replace(/[\u0000-\u001F\u007F]/g, '').trim().slice(0, 200)
}

/**
 * Reads one file from a multipart body (part "file"), streaming: h3's own reader
 * copies the body byte by byte into a JS array, far too slow and big for 40 MB.
 * Hashes while reading. The bytes come through the one limited reader
 * (server/utils/body-limit.ts): a body past 40 MB is refused as it passes the limit,
 * chunked or not, and a declared length over it before anything is read.
 */
export function readPhotoUpload(event: H3Event): Promise<PhotoUpload> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: 'Send the photo as multipart/form-data in a part named "file".' })
  }
  let parser: Busboy.Busboy
  try {
    parser = Busboy({
      headers: event.node.req.headers,
      defParamCharset: 'utf8',
      limits: { files: 1, fileSize: PHOTO_MAX_BYTES, fields: 10, fieldSize: 10_000, parts: 12 },
    })
  }
  catch {
    throw badUpload('The upload is not valid multipart data (no boundary).')
  }
  let body: Readable
  try {
    body = limitedBody(event)
  }
  catch (error) {
    throw (error as { statusCode?: number }).statusCode === 413 ? tooLarge() : error
  }
  return new Promise((resolve, reject) => {
    let upload: PhotoUpload | undefined
    let settled = false
    // The first refusal ends the upload: the parser gets nothing more, the rest of the body is dropped.
    const fail = (error: Error) => {
      if (settled) return
      settled = true
      body.unpipe(parser)
      stopReadingBody(event)
      parser.on('error', () => { /* left behind on purpose */ })
      reject(error)
    }

    parser.on('file', (name, stream, info) => {
      if (name !== 'file') {
        stream.resume()
        return
      }
      const chunks: Buffer[] = []
      const hash = createHash('sha256')
      let size = 0
      stream.on('data', (chunk: Buffer) => {
        chunks.push(chunk)
        size += chunk.length
        hash.update(chunk)
      })
      stream.on('limit', () => fail(tooLarge()))
      stream.on('end', () => {
        if (!settled) upload = { bytes: Buffer.concat(chunks, size), sha256: hash.digest('hex'), filename: cleanUploadName(info.filename) }
      })
    })
    parser.on('filesLimit', () => fail(badUpload('Send one photo per request.')))
    parser.on('error', () => fail(badUpload('The upload could not be read: the request was cut off or is not valid multipart data.')))
    parser.on('close', () => {
      if (settled) return
      settled = true
      if (!upload) reject(badUpload('No file in the upload: send the photo in a part named "file".'))
      else resolve(upload)
    })
    body.once('error', (error: Error) => fail((error as { statusCode?: number }).statusCode === 413 ? tooLarge() : badUpload('The upload was cut off before it finished.')))
    body.pipe(parser)
  })
}
