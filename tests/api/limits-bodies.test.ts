// Body limits hold on the bytes that actually arrive: chunked bodies and lying
// Content-Length headers are cut off at the route's limit with 413, before the
// server takes in more; token routes refuse an unknown token before any body.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { streamBody } from '../support/streaming'
import { makeJpeg } from '../support/photos'
import { createBenchTest, DEMO, expectOk, newWriter, pullCsv, uploadFiles } from '../support/workspace'

afterAll(closeTestDb)

const MB = 1024 * 1024
// Past the limit the server stops reading; what is in flight by then (socket buffers
// on both sides; loopback buffers autotune to several MB each, and the server keeps
// draining a little while its 413 reaches a slow client) is all that may have gone out
// before the answer: a third at most of the 200 MB these tests offer. A server that
// read the whole body would take all of it. (33.8 MB went out once on a loaded machine.)
const IN_FLIGHT = 64 * MB

let writer: Client
let benchTestId: number

beforeAll(async () => {
  writer = (await newWriter()).client
  benchTestId = (await createBenchTest(writer, 'Body limit bench test')).id
})

async function serverMemoryMb(): Promise<number> {
  const admin = await signedIn(DEMO.admin)
  return expectOk(await admin.get('/api/admin/runtime')).memory.rssMb
}

