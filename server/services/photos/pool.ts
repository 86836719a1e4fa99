import { fork } from 'node:child_process'
import { setPriority } from 'node:os'
import type { Readable } from 'node:stream'
import { Worker } from 'node:worker_threads'
import { findWorkerFile } from '../../utils/worker-files'

// Photo decoding blocks a thread for seconds and takes about 900 MB for 24 MP, so
// it runs off the server's event loop, one or two photos at a time, each worker
// ended after its photo. The worker is server/workers/photo-worker.mjs.
//
// By default each photo gets a short-lived child process rather than a worker
// thread. Measured (docs/bench/photos.md): a thread's allocations stay in the
// server's malloc arenas after it ends (RSS 1.3 GB after ten 24 MP photos), while
// a child's memory goes back to the system when it exits. PHOTO_WORKER_MODE=thread
// keeps the thread variant (same file, same messages) for comparison.

export interface PhotoTask {
  /**
   * The original: bytes, or a stream of them straight from storage. A child
   * worker reads the stream on its stdin, so the server never holds the whole file.
   */
  bytes: ArrayBuffer | Readable
  /** Expected size of a stream, so a cut-off one is told from a broken file. */
  length?: number
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
  /** The worker's peak memory (a child's own; for a thread, the whole server's). */
  maxRssMb?: number
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

/** The worker file (see findWorkerFile), or a clear failure when the build left it out. */
export function photoWorkerFile(): string {
  const file = findWorkerFile('photo-worker.mjs', process.env.PHOTO_WORKER_FILE)
  if (!file) throw new PhotoTaskError('The photo worker is not installed with this server (workers/photo-worker.mjs is missing).', false)
  return file
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

export function photoWorkerMode(): 'process' | 'thread' {
  return process.env.PHOTO_WORKER_MODE === 'thread' ? 'thread' : 'process'
}

type WorkerAnswer = { ok: true, result: SizedPhoto } | { ok: false, permanent: boolean, message: string }

const timedOut = (timeoutMs: number) => new PhotoTaskError(`Processing took longer than ${Math.round(timeoutMs / 1000)} s and was stopped.`, false)
const answered = (answer: WorkerAnswer) => answer.ok ? answer.result : Promise.reject(new PhotoTaskError(answer.message, answer.permanent))
const stopped = (code: number | null, signal?: string | null) => new PhotoTaskError(`The photo worker stopped unexpectedly (${signal ? `signal ${signal}` : `exit code ${code}`}).`, false)

function runInChild(task: PhotoTask, timeoutMs: number): Promise<SizedPhoto> {
  return new Promise((resolve, reject) => {
    const child = fork(photoWorkerFile(), [], {
      // Structured clone over the pipe, so ArrayBuffers travel as bytes, not JSON.
      serialization: 'advanced',
      execArgv: ['--max-old-space-size=1024'],
      env: { ...process.env, PHOTO_WORKER_FAULT: testFault() ?? '' },
      stdio: ['pipe', 'inherit', 'inherit', 'ipc'],
    })
    // Sizing can wait; answering readers cannot: on a small machine the scheduler
    // should prefer the server's own thread (nice 10 by default).
    try { if (child.pid) setPriority(child.pid, Number(process.env.PHOTO_WORKER_NICE ?? 10)) }
    catch { /* not permitted here: runs at normal priority */ }
    let settled = false
    const settle = (outcome: () => void) => {
      if (settled) return
      settled = true
      clearTimeout(timer)
      child.kill('SIGKILL')
      // A storage stream left paused would hold its connection open.
      if (!(task.bytes instanceof ArrayBuffer)) task.bytes.destroy()
      outcome()
    }
    const timer = setTimeout(() => settle(() => reject(timedOut(timeoutMs))), timeoutMs)
    child.once('message', (answer: WorkerAnswer) => settle(() => resolve(answered(answer))))
    child.once('error', error => settle(() => reject(new PhotoTaskError(`The photo worker could not start: ${error.message}`, false))))
    child.once('exit', (code, signal) => settle(() => reject(stopped(code, signal))))
    child.stdin!.on('error', () => { /* the child ended first: its exit says why */ })
    const { bytes, ...rest } = task
    child.send(rest)
    if (bytes instanceof ArrayBuffer) {
      child.stdin!.end(Buffer.from(bytes))
    }
    else {
      bytes.once('error', () => settle(() => reject(new PhotoTaskError('Reading the original from storage broke off. It will be tried again.', false))))
      bytes.pipe(child.stdin!)
    }
  })
}

async function collect(stream: Readable): Promise<ArrayBuffer> {
  const chunks: Buffer[] = []
  for await (const chunk of stream) chunks.push(chunk as Buffer)
  const all = Buffer.concat(chunks)
  return all.buffer.slice(all.byteOffset, all.byteOffset + all.byteLength) as ArrayBuffer
}

function runInThread(task: PhotoTask & { bytes: ArrayBuffer }, timeoutMs: number): Promise<SizedPhoto> {
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
    const timer = setTimeout(() => settle(() => reject(timedOut(timeoutMs))), timeoutMs)
    worker.once('message', (answer: WorkerAnswer) => settle(() => resolve(answered(answer))))
    worker.once('error', (error: Error & { code?: string }) => settle(() => reject(error.code === 'ERR_WORKER_OUT_OF_MEMORY'
      ? new PhotoTaskError('The photo needed more memory than a worker may use. Scale it down and upload again.', true)
      : new PhotoTaskError(`The photo worker failed: ${error.message}`, false))))
    worker.once('exit', code => settle(() => reject(stopped(code))))
    worker.postMessage(task, [task.bytes])
  })
}

/** Sizes one photo in a fresh worker (child process or thread), waiting for a free slot first. */
export async function runPhotoTask(task: PhotoTask, timeoutMs = Number(process.env.PHOTO_TASK_TIMEOUT_SECONDS ?? 300) * 1000): Promise<SizedPhoto> {
  await takeSlot()
  try {
    if (photoWorkerMode() === 'process') return await runInChild(task, timeoutMs)
    const bytes = task.bytes instanceof ArrayBuffer ? task.bytes : await collect(task.bytes)
    return await runInThread({ ...task, bytes }, timeoutMs)
  }
  finally {
    giveSlot()
  }
}
