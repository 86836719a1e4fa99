// Pull checks run in a small piscina pool of worker threads, so a writer checking
// 60 MB of files never holds up other requests. Bounded: PULL_CHECK_THREADS threads
// (1 by default: machines this runs on have few cores and readers come first) and a
// queue of PULL_CHECK_QUEUE checks per server; past that the request is answered 503
// with Retry-After rather than queued without end.
import { availableParallelism } from 'node:os'
import { MessageChannel, type MessagePort } from 'node:worker_threads'
import { Piscina } from 'piscina'
import { createError, type H3Event } from 'h3'
import checkInWorker from '../../pull-worker/pull-check-worker'
import type { ColumnRole, CorrectionStandard } from '../../../shared/dyno/index'
import type { PullFilePreview } from '../../../shared/types/pull-imports'
import type { PullCheckAnswer, PullCheckRefusal, PullCheckTask, PullImportAnswer, StoredPullToCheck } from './pull-check-task'
import type { CheckedPull } from './pull-import'
import { findWorkerFile } from '../../utils/worker-files'
import { readLimitedBodyInto } from '../../utils/body-limit'
import { moveToPort, takeFromPort } from '../../utils/port-bytes'

const WORKER_FILE = 'pull-check-worker.mjs'

function envInt(name: string, fallback: number, min: number, max: number): number {
  const value = Number(process.env[name] ?? fallback)
  return Number.isFinite(value) ? Math.min(max, Math.max(min, Math.round(value))) : fallback
}

let pool: Piscina | null | undefined
let queueLimit = 0

/** The pool, or null when the worker file is missing (development from sources): then checks run inline. */
function checkPool(): Piscina | null {
  if (pool !== undefined) return pool
  const filename = findWorkerFile(WORKER_FILE, process.env.PULL_CHECK_WORKER_FILE)
  if (!filename) {
    // Only a built server is expected to have it: the demo seed and the tools run from
    // sources under tsx, where checking on their own thread is the plan, not a fault.
    if (process.env.NODE_ENV === 'production') console.warn(`[pull-check] ${WORKER_FILE} not found: pull checks run on the server's own thread`)
    pool = null
    return pool
  }
  const threads = envInt('PULL_CHECK_THREADS', 1, 1, Math.max(1, availableParallelism() - 1))
  queueLimit = envInt('PULL_CHECK_QUEUE', 8, 0, 1000)
  pool = new Piscina({
    filename,
    minThreads: 1,
    maxThreads: threads,
    maxQueue: queueLimit,
    idleTimeout: 60_000,
    // A pathological file stops its own thread, not the server.
    resourceLimits: { maxOldGenerationSizeMb: 768 },
  })
  return pool
}

/** Checks handed to the pool since start, by kind (the tests see which paths use it). */
const sent: Record<PullCheckTask['kind'], number> = { 'preview-body': 0, 'import-body': 0, 'files': 0, 'upload-files': 0, 'batch-files': 0 }

export function pullCheckStats(): { threads: number, running: number, queued: number, sent: Record<PullCheckTask['kind'], number> } {
  const p = pool ?? null
  return { threads: p?.threads.length ?? 0, running: p ? p.utilization : 0, queued: p?.queueSize ?? 0, sent: { ...sent } }
}

const busy = () => createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: 'The server is checking as many files as it can right now. Try again in a few seconds.', data: { retryAfterSeconds: 5 } })

type TransferList = Parameters<Piscina['run']>[1] extends { transferList?: infer T } ? T : never

async function run(task: PullCheckTask, transfer: MessagePort[]): Promise<PullCheckAnswer | PullImportAnswer> {
  const p = checkPool()
  // Inline, the worker's function takes the ports' chunks on this thread just the same.
  if (!p) return checkInWorker(task)
  sent[task.kind]++
  try {
    return await p.run(task, { transferList: transfer as unknown as TransferList }) as PullCheckAnswer | PullImportAnswer
  }
  catch (error) {
    // Piscina says "Task queue is at limit", or with PULL_CHECK_QUEUE=0 "No task queue available and all Workers are busy".
    if (/queue is at limit|no task queue available/i.test((error as Error).message)) throw busy()
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

/**
 * A check's request body (preview, import), received before the check is queued: its
 * chunks are moved into a channel as they arrive (readLimitedBodyInto) and wait there,
 * outside the server's heap, for the worker. A slow sender holds no check thread.
 */
export async function receiveCheckBody(event: H3Event): Promise<MessagePort> {
  const { port1, port2 } = new MessageChannel()
  try {
    await readLimitedBodyInto(event, port1)
  }
  catch (error) {
    port2.close()
    throw error
  }
  finally {
    // What was posted stays queued in port2.
    port1.close()
  }
  return port2
}

/** A preview request's JSON body (receiveCheckBody), joined, parsed, validated and checked in the pool. */
export async function checkPreviewBody(body: MessagePort): Promise<PullFilePreview[]> {
  return answered(await run({ kind: 'preview-body', body }, [body]))
}

/**
 * An import request's JSON body (receiveCheckBody), parsed, validated (CommitPullsBody)
 * and checked as a batch in the pool: 400/413 as the preview answers them, 422 for a refused batch.
 */
export async function checkImportBody(body: MessagePort, standard: CorrectionStandard): Promise<CheckedPull[]> {
  const answer = await run({ kind: 'import-body', body, standard }, [body])
  if (!answer.ok) refused(answer)
  return (answer as { pulls: CheckedPull[] }).pulls
}

/** Stored files checked in the pool; previews in the same order. */
export async function checkUploadedFiles(files: { name: string, bytes: Uint8Array, mapping?: Record<string, ColumnRole> }[]): Promise<PullFilePreview[]> {
  return answered(await run({ kind: 'files', files }, []))
}

/**
 * A file arriving in an upload: its chunks are moved into a channel as they arrive
 * (copied out of the multipart parser's buffers, 64 KB at a time), never joined on the
 * server's thread; the worker joins it and sends it back whole.
 */
export class IncomingFile {
  readonly #channel = new MessageChannel()
  size = 0
  constructor(readonly name: string) {}
  add(chunk: Uint8Array): void {
    this.size += chunk.byteLength
    moveToPort(this.#channel.port1, chunk)
  }

  /** The end the worker takes; the server keeps the other for the answer. */
  get workerEnd(): MessagePort { return this.#channel.port2 }
  /** The joined file the worker sent back (empty when it refused the upload); the channel is closed. */
  takeJoined(): Uint8Array | undefined { return takeFromPort(this.#channel.port1)[0] }
  close(): void {
    this.#channel.port1.close()
    this.#channel.port2.close()
  }
}

/**
 * Uploaded files checked in the pool: the worker joins each, checks it and sends it back
 * whole for storing. Previews and joined bytes in the same order.
 */
export async function checkIncomingFiles(files: IncomingFile[]): Promise<{ name: string, data: Uint8Array, preview: PullFilePreview }[]> {
  try {
    const previews = answered(await run({ kind: 'upload-files', files: files.map(f => ({ name: f.name, port: f.workerEnd })) }, files.map(f => f.workerEnd)))
    return files.map((f, i) => ({ name: f.name, data: f.takeJoined() ?? new Uint8Array(0), preview: previews[i]! }))
  }
  finally {
    for (const f of files) f.close()
  }
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
