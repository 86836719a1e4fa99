import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { Photo, PhotoConflictData, PhotoGallery, PhotoMime, PhotoMissingAltText, PhotoUploadResult, PhotoVariant, UpdatePhotoBody } from '#shared/types/photos'
import type { CurrentUser } from '#shared/types/users'
import type { z } from 'zod'
import type { PhotoRecord } from './access'
import type { InspectedPhoto } from './bytes'
import type { PhotoUpload } from './upload'
import { requirePhoto } from './access'
import { inspectPhotoBytes, PhotoRefusal } from './bytes'
import { enqueuePhotoJob, nudgePhotoJobs } from './jobs'
import { deletePhotoObjects, listPhotoObjects, newPhotoPrefix, photoOriginalKey, putPhotoObject, whilePhotoStorageAnswers } from './storage'
import { requireBenchTest } from '../workspace/bench-test-access'

export interface StoredVariant { width: number, height: number, bytes: number, key: string }

/** MariaDB JSON is LONGTEXT: a broken or odd value reads as no variants. */
export function parseStoredVariants(raw: unknown): StoredVariant[] {
  if (typeof raw !== 'string' || !raw) return []
  try {
    const list = JSON.parse(raw) as unknown
    if (!Array.isArray(list)) return []
    return list.filter((v): v is StoredVariant => !!v && typeof v === 'object'
      && Number.isInteger(v.width) && Number.isInteger(v.height) && typeof v.key === 'string')
  }
  catch { return [] }
}

const iso = (value: Date | string) => new Date(value).toISOString()

export function toPhoto(row: PhotoRecord): Photo {
  const processedAt = row.processed_at ? new Date(row.processed_at) : null
  // The stamp changes when the photo is sized again, so caches never keep an old size.
  const stamp = processedAt ? `?v=${processedAt.getTime().toString(36)}` : ''
  const variants: PhotoVariant[] = row.status === 'ready'
    ? parseStoredVariants(row.variants)
        .sort((a, b) => a.width - b.width)
        .map(v => ({ width: v.width, height: v.height, bytes: v.bytes, url: `/photos/${row.id}/${v.width}${stamp}` }))
    : []
  return {
    id: row.id,
    benchTestId: row.bench_test_id,
    status: row.status,
    failureReason: row.status === 'failed' ? row.failure_reason : null,
    originalName: row.original_name,
    mime: row.mime as PhotoMime,
    bytes: row.bytes,
    width: row.width,
    height: row.height,
    sha256: row.sha256,
    caption: row.caption,
    credit: row.credit,
    altText: row.alt_text,
    position: row.position,
    isHero: Boolean(row.is_hero),
    version: row.version,
    variants,
    originalUrl: `/photos/${row.id}/original`,
    uploadedBy: row.uploaded_by,
    createdAt: iso(row.created_at),
    updatedAt: iso(row.updated_at),
    processedAt: processedAt?.toISOString() ?? null,
  }
}

const galleryOrder = (q: Knex.QueryBuilder) => q.orderBy('photos.position').orderBy('photos.id')

export async function listPhotos(db: Db, user: CurrentUser, benchTestId: number): Promise<PhotoGallery> {
  const benchTest = await requireBenchTest(db, user, benchTestId)
  const rows = await galleryOrder(db('photos').where('bench_test_id', benchTest.id)) as PhotoRecord[]
  return { benchTest: { id: benchTest.id, title: benchTest.title }, photos: rows.map(toPhoto), missingAltText: await photosMissingAltText(db, benchTest.id) }
}

function findSameFile(db: Db, benchTestId: number, sha256: string): Promise<PhotoRecord | undefined> {
  return db<PhotoRecord>('photos').where({ bench_test_id: benchTestId, sha256 }).first()
}

/**
 * Stores an upload: checked from its bytes, the original put in S3 first, then
 * the row and its job in one transaction, so no row ever lacks its object; when
 * the insert fails the object is deleted again. The same file twice in one bench
 * test answers with the photo already there.
 */
