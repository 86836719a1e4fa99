import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import { PHOTO_JPEG_QUALITY, PHOTO_WIDTHS } from '#shared/types/photos'
import type { JobRow } from '../../utils/jobs'
import type { PhotoRecord } from './access'
import type { StoredVariant } from './photos'
import { photoPoolSize, PhotoTaskError, runPhotoTask } from './pool'
import { deletePhotoObjects, photoVariantKey, putPhotoObject, streamPhotoObject } from './storage'

// Photo sizing as rows of the generic jobs table. Every app server runs the
// loop; SKIP LOCKED claims keep a job on one server, the lease is renewed while
// it runs, and a server that dies leaves a lease that runs out, after which
// another server (or this one, restarted) takes the job up again.

/**
 * PHOTO_QUEUE names a separate queue (kind 'photo.process:<name>'): servers with
 * it set enqueue and work only there. Lets a deployment dedicate servers to
 * photo work, and lets the crash test run servers of its own.
 */
export function photoJobKind(): string {
  const queue = process.env.PHOTO_QUEUE?.trim()
  return queue ? `photo.process:${queue}`.slice(0, 40) : 'photo.process'
}

const leaseSeconds = () => Math.max(2, Number(process.env.PHOTO_JOB_LEASE_SECONDS ?? 300))
const retryDelaySeconds = (attempts: number) => Number(process.env.PHOTO_RETRY_DELAY_SECONDS ?? 10) * attempts

export async function enqueuePhotoJob(trx: Knex.Transaction, photoId: number): Promise<number> {
  return enqueueJob(trx, photoJobKind(), { photoId }, { maxAttempts: 3 })
}

async function renewJobLease(db: Db, jobId: number, seconds: number): Promise<void> {
  await db('jobs').where({ id: jobId, status: 'running' }).update({ lease_until: db.raw('NOW(3) + INTERVAL ? SECOND', [seconds]) })
}

/** Sizes one photo: original from S3, sizes in a worker, sizes to S3, then the row says ready. */
export async function processPhotoJob(db: Db, job: JobRow): Promise<void> {
  const photoId = Number((job.payload as { photoId?: unknown } | null)?.photoId)
  const photo = await db<PhotoRecord>('photos').where({ id: photoId }).first()
  if (!photo) return // deleted while it waited
  if (job.attempts > job.max_attempts) {
    throw new PhotoTaskError(`Processing was cut off ${job.attempts - 1} times (the server stopped while sizing this photo). Try again, or export the photo smaller.`, true)
  }
  await db('photos').where({ id: photoId }).update({ status: 'processing', failure_reason: null })

  const original = await streamPhotoObject(photo.original_key)
  if (!original) throw new PhotoTaskError('The uploaded file is missing from storage. Delete this photo and upload it again.', true)
  const sized = await runPhotoTask({
    bytes: original.body,
    length: original.contentLength,
    mime: photo.mime,
    width: photo.width,
    height: photo.height,
    orientation: photo.orientation,
    widths: PHOTO_WIDTHS,
    quality: PHOTO_JPEG_QUALITY,
    attempt: job.attempts,
  })
  const variants: StoredVariant[] = sized.variants.map(v => ({ width: v.width, height: v.height, bytes: v.bytes.byteLength, key: photoVariantKey(photo.storage_prefix, v.width) }))
  await Promise.all(sized.variants.map((v, i) => putPhotoObject(variants[i]!.key, new Uint8Array(v.bytes), 'image/jpeg')))

  const updated = await db('photos').where({ id: photoId }).update({
    status: 'ready',
    width: sized.width,
    height: sized.height,
    variants: JSON.stringify(variants),
    processed_at: db.raw('NOW(3)'),
    failure_reason: null,
  })
  if (!updated) await deletePhotoObjects(variants.map(v => v.key)) // deleted while it was being sized
}

/** Words for the writer: our own failures say what happened; anything else stays in the log. */
function failureText(error: unknown): string {
  if (error instanceof PhotoTaskError) return error.message.slice(0, 500)
  return 'Processing failed because storage or the database did not answer. Try again in a moment.'
}

async function runClaimedPhotoJob(db: Db, job: JobRow): Promise<void> {
  const lease = leaseSeconds()
  const renewal = setInterval(() => { renewJobLease(db, job.id, lease).catch(() => { /* next tick tries again */ }) }, (lease * 1000) / 3)
  renewal.unref()
  const photoId = Number((job.payload as { photoId?: unknown } | null)?.photoId)
  try {
    await processPhotoJob(db, job)
    await finishJob(job.id)
  }
  catch (error) {
    if (!(error instanceof PhotoTaskError)) console.error(`photo job ${job.id} (photo ${photoId}):`, error)
    const permanent = error instanceof PhotoTaskError && error.permanent
    const outcome = await failJob(permanent ? { ...job, attempts: job.max_attempts } : job, error, retryDelaySeconds(job.attempts))
    await db('photos').where({ id: photoId }).update(outcome === 'failed'
      ? { status: 'failed', failure_reason: failureText(error) }
      : { status: 'pending', failure_reason: null })
  }
  finally {
    clearInterval(renewal)
  }
}

// Process-wide loop state (not per request): how many jobs this server runs now.
let active = 0
let filling = false
let loopStarted = false
// The loop's connection, given by whoever starts it (nudges from uploads use it too).
let loopDb: Db | undefined

/** Claims jobs while the pool has room; each finished job looks for the next. */
async function fillPhotoPool(): Promise<void> {
  if (filling || !loopStarted || !loopDb) return
  const db = loopDb
  filling = true
  try {
    while (active < photoPoolSize()) {
      const job = await claimJob([photoJobKind()], leaseSeconds())
      if (!job) break
      active++
      void runClaimedPhotoJob(db, job).finally(() => {
        active--
        void fillPhotoPool()
      })
    }
  }
  catch { /* database away: the next tick tries again */ }
  finally {
    filling = false
  }
}

/** Starts polling (server/plugins/photo-jobs.ts); returns the stop function. */
export function startPhotoJobLoop(db: Db, intervalMs = Number(process.env.PHOTO_POLL_MS ?? 1000)): () => void {
  loopDb = db
  loopStarted = true
  const timer = setInterval(() => { void fillPhotoPool() }, intervalMs)
  timer.unref()
  return () => {
    loopStarted = false
    clearInterval(timer)
  }
}

/** After an upload or retry: start at once instead of at the next poll. */
export function nudgePhotoJobs(): void {
  void fillPhotoPool()
}

export function photoJobsActive(): number {
  return active
}
