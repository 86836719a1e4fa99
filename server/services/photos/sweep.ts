import type { Db } from '../../utils/db'
import type { PhotoRecord } from './access'
import { enqueuePhotoJob, nudgePhotoJobs } from './jobs'
import { parseStoredVariants } from './photos'
import { deletePhotoObjects, listPhotoObjects } from './storage'

export interface PhotoSweepReport {
  objectsChecked: number
  photosChecked: number
  /** Objects with no photo row, deleted. */
  orphanObjectsDeleted: number
  /** Photos whose original is gone: marked failed with the reason. */
  originalsMissing: number
  /** Ready photos with a web size gone: queued to be sized again. */
  resized: number
}

/**
 * Keeps S3 and the photos table in agreement. Only things older than the grace
 * period are touched: an upload puts its object a moment before its row exists,
 * and a job puts sizes a moment before the row lists them.
 */
export async function sweepPhotoStorage(db: Db, graceSeconds = 3600): Promise<PhotoSweepReport> {
  const cutoff = Date.now() - graceSeconds * 1000
  const objects = await listPhotoObjects()
  const rows = await db<PhotoRecord>('photos').select('id', 'status', 'storage_prefix', 'original_key', 'variants', 'created_at', 'processed_at')
  const present = new Set(objects.map(o => o.key))
  const prefixes = new Set(rows.map(r => `${r.storage_prefix}/`))
  const prefixOf = (key: string) => key.slice(0, key.lastIndexOf('/') + 1)

  const orphans = objects.filter(o => !prefixes.has(prefixOf(o.key)) && o.lastModified.getTime() < cutoff).map(o => o.key)
  await deletePhotoObjects(orphans)

  let originalsMissing = 0
  let resized = 0
  for (const row of rows) {
    if (new Date(row.created_at).getTime() >= cutoff) continue
    if (!present.has(row.original_key)) {
      if (row.status === 'failed') continue
      await db('photos').where({ id: row.id }).update({ status: 'failed', failure_reason: 'The uploaded file is missing from storage. Delete this photo and upload it again.' })
      originalsMissing++
      continue
    }
    const sizedLongAgo = row.processed_at && new Date(row.processed_at).getTime() < cutoff
    if (row.status === 'ready' && sizedLongAgo && parseStoredVariants(row.variants).some(v => !present.has(v.key))) {
      await db.transaction(async (trx) => {
        await trx('photos').where({ id: row.id, status: 'ready' }).update({ status: 'pending' })
        await enqueuePhotoJob(trx, row.id)
      })
      resized++
    }
  }
  if (resized) nudgePhotoJobs()
  return { objectsChecked: objects.length, photosChecked: rows.length, orphanObjectsDeleted: orphans.length, originalsMissing, resized }
}