export async function storeUploadedPhoto(db: Db, user: CurrentUser, benchTestId: number, upload: PhotoUpload): Promise<PhotoUploadResult> {
  let inspected: InspectedPhoto
  try {
    inspected = inspectPhotoBytes(upload.bytes)
  }
  catch (error) {
    if (error instanceof PhotoRefusal) {
      throw createError({ statusCode: error.status, statusMessage: error.status === 415 ? 'Unsupported Media Type' : 'Unprocessable Entity', message: error.message })
    }
    throw error
  }
  const existing = await findSameFile(db, benchTestId, upload.sha256)
  if (existing) return { photo: toPhoto(existing), duplicate: true }

  const prefix = newPhotoPrefix(benchTestId)
  const originalKey = photoOriginalKey(prefix)
  await whilePhotoStorageAnswers(() => putPhotoObject(originalKey, upload.bytes, inspected.mime, upload.sha256))
  try {
    const row = await db.transaction(async (trx) => {
      // Uploads side by side into one bench test take their places one after the other.
      await trx('bench_tests').where({ id: benchTestId }).forUpdate().first('id')
      const last = await trx('photos').where('bench_test_id', benchTestId).max({ position: 'position' }).first()
      const [id] = await trx('photos').insert({
        bench_test_id: benchTestId,
        status: 'pending',
        storage_prefix: prefix,
        original_key: originalKey,
        mime: inspected.mime,
        original_name: upload.filename,
        bytes: upload.bytes.length,
        sha256: upload.sha256,
        width: inspected.width,
        height: inspected.height,
        orientation: inspected.orientation,
        caption: '', // knex leaves out defaults of TEXT columns on MariaDB
        position: last?.position === null || last?.position === undefined ? 0 : Number(last.position) + 1,
        uploaded_by: user.id,
      })
      await enqueuePhotoJob(trx, Number(id))
      return (await trx<PhotoRecord>('photos').where({ id }).first())!
    })
    nudgePhotoJobs()
    return { photo: toPhoto(row), duplicate: false }
  }
  catch (error) {
    await deletePhotoObjects([originalKey]).catch(() => { /* left for the orphan sweep */ })
    if (isDuplicateEntry(error)) {
      const raced = await findSameFile(db, benchTestId, upload.sha256)
      if (raced) return { photo: toPhoto(raced), duplicate: true }
    }
    throw error
  }
}

/** Moves one photo to `position` among its bench test's photos; the rest close up around it. */
async function placePhoto(trx: Knex.Transaction, benchTestId: number, photoId: number, position: number): Promise<void> {
  const rows = await galleryOrder(trx('photos').where('bench_test_id', benchTestId).forUpdate().select('id', 'position')) as { id: number, position: number }[]
  const ids = rows.map(r => r.id).filter(id => id !== photoId)
  ids.splice(Math.min(position, ids.length), 0, photoId)
  for (const [index, id] of ids.entries()) {
    if (rows.find(r => r.id === id)?.position !== index) await trx('photos').where({ id }).update({ position: index })
  }
}

function staleEdit(current: PhotoRecord): never {
  const data: PhotoConflictData = { currentVersion: current.version, current: toPhoto(current) }
  throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This photo was changed by someone else since you opened it. Their version is shown; make your change again.', data })
}

/** Caption, credit, alt text, order and hero flag; the version read must still be current (else 409). */
export async function updatePhotoMeta(db: Db, user: CurrentUser, id: number, body: z.output<typeof UpdatePhotoBody>): Promise<Photo> {
  const row = await db.transaction(async (trx) => {
    const photo = await requirePhoto(trx, user, id)
    const patch: Record<string, unknown> = {}
    if (body.caption !== undefined) patch.caption = body.caption
    if (body.credit !== undefined) patch.credit = body.credit
    if (body.altText !== undefined) patch.alt_text = body.altText
    if (body.isHero !== undefined) patch.is_hero = body.isHero
    const count = await trx('photos').where({ id, version: body.version }).update({ ...patch, version: trx.raw('version + 1') })
    if (!count) staleEdit((await trx<PhotoRecord>('photos').where({ id }).first())!)
    // Others lose the hero flag without a version bump: their own edits stay valid.
    if (body.isHero) await trx('photos').where('bench_test_id', photo.bench_test_id).whereNot({ id }).where('is_hero', true).update({ is_hero: false })
    if (body.position !== undefined) await placePhoto(trx, photo.bench_test_id, id, body.position)
    return (await trx<PhotoRecord>('photos').where({ id }).first())!
  })
  return toPhoto(row)
}

/** Deletes the row first (an object without a row is harmless and swept), then every object under its prefix. */
export async function deletePhoto(db: Db, user: CurrentUser, id: number): Promise<void> {
  const photo = await requirePhoto(db, user, id)
  await db('photos').where({ id: photo.id }).delete()
  try {
    const objects = await listPhotoObjects(`${photo.storage_prefix}/`)
    await deletePhotoObjects(objects.map(o => o.key))
  }
  catch (error) {
    console.warn(`photo ${photo.id}: objects left for the orphan sweep:`, (error as Error).message)
  }
}

/** A failed photo goes back in the queue; anything else is refused (409). */
export async function retryPhoto(db: Db, user: CurrentUser, id: number): Promise<Photo> {
  const photo = await requirePhoto(db, user, id)
  if (photo.status !== 'failed') {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Only a photo whose processing failed can be tried again.', data: { current: toPhoto(photo) } })
  }
  const row = await db.transaction(async (trx) => {
    await trx('photos').where({ id, status: 'failed' }).update({ status: 'pending', failure_reason: null })
    await enqueuePhotoJob(trx, id)
    return (await trx<PhotoRecord>('photos').where({ id }).first())!
  })
  nudgePhotoJobs()
  return toPhoto(row)
}

/** For issue 6: a story may go to review only when every photo of its bench test has alt text. */
export async function photosMissingAltText(db: Db, benchTestId: number): Promise<PhotoMissingAltText[]> {
  const rows = await galleryOrder(db('photos').where('bench_test_id', benchTestId).where('alt_text', '').select('id', 'original_name')) as { id: number, original_name: string }[]
  return rows.map(r => ({ id: r.id, originalName: r.original_name }))
}
