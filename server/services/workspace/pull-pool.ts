// Pull checks run in a small piscina pool of worker threads, so a writer checking
// 60 MB of files never holds up other requests. Bounded: PULL_CHECK_THREADS threads
// (1 by default: machines this runs on have few cores and readers come first) and a
// queue of PULL_CHECK_QUEUE checks per server; past that the request is answered 503
// with Retry-After rather than queued without end.
import { availableParallelism } from 'node:os'
import { Piscina } from 'piscina'
import { createError } from 'h3'
import checkInWorker from '../../pull-worker/pull-check-worker'
import type { ColumnRole, CorrectionStandard } from '../../../shared/dyno/index'
import type { PullFilePreview } from '../../../shared/types/workspace'
import type { PullCheckAnswer, PullCheckRefusal, PullCheckTask, PullImportAnswer, StoredPullToCheck } from './pull-check-task'
import type { CheckedPull } from './pull-import'
import { findWorkerFile } from '../../utils/worker-files'

const WORKER_FILE = 'pull-check-worker.mjs'

function envInt(name: string, fallback: number, min: number, max: number): number {
  const value = Number(process.env[name] ?? fallback)
  return Number.isFinite(value) ? Math.min(max, Math.max(min, Math.round(value))) : fallback
}

let pool: Piscina | null | undefined

/** The pool, or null when the worker file is missing (development from sources): then checks run inline. */
function checkPool(): Piscina | null {
  if (pool !== undefined) return pool
  const filename = findWorkerFile(WORKER_FILE, process.env.PULL_CHECK_WORKER_FILE)
  if (!filename) {
    console.warn(`[pull-check] ${WORKER_FILE} not found: pull checks run on the server's own thread (build the server to get the pool)`)
    pool = null
    return pool
  }
  const threads = envInt('PULL_CHECK_THREADS', 1, 1, Math.max(1, availableParallelism() - 1))
  pool = new Piscina({
    filename,
    minThreads: 1,
    maxThreads: threads,
    maxQueue: envInt('PULL_CHECK_QUEUE', 8, 0, 1000),
    idleTimeout: 60_000,
    // A pathological file stops its own thread, not the server.
    resourceLimits: { maxOldGenerationSizeMb: 768 },
  })
  return pool
}

/** Checks handed to the pool since start, by kind (the tests see which paths use it). */
const sent: Record<PullCheckTask['kind'], number> = { 'preview-body': 0, 'import-body': 0, 'files': 0, 'batch-files': 0 }

export function pullCheckStats(): { threads: number, running: number, queued: number, sent: Record<PullCheckTask['kind'], number> } {
  const p = pool ?? null
  return { threads: p?.threads.length ?? 0, running: p ? p.utilization : 0, queued: p?.queueSize ?? 0, sent: { ...sent } }
}

const busy = () => createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: 'The server is checking as many files as it can right now. Try again in a few seconds.', data: { retryAfterSeconds: 5 } })

async function run(task: PullCheckTask, transfer: ArrayBuffer[]): Promise<PullCheckAnswer | PullImportAnswer> {
  const p = checkPool()
  if (!p) return checkInWorker(task)
  sent[task.kind]++
  try {
    // Piscina's TransferList type follows postMessage's older overload; an ArrayBuffer list is what it moves.
    return await p.run(task, { transferList: transfer as unknown as Parameters<Piscina['run']>[1] extends { transferList?: infer T } ? T : never }) as PullCheckAnswer | PullImportAnswer
  }
  catch (error) {
    if (/queue is at limit/i.test((error as Error).message)) throw busy()
    throw createError({ statusCode: 500, statusMessage: 'Internal Server Error', message: 'The file check stopped unexpectedly; the file may be too large or malformed. Try a smaller file.' })
  }
}

const STATUS_TEXT = { 400: 'Validation Error', 413: 'Content Too Large', 422: 'Unprocessable Content' } as const

function refused(answer: PullCheckRefusal): never {
  throw createError({ statusCode: answer.status, statusMessage: STATUS_TEXT[answer.status], message: answer.message, ...(answer.data === undefined ? {} : { data: answer.data }) })
}

function answered(answer: PullCheckAnswer | PullImportAnswer): PullFilePreview[] {
  if (!answer.ok) refused(answer)
  return (answer as { previews: PullFilePreview[] }).previews
}

/** A request body's pieces (readLimitedBodySegments), moved to the worker rather than copied. */
function bodyTask(body: Uint8Array<ArrayBuffer>[]): { body: Uint8Array[], transfer: ArrayBuffer[] } {
  return { body, transfer: body.map(piece => piece.buffer) }
}

/** A preview request's JSON body, parsed, validated and checked in the pool. */
export async function checkPreviewBody(pieces: Uint8Array<ArrayBuffer>[]): Promise<PullFilePreview[]> {
  const { body, transfer } = bodyTask(pieces)
  return answered(await run({ kind: 'preview-body', body }, transfer))
}

/**
 * An import request's JSON body, parsed, validated (CommitPullsBody) and checked as a
 * batch in the pool: 400/413 as the preview answers them, 422 for a refused batch.
 */
export async function checkImportBody(pieces: Uint8Array<ArrayBuffer>[], standard: CorrectionStandard): Promise<CheckedPull[]> {
  const { body, transfer } = bodyTask(pieces)
  const answer = await run({ kind: 'import-body', body, standard }, transfer)
  if (!answer.ok) refused(answer)
  return (answer as { pulls: CheckedPull[] }).pulls
}

/** Uploaded files checked in the pool; previews in the same order. */
export async function checkUploadedFiles(files: { name: string, bytes: Uint8Array, mapping?: Record<string, ColumnRole> }[]): Promise<PullFilePreview[]> {
  return answered(await run({ kind: 'files', files }, []))
}

/**
 * Stored files (an inbox assignment, a file filed into a dyno day's step) checked as one
 * batch in the pool, bytes and all: a refused batch throws 422 with every file's preview,
 * as checkPullBatch does; 413 past the rows cap; 503 with Retry-After for a full pool.
 */
export async function checkStoredPullBatch(files: StoredPullToCheck[], standard: CorrectionStandard): Promise<CheckedPull[]> {
  const answer = await run({ kind: 'batch-files', files, standard }, [])
  if (!answer.ok) refused(answer)
  return (answer as { pulls: CheckedPull[] }).pulls
}

/** Answers 503 with Retry-After for a full pool; used by the routes' error paths. */
export function retryAfterOf(error: unknown): number | undefined {
  return (error as { data?: { retryAfterSeconds?: number } }).data?.retryAfterSeconds
}
