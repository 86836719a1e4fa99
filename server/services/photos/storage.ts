import { randomUUID } from 'node:crypto'
import type { Readable } from 'node:stream'
import { DeleteObjectsCommand, GetObjectCommand, ListObjectsV2Command, PutObjectCommand } from '@aws-sdk/client-s3'

// Photo objects in the configured bucket. Keys are made here from ids and a
// random part, never from a file's name; objects are private (no ACL is set), and
// readers get them only through server/routes/photos/.
export const PHOTO_KEY_ROOT = 'photos/'

export function newPhotoPrefix(benchTestId: number): string {
  return `${PHOTO_KEY_ROOT}${benchTestId}/${randomUUID()}`
}

export const photoOriginalKey = (prefix: string) => `${prefix}/original`
export const photoVariantKey = (prefix: string, width: number) => `${prefix}/w${width}.jpg`

const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN'])

function storageUnreachable(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e && depth < 4; e = (e as { cause?: unknown }).cause, depth++) {
    const { code, name, $metadata } = e as { code?: string, name?: string, $metadata?: { httpStatusCode?: number } }
    if ((code && NETWORK_CODES.has(code)) || name === 'TimeoutError' || ($metadata?.httpStatusCode ?? 0) >= 500) return true
  }
  return false
}

/**
 * For request paths: storage that does not answer is a 503 that says so. Made
 * without a cause on purpose: the error hook (server/plugins/errors.ts) would
 * read a connection refusal in the cause as "the database is not reachable".
 */
export async function whilePhotoStorageAnswers<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work()
  }
  catch (error) {
    if (!storageUnreachable(error)) throw error
    throw createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: 'Photo storage is not reachable right now. Try again in a moment.' })
  }
}

/** `sha256Hex`: the body's SHA-256 when the caller has it (an upload is hashed as it streams in). */
export async function putPhotoObject(key: string, body: Uint8Array, contentType: string, sha256Hex?: string): Promise<void> {
  const command = new PutObjectCommand({ Bucket: appConfig().s3.bucket, Key: key, Body: body, ContentType: contentType })
  await useS3().send(sha256Hex ? withKnownPayloadSha256(command, sha256Hex) : command)
}

function isMissing(error: unknown): boolean {
  const e = error as { name?: string, $metadata?: { httpStatusCode?: number } }
  return e?.name === 'NoSuchKey' || e?.name === 'NotFound' || e?.$metadata?.httpStatusCode === 404
}

export interface PhotoObjectStream { body: Readable, contentLength?: number, etag?: string, notModified: boolean }

/** A stream for the reader route; null when missing, notModified when the ETag still matches. */
export async function streamPhotoObject(key: string, ifNoneMatch?: string): Promise<PhotoObjectStream | null> {
  try {
    const answer = await useS3().send(new GetObjectCommand({ Bucket: appConfig().s3.bucket, Key: key, IfNoneMatch: ifNoneMatch }))
    return { body: answer.Body as Readable, contentLength: answer.ContentLength, etag: answer.ETag, notModified: false }
  }
  catch (error) {
    if ((error as { $metadata?: { httpStatusCode?: number } })?.$metadata?.httpStatusCode === 304) {
      return { body: undefined as unknown as Readable, etag: ifNoneMatch, notModified: true }
    }
    if (isMissing(error)) return null
    throw error
  }
}

export async function deletePhotoObjects(keys: string[]): Promise<void> {
  for (let i = 0; i < keys.length; i += 1000) {
    const batch = keys.slice(i, i + 1000)
    if (!batch.length) continue
    await useS3().send(new DeleteObjectsCommand({
      Bucket: appConfig().s3.bucket,
      Delete: { Objects: batch.map(Key => ({ Key })), Quiet: true },
    }))
  }
}

export interface StoredPhotoObject { key: string, lastModified: Date }

/** Every object under the photo root (ListObjectsV2, page by page). */
export async function listPhotoObjects(prefix = PHOTO_KEY_ROOT): Promise<StoredPhotoObject[]> {
  const found: StoredPhotoObject[] = []
  let token: string | undefined
  do {
    const page = await useS3().send(new ListObjectsV2Command({ Bucket: appConfig().s3.bucket, Prefix: prefix, ContinuationToken: token }))
    for (const item of page.Contents ?? []) {
      if (item.Key) found.push({ key: item.Key, lastModified: item.LastModified ?? new Date(0) })
    }
    token = page.IsTruncated ? page.NextContinuationToken : undefined
  } while (token)
  return found
}
