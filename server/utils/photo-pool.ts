import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Worker } from 'node:worker_threads'

// Photo decoding blocks a thread for seconds and takes about 900 MB for 24 MP, so
// it runs in worker threads, one or two at a time, each ended after its task so
// the memory goes back (stack notes). The worker is server/workers/photo-worker.mjs.

export interface PhotoTask {
  bytes: ArrayBuffer
  mime: string
  width: number
  height: number
  orientation: number
  widths: readonly number[]
  quality: number
  attempt: number
}

export interface SizedPhoto {
  width: number
  height: number
  /** Largest first as made, returned smallest first. */
  variants: { width: number, height: number, bytes: ArrayBuffer }[]
}

/** A worker's failure; permanent when trying again cannot help (the file does not decode). */
export class PhotoTaskError extends Error {
  constructor(message: string, readonly permanent: boolean) {
    super(message)
    this.name = 'PhotoTaskError'
  }
}

export function photoPoolSize(): number {
  const wanted = Number(process.env.PHOTO_WORKERS ?? 1)
  return Number.isFinite(wanted) ? Math.min(2, Math.max(1, Math.round(wanted))) : 1
}

const WORKER_FILE = join('workers', 'photo-worker.mjs')
let workerFile: string | undefined

/**
 * Where the worker file is: beside the built server (.output/server/workers/, put
 * there by the build hook in nuxt.config.ts) or in the sources during development.
 * Searched upwards from this chunk, whose depth inside .output varies.
 */
export function photoWorkerFile(): string {
  if (workerFile) return workerFile
  const candidates: string[] = process.env.PHOTO_WORKER_FILE ? [process.env.PHOTO_WORKER_FILE] : []
  for (let dir = dirname(fileURLToPath(import.meta.url)), i = 0; i < 6; dir = dirname(dir), i++) {
    candidates.push(join(dir, WORKER_FILE), join(dir, 'server', WORKER_FILE))
  }
  workerFile = candidates.find(existsSync)
  if (!workerFile) throw new PhotoTaskError('The photo worker is not installed with this server (workers/photo-worker.mjs is missing).', false)
  return workerFile
}

/** Test-only faults, honoured only with PULLSHEET_TEST_HOOKS=1. */
function testFault(): string | undefined {
  return process.env.PULLSHEET_TEST_HOOKS === '1' ? process.env.PHOTO_TEST_FAULT || undefined : undefined
}

let running = 0
const waiting: (() => void)[] = []

async function takeSlot(): Promise<void> {
  if (running < photoPoolSize()) {
    running++
    return
  }
  await new Promise<void>(resolve => waiting.push(resolve))
}

function giveSlot(): void {
  const next = waiting.shift()
  if (next) next() // the slot passes straight to the next task
  else running--
}

export function photoPoolActive(): number {
  return running
}

function runInWorker(task: PhotoTask, timeoutMs: number): Promise<SizedPhoto> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(photoWorkerFile(), {
      workerData: { fault: testFault() },
      // Pixels live in Buffers outside the V8 heap; this only bounds a runaway heap.
      resourceLimits: { maxOldGenerationSizeMb: 1024 },
    })
    let settled = false
    const settle = (outcome: () => void) => {
      if (settled) return
      settled = true
      clearTimeout(timer)
      void worker.terminate()
      outcome()
    }
    const timer = setTimeout(() => settle(() => reject(new PhotoTaskError(`Processing took longer than ${Math.round(timeoutMs / 1000)} s and was stopped.`, false))), timeoutMs)
    worker.once('message', (answer: { ok: true, result: SizedPhoto } | { ok: false, permanent: boolean, message: string }) => settle(() => {
      if (answer.ok) resolve(answer.result)
      else reject(new PhotoTaskError(answer.message, answer.permanent))
    }))
    worker.once('error', (error: Error & { code?: string }) => settle(() => reject(error.code === 'ERR_WORKER_OUT_OF_MEMORY'
      ? new PhotoTaskError('The photo needed more memory than a worker may use. Scale it down and upload again.', true)
      : new PhotoTaskError(`The photo worker failed: ${error.message}`, false))))
    worker.once('exit', code => settle(() => reject(new PhotoTaskError(`The photo worker stopped unexpectedly (exit code ${code}).`, false))))
    worker.postMessage(task, [task.bytes])
  })
}

/** Sizes one photo in a fresh worker thread, waiting for a free slot first. */
export async function runPhotoTask(task: PhotoTask, timeoutMs = Number(process.env.PHOTO_TASK_TIMEOUT_SECONDS ?? 300) * 1000): Promise<SizedPhoto> {
  await takeSlot()
  try {
    return await runInWorker(task, timeoutMs)
  }
  finally {
    giveSlot()
  }
}
