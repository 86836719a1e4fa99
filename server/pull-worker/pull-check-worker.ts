// The pull check in a worker thread (server/services/workspace/pull-pool.ts runs it through piscina):
// decoding, JSON parsing, the schema and shared/dyno's parser all stay off the
// server's event loop. Bundled into .output/server/workers/pull-check-worker.mjs by the
// build hook in nuxt.config.ts. Answers are plain data; errors come back as answers.
import type { MessagePort } from 'node:worker_threads'
import type { ZodType } from 'zod'
import { CommitPullsBody, PreviewPullsBody } from '../../shared/types/pull-imports'
import type { CorrectionStandard } from '../../shared/dyno/index'
import { checkPullFile, decodeUploadedBytes } from '../services/workspace/pull-check'
import { checkPullBatchFiles } from '../services/workspace/pull-batch-check'
import { encodePoints } from '../services/workspace/pull-points'
import { pullCheckRowsCap, type PullCheckAnswer, type PullCheckRefusal, type PullCheckTask, type PullImportAnswer, type StoredPullToCheck } from '../services/workspace/pull-check-task'
import type { PullToImport } from '../services/workspace/pull-import'
import { moveToPort, takeFromPort } from '../utils/port-bytes'
import { lowerWorkerThreadPriority } from '../utils/thread-priority'

// Each pool thread, as it loads: the server's thread comes first for a core (PULL_CHECK_NICE).
lowerWorkerThreadPriority()

function lines(text: string): number {
  let n = 0
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) n++
  return n + 1
}

/** The 413 of one check whose files hold more lines together than pullCheckRowsCap (every kind of check has the same cap). */
function rowsRefusal(texts: readonly string[], advice: string): PullCheckRefusal | undefined {
  const rows = texts.reduce((n, text) => n + lines(text), 0)
  if (rows <= pullCheckRowsCap) return undefined
  return { ok: false, status: 413, message: `These files have ${rows.toLocaleString('en-US')} lines together; one check takes up to ${pullCheckRowsCap.toLocaleString('en-US')}. ${advice}` }
}

/** The name of files[index] of a body not yet validated, for messages only. */
function fileName(json: unknown, index: unknown): string | undefined {
  const files = typeof json === 'object' && json !== null ? (json as { files?: unknown }).files : undefined
  const item = Array.isArray(files) && typeof index === 'number' ? files[index] as { name?: unknown } | undefined : undefined
  return typeof item?.name === 'string' && item.name.trim() ? item.name.trim().slice(0, 255) : undefined
}

/**
 * JSON body -> validated files with the rows cap, or the 400/413 the route answers.
 * `named` puts the file's name before each of its problems, as server/utils/validation.ts's batchParser does.
 */
function readFiles<T extends { files: { text: string }[] }>(body: MessagePort, schema: ZodType<T>, named: boolean): T | PullCheckRefusal {
  let json: unknown
  // The chunks are joined here, on the worker's thread.
  try { json = JSON.parse(Buffer.concat(takeFromPort(body)).toString('utf8')) }
  catch { return { ok: false, status: 400, message: 'The request body is not valid JSON.' } }
  const parsed = schema.safeParse(json)
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => {
      const name = named && i.path[0] === 'files' ? fileName(json, i.path[1]) : undefined
      return { path: i.path.join('.') || '(body)', message: name ? `${name}: ${i.message}` : i.message }
    })
    return { ok: false, status: 400, message: issues.map(i => `${i.path}: ${i.message}`).join('; '), data: { issues } }
  }
  return rowsRefusal(parsed.data.files.map(f => f.text), 'Check fewer files at once.') ?? parsed.data
}

function importBody(body: MessagePort, standard: CorrectionStandard): PullImportAnswer {
  const files = readFiles(body, CommitPullsBody, true)
  if ('ok' in files) return files
  return checkBatch(files.files, standard)
}

/** Stored files as bytes: decoded here, capped like a request, checked as one batch. */
function storedBatch(files: StoredPullToCheck[], standard: CorrectionStandard): PullImportAnswer {
  const decoded: PullToImport[] = files.map(f => ({ name: f.name, text: decodeUploadedBytes(f.bytes), bytes: f.bytes.byteLength, mapping: f.mapping, setupId: f.setupId, weather: f.weather, dynoCorrected: f.dynoCorrected }))
  return rowsRefusal(decoded.map(f => f.text), 'Assign fewer files at once.') ?? checkBatch(decoded, standard)
}

function checkBatch(files: PullToImport[], standard: CorrectionStandard): PullImportAnswer {
  const result = checkPullBatchFiles(files, standard)
  if (!result.ok) return { ok: false, status: 422, message: result.message, data: result.data }
  // The text goes back once (input.text is what is stored); the points as one string.
  const pulls = result.pulls.map(p => ({
    ...p,
    checked: { ...p.checked, text: '', parsed: p.checked.parsed && { ...p.checked.parsed, points: [], problems: [] } },
    encodedPoints: encodePoints(p.checked.parsed!.points),
  }))
  return { ok: true, pulls }
}

/** Each uploaded file joined from its port, checked, and its joined bytes moved back on the same port for the server to store. */
function uploadedFiles(files: { name: string, port: MessagePort }[]): PullCheckAnswer {
  const joined = files.map(f => Buffer.concat(takeFromPort(f.port, { keepOpen: true })))
  const texts = joined.map(bytes => decodeUploadedBytes(bytes))
  const over = rowsRefusal(texts, 'Send fewer files at once.')
  const answer: PullCheckAnswer = over ?? { ok: true, previews: files.map((f, i) => checkPullFile({ name: f.name, text: texts[i]!, bytes: joined[i]!.byteLength }).preview) }
  files.forEach((f, i) => {
    if (!over) moveToPort(f.port, joined[i]!)
    f.port.close()
  })
  return answer
}

export default function checkInWorker(task: PullCheckTask): PullCheckAnswer | PullImportAnswer {
  if (task.kind === 'upload-files') return uploadedFiles(task.files)
  if (task.kind === 'files') {
    const texts = task.files.map(f => decodeUploadedBytes(f.bytes))
    const over = rowsRefusal(texts, 'Send fewer files at once.')
    if (over) return over
    return { ok: true, previews: task.files.map((f, i) => checkPullFile({ name: f.name, text: texts[i]!, bytes: f.bytes.byteLength, mapping: f.mapping }).preview) }
  }
  if (task.kind === 'import-body') return importBody(task.body, task.standard)
  if (task.kind === 'batch-files') return storedBatch(task.files, task.standard)
  const files = readFiles(task.body, PreviewPullsBody, false)
  if ('ok' in files) return files
  return { ok: true, previews: files.files.map(f => checkPullFile(f).preview) }
}
