import { type ChildProcess, fork } from 'node:child_process'
import { setPriority } from 'node:os'
import type { Readable } from 'node:stream'
import { Worker } from 'node:worker_threads'
import { niceSetting } from '../../utils/thread-priority'
import { findWorkerFile } from '../../utils/worker-files'

// Photo decoding blocks a thread for seconds and takes about 900 MB for 24 MP, so
// it runs off the server's event loop, one or two photos at a time. The worker is
// server/workers/photo-worker.mjs.
//
// By default photos are sized in child processes rather than worker threads.
// Measured (docs/bench/photos.md): a thread's allocations stay in the server's
// malloc arenas after it ends (RSS 1.3 GB after ten 24 MP photos), while a child's
// memory goes back to the system when it exits. A child sizes several photos in a
// row (process start, jimp's loading and the JIT's warm-up were most of a small
// photo's time) and is retired, so its memory is bounded: after
// PHOTO_WORKER_TASKS photos (20), when idle for PHOTO_WORKER_IDLE_SECONDS (10),
// and at once when its RSS after a photo is over PHOTO_WORKER_KEEP_MB (300; a
// 24 MP photo leaves more, so such a child is used once). At most one child per
// slot exists. PHOTO_WORKER_MODE=thread keeps the thread variant (same file, same
// messages, a fresh thread per photo) for comparison.

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
  /** The worker's memory after this photo (a child's own; for a thread, the whole server's). */
  rssMb?: number
  /** The process that sized it (a child's own pid; the server's for a thread). */
  workerPid?: number
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

/** A child worker and what it has done; `clean` while its stdin is ready for the next original. */
interface PhotoChild { proc: ChildProcess, tasks: number, clean: boolean, idleTimer?: NodeJS.Timeout }

const idleChildren: PhotoChild[] = []

const childLimits = () => ({
  tasks: Math.max(1, Number(process.env.PHOTO_WORKER_TASKS ?? 20) || 1),
  idleMs: Math.max(0, Number(process.env.PHOTO_WORKER_IDLE_SECONDS ?? 10) * 1000 || 0),
  keepMb: Math.max(0, Number(process.env.PHOTO_WORKER_KEEP_MB ?? 300) || 0),
})

function forkChild(): PhotoChild {
  const proc = fork(photoWorkerFile(), [], {
    // Structured clone over the pipe, so ArrayBuffers travel as bytes, not JSON.
    serialization: 'advanced',
    execArgv: ['--max-old-space-size=1024'],
    env: { ...process.env, PHOTO_WORKER_FAULT: testFault() ?? '' },
    stdio: ['pipe', 'inherit', 'inherit', 'ipc'],
  })
  // Sizing can wait; answering readers cannot: on a small machine the scheduler
  // should prefer the server's own thread (nice 19 by default, as pull checks).
  try { if (proc.pid) setPriority(proc.pid, niceSetting(process.env.PHOTO_WORKER_NICE)) }
  catch { /* not permitted here: runs at normal priority */ }
  // An idle child never keeps the server (or a test run) alive; a running task's timer does.
  proc.unref()
  proc.channel?.unref()
  ;(proc.stdin as { unref?: () => void } | null)?.unref?.()
  proc.stdin!.on('error', () => { /* the child ended first: its exit says why */ })
  proc.on('error', () => { /* a task's own listener reports it; between tasks the exit retires the child */ })
  const child: PhotoChild = { proc, tasks: 0, clean: true }
  proc.once('exit', () => {
    child.clean = false
    const i = idleChildren.indexOf(child)
    if (i >= 0) idleChildren.splice(i, 1)
    clearTimeout(child.idleTimer)
  })
  return child
}

function retire(child: PhotoChild): void {
  child.clean = false
  clearTimeout(child.idleTimer)
  const i = idleChildren.indexOf(child)
  if (i >= 0) idleChildren.splice(i, 1)
  child.proc.kill('SIGKILL')
}

/** After a task: the child waits for the next photo, or goes. */
function release(child: PhotoChild, rssMb: number | undefined): void {
  const limits = childLimits()
  if (!child.clean || child.tasks >= limits.tasks || rssMb === undefined || rssMb > limits.keepMb || limits.idleMs === 0) {
    retire(child)
    return
  }
  child.idleTimer = setTimeout(() => retire(child), limits.idleMs)
  child.idleTimer.unref()
  idleChildren.push(child)
}

/** Ends the idle children now (server shutdown, tests). Running ones end after their photo. */
export function stopPhotoWorkers(): void {
  for (const child of [...idleChildren]) retire(child)
}

function runInChild(task: PhotoTask, timeoutMs: number): Promise<SizedPhoto> {
  const child = idleChildren.pop() ?? forkChild()
  clearTimeout(child.idleTimer)
  child.tasks++
  const { proc } = child
  let rssMb: number | undefined
  return new Promise<SizedPhoto>((resolve, reject) => {
    let settled = false
    const settle = (outcome: () => void, keep = false) => {
      if (settled) return
      settled = true
      clearTimeout(timer)
      proc.off('message', onMessage)
      proc.off('error', onError)
      proc.off('exit', onExit)
      if (!keep) child.clean = false
      // A storage stream left paused would hold its connection open.
      if (!(task.bytes instanceof ArrayBuffer)) {
        task.bytes.unpipe(proc.stdin!)
        task.bytes.destroy()
      }
      outcome()
    }
    const timer = setTimeout(() => settle(() => reject(timedOut(timeoutMs))), timeoutMs)
    // The child keeps its stdin in step only when it read exactly the bytes it was sent.
    let sent = 0
    let framed = task.length !== undefined
    const onMessage = (answer: WorkerAnswer) => {
      if (answer.ok) rssMb = answer.result.rssMb
      settle(() => resolve(answered(answer)), framed && (answer.ok || answer.permanent))
    }
    const onError = (error: Error) => settle(() => reject(new PhotoTaskError(`The photo worker could not start: ${error.message}`, false)))
    const onExit = (code: number | null, signal: string | null) => settle(() => reject(stopped(code, signal)))
    proc.on('message', onMessage)
    proc.once('error', onError)
    proc.once('exit', onExit)
    const { bytes, ...rest } = task
    const length = bytes instanceof ArrayBuffer ? bytes.byteLength : task.length
    proc.send({ ...rest, length })
    if (bytes instanceof ArrayBuffer) {
      framed = true
      proc.stdin!.write(Buffer.from(bytes))
    }
    else if (!framed) {
      bytes.pipe(proc.stdin!) // no length: the end of stdin ends the photo, and this child's use
    }
    else {
      bytes.on('data', (chunk: Buffer) => {
        sent += chunk.length
        if (sent > length!) framed = false
      })
      // A stream cut short (or overlong) ends the child's stdin: it reports what
      // arrived, and takes no further photo.
      bytes.once('end', () => { if (sent !== length) { framed = false; proc.stdin!.end() } })
      bytes.once('error', () => settle(() => reject(new PhotoTaskError('Reading the original from storage broke off. It will be tried again.', false))))
      bytes.pipe(proc.stdin!, { end: false })
    }
  }).finally(() => release(child, rssMb))
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

/** Sizes one photo in a child worker (a waiting one, or a new one) or a fresh thread, waiting for a free slot first. */
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
