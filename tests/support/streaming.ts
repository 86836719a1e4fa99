// Sends a request body as an attacker would: chunked (no Content-Length) or with a
// Content-Length that lies, chunk by chunk, and notes how much had gone out when the
// answer came. A server that buffers the whole body answers only at the end.
import { request } from 'node:http'
import { BASE_URL } from './http'

export interface StreamedReply {
  status: number
  body: string
  /** Body bytes written before the status line arrived. */
  sentBeforeAnswer: number
  /** The whole body was sent before the answer. */
  sentAll: boolean
}

export function streamBody(path: string, opts: {
  method?: string
  headers?: Record<string, string>
  /** Written first, then `filler` until the answer comes or totalBytes are out. */
  head?: Uint8Array | string
  filler?: Uint8Array
  totalBytes: number
}): Promise<StreamedReply> {
  const url = new URL(path, BASE_URL)
  const filler = opts.filler ?? Buffer.alloc(64 * 1024, 0x61)
  return new Promise((resolve, reject) => {
    let sent = 0
    let answered = false
    let sentBeforeAnswer = 0
    const req = request(url, { method: opts.method ?? 'POST', headers: { origin: url.origin, ...opts.headers } }, (res) => {
      answered = true
      sentBeforeAnswer = sent
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => {
        req.destroy()
        resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8'), sentBeforeAnswer, sentAll: sent >= opts.totalBytes })
      })
      res.on('error', reject)
    })
    req.on('error', (error) => {
      if (!answered) reject(error)
    })
    const write = () => {
      while (!answered && sent < opts.totalBytes) {
        const chunk = sent === 0 && opts.head ? Buffer.from(opts.head) : filler.subarray(0, Math.min(filler.length, opts.totalBytes - sent))
        sent += chunk.length
        if (!req.write(chunk)) {
          req.once('drain', write)
          return
        }
      }
      if (!answered) req.end()
    }
    write()
  })
}
