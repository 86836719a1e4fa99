// Reads the files of an operator upload as they stream in: each file's type is decided
// from its first bytes (a photo or a workbook is refused before the rest of it arrives),
// each is cut off at the link's size limit, and the whole body at the batch's limit.
// A file's bytes are moved to a channel for the check worker as they arrive
// (IncomingFile, pull-pool.ts): the server's thread never joins them.
import Busboy from 'busboy'
import type { H3Event } from 'h3'
import { PULL_LIMITS } from '#shared/types/workspace'
import { SNIFF_BYTES, sniffFile } from '../../utils/file-sniff'
import { limitedBody, stopReadingBody } from '../../utils/body-limit'
import { cleanFileName } from './operator-links'
import { IncomingFile } from './pull-pool'
import { httpError } from '../../utils/http-errors'

// Multipart boundaries and part headers around the files.
const MULTIPART_OVERHEAD = 256 * 1024

function megabytes(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(0)} MB`
}

export function readOperatorUpload(event: H3Event, maxFileBytes: number): Promise<IncomingFile[]> {
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
    const files: IncomingFile[] = []
    let done = false
    // The first refusal ends the upload at once: nothing more of the body is read.
    const fail = (error: Error) => {
      if (done) return
      done = true
      for (const f of files) f.close()
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
      const file = new IncomingFile(cleanFileName(info.filename, `upload-${files.length + 1}.csv`))
      files.push(file)
      // Only the first bytes are kept here, to tell the file's type.
      const head: Buffer[] = []
      let headBytes = 0
      let sniffed = false
      const sniff = () => {
        sniffed = true
        const found = sniffFile(Buffer.concat(head, headBytes).subarray(0, SNIFF_BYTES))
        if (!found.text) fail(httpError(415, `${file.name} is ${found.kind}, not a pull file. Send the pulls as CSV text files. Nothing of this upload was kept.`))
      }
      stream.on('data', (chunk: Buffer) => {
        if (done) return
        if (!sniffed) {
          head.push(Buffer.from(chunk.subarray(0, SNIFF_BYTES - headBytes)))
          headBytes += Math.min(chunk.length, SNIFF_BYTES - headBytes)
          if (headBytes >= SNIFF_BYTES) sniff()
        }
        if (!done) file.add(chunk)
      })
      stream.on('limit', () => fail(httpError(413, `${file.name} is larger than ${megabytes(maxFileBytes)}; files up to ${megabytes(maxFileBytes)} are accepted. Nothing of this upload was kept.`)))
      stream.on('end', () => {
        if (!sniffed) sniff()
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
