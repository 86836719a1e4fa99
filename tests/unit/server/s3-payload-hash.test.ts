// A photo's known SHA-256 goes out as the signed payload hash (server/utils/s3-payload-hash.ts).
// AWS Signature Version 4 (AWS S3 API reference, "Authenticating Requests: Using the
// Authorization Header"): x-amz-content-sha256 is the hex SHA-256 of the payload and is
// among the signed headers. The SDK is real and sends real HTTP to a local server that
// records what arrives (there is no need for a store to answer a PutObject with 200).
import { createHash } from 'node:crypto'
import { createServer, type IncomingHttpHeaders, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PAYLOAD_SHA256_HEADER, withKnownPayloadSha256 } from '../../../server/utils/s3-payload-hash'

let server: Server
let client: S3Client
const received: { headers: IncomingHttpHeaders, body: Buffer }[] = []

beforeAll(async () => {
  server = createServer((req, res) => {
    const chunks: Buffer[] = []
    req.on('data', (c: Buffer) => chunks.push(c))
    req.on('end', () => {
      received.push({ headers: req.headers, body: Buffer.concat(chunks) })
      res.writeHead(200, { ETag: '"stored"' }).end()
    })
  })
  await new Promise<void>(resolve => server.listen(0, '127.0.0.1', resolve))
  client = new S3Client({
    region: 'us-east-1',
    endpoint: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    forcePathStyle: true,
    credentials: { accessKeyId: 'test-key', secretAccessKey: 'test-secret' },
  })
})

afterAll(() => {
  client.destroy()
  server.close()
})

const photo = Buffer.alloc(256 * 1024, 7)
const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex')
const put = () => new PutObjectCommand({ Bucket: 'photos', Key: 'original.jpg', Body: photo, ContentType: 'image/jpeg' })

async function sent(command: PutObjectCommand) {
  received.length = 0
  await client.send(command)
  expect(received).toHaveLength(1)
  return received[0]!
}

describe('withKnownPayloadSha256', () => {
  it('without it the SDK hashes the body itself (the header is the body\'s SHA-256)', async () => {
    const request = await sent(put())
    expect(request.headers[PAYLOAD_SHA256_HEADER]).toBe(sha256(photo))
  })

  it('with the body\'s hash: the same header, signed, and the body sent whole', async () => {
    const request = await sent(withKnownPayloadSha256(put(), sha256(photo)))
    expect(request.headers[PAYLOAD_SHA256_HEADER]).toBe(sha256(photo))
    expect(request.headers.authorization).toMatch(/SignedHeaders=[^,]*x-amz-content-sha256/)
    expect(sha256(request.body)).toBe(sha256(photo))
  })

  it('the signer takes the given hash as it is, without hashing the body again', async () => {
    // Another value than the body's hash: it arrives unchanged, so the SDK did not compute its own.
    const given = sha256(Buffer.from('not the photo'))
    const request = await sent(withKnownPayloadSha256(put(), given))
    expect(request.headers[PAYLOAD_SHA256_HEADER]).toBe(given)
  })
})