describe('body limits', () => {
  it('cuts off a chunked JSON body at its limit (16 KB for the account routes) with 413, on an anonymous route', async () => {
    const res = await streamBody('/api/auth/login', { headers: { 'content-type': 'application/json' }, head: '{"email":"a@b.example","password":"', totalBytes: 200 * MB })
    expect(res.status).toBe(413)
    expect(res.sentAll).toBe(false)
    expect(res.sentBeforeAnswer).toBeLessThan(IN_FLIGHT)
    expect(JSON.parse(res.body).message).toMatch(/larger than 16 KB/)
    expect((await new Client().get('/api/health')).status).toBe(200)
  })

  it('refuses a declared Content-Length over the limit before reading', async () => {
    const res = await streamBody('/api/auth/password-reset', { headers: { 'content-type': 'application/json', 'content-length': String(200 * MB) }, totalBytes: 200 * MB })
    expect(res.status).toBe(413)
    expect(res.sentBeforeAnswer).toBeLessThan(IN_FLIGHT)
  })

  it('applies the limit to every body-reading route, signed in too', async () => {
    for (const path of ['/api/stories', `/api/bench-tests/${benchTestId}/setups`, `/api/bench-tests/${benchTestId}`]) {
      const method = path.endsWith(`${benchTestId}`) ? 'PATCH' : 'POST'
      const res = await streamBody(path, { method, headers: { 'content-type': 'application/json', 'cookie': writer.cookie }, head: '{"title":"', totalBytes: 200 * MB })
      expect(res.status, path).toBe(413)
      expect(res.sentBeforeAnswer, path).toBeLessThan(IN_FLIGHT)
    }
  })

  it('cuts off the import check past its own limit (60 MB), chunked', async () => {
    const res = await streamBody(`/api/bench-tests/${benchTestId}/pulls/preview`, { headers: { 'content-type': 'application/json', 'cookie': writer.cookie }, head: '{"files":[{"name":"a.csv","text":"', totalBytes: 300 * MB })
    expect(res.status).toBe(413)
    expect(res.sentBeforeAnswer).toBeLessThan(60 * MB + IN_FLIGHT)
  })

  it('cuts off a chunked photo upload at 40 MB, and takes a chunked photo under it', async () => {
    const boundary = 'x-limits-boundary'
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`
    const res = await streamBody(`/api/bench-tests/${benchTestId}/photos`, { headers: { 'content-type': `multipart/form-data; boundary=${boundary}`, 'cookie': writer.cookie }, head, totalBytes: 300 * MB })
    expect(res.status).toBe(413)
    expect(res.sentBeforeAnswer).toBeLessThan(40 * MB + IN_FLIGHT)

    // The same route through the same reader, chunked (no Content-Length), under the limit.
    const form = new FormData()
    form.append('file', new Blob([new Uint8Array(await makeJpeg(320, 200))], { type: 'image/jpeg' }), 'chunked.jpg')
    const encoded = new Response(form)
    const type = encoded.headers.get('content-type')!
    const bytes = new Uint8Array(await encoded.arrayBuffer())
    const chunked = new ReadableStream({ start(c) { for (let i = 0; i < bytes.length; i += 4096) c.enqueue(bytes.subarray(i, i + 4096)); c.close() } })
    const ok = await fetch(`${writer.base}/api/bench-tests/${benchTestId}/photos`, { method: 'POST', headers: { 'content-type': type, 'cookie': writer.cookie, 'origin': new URL(writer.base).origin }, body: chunked, duplex: 'half' } as RequestInit)
    expect(ok.status).toBe(201)
  })

  it('keeps the server up and small while bodies are refused side by side', async () => {
    const before = await serverMemoryMb()
    const replies = await Promise.all(Array.from({ length: 6 }, () => streamBody('/api/auth/register', { headers: { 'content-type': 'application/json' }, head: '{"email":"', totalBytes: 100 * MB })))
    expect(replies.map(r => r.status)).toEqual(Array(6).fill(413))
    expect((await new Client().get('/api/health')).status).toBe(200)
    expect(await serverMemoryMb()).toBeLessThan(before + 100)
  })
})

describe('the operator upload link', () => {
  const boundary = 'x-upload-boundary'
  const fileHead = (name: string) => `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\n`

  async function newLink(maxFiles = 10) {
    return expectOk(await writer.post(`/api/bench-tests/${benchTestId}/operator-links`, { expiresInHours: 2, maxFiles }), 201)
  }

  it('refuses an unknown token before reading its body', async () => {
    const res = await streamBody(`/api/upload/${'u'.repeat(43)}`, { headers: { 'content-type': `multipart/form-data; boundary=${boundary}` }, head: fileHead('a.csv'), totalBytes: 500 * MB })
    expect(res.status).toBe(404)
    expect(res.sentBeforeAnswer).toBeLessThan(IN_FLIGHT)
  })

  it('refuses a revoked token before reading its body', async () => {
    const { token, link } = await newLink()
    expectOk(await writer.post(`/api/bench-tests/${benchTestId}/operator-links/${link.id}/revoke`))
    const res = await streamBody(`/api/upload/${token}`, { headers: { 'content-type': `multipart/form-data; boundary=${boundary}` }, head: fileHead('a.csv'), totalBytes: 500 * MB })
    expect(res.status).toBe(410)
    expect(res.sentBeforeAnswer).toBeLessThan(IN_FLIGHT)
  })

  it('cuts off a chunked file over the link\'s 5 MB as it streams', async () => {
    const { token, link } = await newLink()
    const res = await streamBody(`/api/upload/${token}`, { headers: { 'content-type': `multipart/form-data; boundary=${boundary}` }, head: `${fileHead('endless.csv')}RPM,Torque (lb-ft)\n`, filler: Buffer.from('3000,400\n'.repeat(7000)), totalBytes: 500 * MB })
    expect(res.status).toBe(413)
    expect(JSON.parse(res.body).message).toMatch(/^endless\.csv is larger than 5 MB/)
    expect(res.sentBeforeAnswer).toBeLessThan(5 * MB + IN_FLIGHT)
    expect(Number((await testDb()('inbox_files').where({ operator_link_id: link.id }).count({ n: '*' }).first())?.n)).toBe(0)
  })

  it('decides the type from the bytes: a JPEG named .csv is refused and not counted', async () => {
    const { token, link } = await newLink(2)
    const jpeg = new Uint8Array([0xFF, 0xD8, 0xFF, 0xE0, 0x00, 0x10, 0x4A, 0x46, 0x49, 0x46, 0x00, 0x01, ...Array(2000).fill(0x41)])
    const good = { name: 'pull.csv', text: pullCsv({ seed: 3 }).csv }
    const res = await uploadFiles(token, [good, { name: 'pull-2.csv', text: jpeg }])
    expect(res.status).toBe(415)
    expect(res.body.message).toMatch(/^pull-2\.csv is a JPEG image, not a pull file/)
    const binary = await uploadFiles(token, [{ name: 'log.csv', text: new Uint8Array([0x52, 0x50, 0x4D, 0x00, 0x01, 0x02, 0x0A]) }])
    expect(binary.status).toBe(415)
    const row = await testDb()('operator_links').where({ id: link.id }).first()
    expect(row.files_received).toBe(0)
    expect(expectOk(await new Client().get(`/api/upload/${token}`)).filesLeft).toBe(2)
    expect((await uploadFiles(token, [good])).status).toBe(201)
  })
})
