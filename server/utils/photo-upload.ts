import { createHash } from 'node:crypto'
import Busboy from 'busboy'
import type { H3Event } from 'h3'
import { PHOTO_ACCEPTED_TEXT, PHOTO_MAX_BYTES } from '#shared/types/photos'

export interface PhotoUpload {
  bytes: Buffer
  sha256: string
  /** The name the browser gave, for display only; keys never come from it. */
  filename: string
}

// Room for the multipart boundaries and part headers around one 40 MB file.
const MULTIPART_OVERHEAD = 64 * 1024

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
 * Hashes while reading; refuses a body over the limit before taking it in.
 */
export function readPhotoUpload(event: H3Event): Promise<PhotoUpload> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: 'Send the photo as multipart/form-data in a part named "file".' })
  }
  const declared = Number(getRequestHeader(event, 'content-length'))
  if (!Number.isFinite(declared) || declared <= 0) {
    throw createError({ statusCode: 411, statusMessage: 'Length Required', message: 'The upload must say its length (Content-Length).' })
  }
  if (declared > PHOTO_MAX_BYTES + MULTIPART_OVERHEAD) throw tooLarge()

  const req = event.node.req
  return new Promise((resolve, reject) => {
    const parser = Busboy({
      headers: req.headers,
      defParamCharset: 'utf8',
      limits: { files: 1, fileSize: PHOTO_MAX_BYTES, fields: 10, fieldSize: 10_000, parts: 12 },
    })
    let upload: PhotoUpload | undefined
    let failure: Error | undefined

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
      stream.on('limit', () => { failure ??= tooLarge() })
      stream.on('end', () => {
        if (!failure) upload = { bytes: Buffer.concat(chunks, size), sha256: hash.digest('hex'), filename: cleanUploadName(info.filename) }
      })
    })
    parser.on('filesLimit', () => { failure ??= badUpload('Send one photo per request.') })
    parser.on('error', () => reject(badUpload('The upload could not be read: the request was cut off or is not valid multipart data.')))
    parser.on('close', () => {
      if (failure) reject(failure)
      else if (!upload) reject(badUpload('No file in the upload: send the photo in a part named "file".'))
      else resolve(upload)
    })
    req.on('aborted', () => reject(badUpload('The upload was cut off before it finished.')))
    req.pipe(parser)
  })
}
