// The pull check in a worker thread (server/utils/pull-pool.ts runs it through piscina):
// decoding, JSON parsing, the schema and shared/dyno's parser all stay off the
// server's event loop. Bundled into .output/server/workers/pull-check-worker.mjs by the
// build hook in nuxt.config.ts. Answers are plain data; errors come back as answers.
import { PreviewPullsBody } from '../../shared/types/workspace'
import { checkPullFile, decodeUploadedBytes } from '../utils/pull-check'
import { pullCheckRowsCap, type PullCheckAnswer, type PullCheckTask } from '../utils/pull-check-task'

function lines(text: string): number {
  let n = 0
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) n++
  return n + 1
}

export default function checkInWorker(task: PullCheckTask): PullCheckAnswer {
  if (task.kind === 'files') {
    return { ok: true, previews: task.files.map(f => checkPullFile({ name: f.name, text: decodeUploadedBytes(f.bytes), bytes: f.bytes.byteLength, mapping: f.mapping }).preview) }
  }
  let json: unknown
  try { json = JSON.parse(Buffer.from(task.body.buffer, task.body.byteOffset, task.body.byteLength).toString('utf8')) }
  catch { return { ok: false, status: 400, message: 'The request body is not valid JSON.' } }
  const parsed = PreviewPullsBody.safeParse(json)
  if (!parsed.success) {
    const issues = parsed.error.issues.map(i => ({ path: i.path.join('.') || '(body)', message: i.message }))
    return { ok: false, status: 400, message: issues.map(i => `${i.path}: ${i.message}`).join('; '), issues }
  }
  const rows = parsed.data.files.reduce((n, f) => n + lines(f.text), 0)
  if (rows > pullCheckRowsCap) {
    return { ok: false, status: 413, message: `These files have ${rows.toLocaleString('en-US')} lines together; one check takes up to ${pullCheckRowsCap.toLocaleString('en-US')}. Check fewer files at once.` }
  }
  return { ok: true, previews: parsed.data.files.map(f => checkPullFile(f).preview) }
}
