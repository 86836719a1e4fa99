// Reads the files of an operator upload as they stream in: each file's type is decided
// from its first bytes (a photo or a workbook is refused before the rest of it arrives),
// each is cut off at the link's size limit, and the whole body at the batch's limit.
import Busboy from 'busboy'
import type { H3Event } from 'h3'
import { PULL_LIMITS } from '#shared/types/workspace'
import { SNIFF_BYTES, sniffFile } from '#shared/utils/file-sniff'
import { limitedBody, stopReadingBody } from '../../utils/body-limit'
import { cleanFileName, type UploadedFile } from './operator-links'
import { httpError } from '../../utils/http-errors'

// Multipart boundaries and part headers around the files.
const MULTIPART_OVERHEAD = 256 * 1024

function megabytes(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(0)} MB`
}

export function readOperatorUpload(event: H3Event, maxFileBytes: number): Promise<UploadedFile[]> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw httpError(400, 'Send the files as multipart/form-data, each part named "file".')
  }
  const body = limitedBody(event, PULL_LIMITS.maxFilesPerBatch * maxFileBytes + MULTIPART_OVERHEAD)
  return new Promise((resolve, reject) => {
    let parser: Busboy.Busboy
    try {
      parser = Busboy({
        headers: event.node.req.headers,
        defParamCharset: 'utf8',
        limits: { files: PULL_LIMITS.maxFilesPerBatch, fileSize: maxFileBytes, fields: 20, fieldSize: 10_000, parts: PULL_LIMITS.maxFilesPerBatch + 20 },
      })
    }
    catch {
      stopReadingBody(event)
      reject(httpError(400, 'The upload is not valid multipart data (no boundary).'))
      return
    }
    const files: UploadedFile[] = []
    let done = false
    // The first refusal ends the upload at once: nothing more of the body is read.
    const fail = (error: Error) => {
      if (done) return
      done = true
      stopReadingBody(event)
      body.unpipe(parser)
      parser.on('error', () => { /* left behind on purpose */ })
      reject(error)
    }

    parser.on('file', (field, stream, info) => {
      if (field !== 'file') {
        stream.resume()
        return
      }
      const name = cleanFileName(info.filename, `upload-${files.length + 1}.csv`)
      const chunks: Buffer[] = []
      let size = 0
      let sniffed = false
      const sniff = () => {
        sniffed = true
        const head = Buffer.concat(chunks, size).subarray(0, SNIFF_BYTES)
        const found = sniffFile(head)
        if (!found.text) fail(httpError(415, `${name} is ${found.kind}, not a pull file. Send the pulls as CSV text files. Nothing of this upload was kept.`))
      }
      stream.on('data', (chunk: Buffer) => {
        chunks.push(chunk)
        size += chunk.length
        if (!sniffed && size >= SNIFF_BYTES) sniff()
      })
      stream.on('limit', () => fail(httpError(413, `${name} is larger than ${megabytes(maxFileBytes)}; files up to ${megabytes(maxFileBytes)} are accepted. Nothing of this upload was kept.`)))
      stream.on('end', () => {
        if (!sniffed) sniff()
        if (!done) files.push({ name, data: Buffer.concat(chunks, size) })
      })
    })
    parser.on('filesLimit', () => fail(httpError(400, `Send at most ${PULL_LIMITS.maxFilesPerBatch} files at once.`)))
    parser.on('partsLimit', () => fail(httpError(400, 'The upload has too many parts: send only files, each in a part named "file".')))
    parser.on('error', () => fail(httpError(400, 'The upload could not be read: the request was cut off or is not valid multipart data.')))
    parser.on('close', () => {
      if (done) return
      done = true
      resolve(files)
    })
    body.once('error', fail)
    body.pipe(parser)
  })
}
