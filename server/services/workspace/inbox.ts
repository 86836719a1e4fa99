// The bench test's inbox: files the operator dropped through a link. Assigning a file
// to a setup runs the same check and insert as the writer's own import.
import type { Db } from '../../utils/db'
import type { ColumnRole, CorrectionStandard } from '../../../shared/dyno/index'
import type { AssignInboxInput, InboxFile, InboxState } from '../../../shared/types/inbox'
import type { PullFilePreview } from '../../../shared/types/pull-imports'
import { insertCheckedPulls } from './pull-import'
import { checkStoredPullBatch, checkUploadedFiles } from './pull-pool'
import { httpError, missing } from '../../utils/http-errors'
import { isoTimeRequired, parseJsonColumn } from '../../utils/rows'

interface InboxRow {
  id: number
  bench_test_id: number
  operator_link_id: number
  link_label: string
  file_name: string
  size_bytes: number
  preview: string
  state: InboxState
  pull_id: number | null
  received_at: Date | string
}

function toInboxFile(row: InboxRow): InboxFile {
  return {
    id: row.id,
    benchTestId: row.bench_test_id,
    fileName: row.file_name,
    sizeBytes: row.size_bytes,
    receivedAt: isoTimeRequired(row.received_at),
    link: { id: row.operator_link_id, label: row.link_label },
    state: row.state,
    assignedPullId: row.pull_id,
    preview: parseJsonColumn<PullFilePreview>(row.preview, { name: row.file_name, ok: false, sizeBytes: row.size_bytes, rowCount: 0, pointCount: 0, rpmFrom: null, rpmTo: null, units: {}, columns: [], unrecognisedHeaders: [], weather: null, peakPower: null, peakTorque: null, curve: [], problems: [] }),
  }
}

function inboxQuery(db: Db, benchTestId: number) {
  return db('inbox_files').join('operator_links as link', 'link.id', 'inbox_files.operator_link_id')
    .where('inbox_files.bench_test_id', benchTestId)
    .select('inbox_files.id', 'inbox_files.bench_test_id', 'inbox_files.operator_link_id', 'link.label as link_label', 'inbox_files.file_name',
      'inbox_files.size_bytes', 'inbox_files.preview', 'inbox_files.state', 'inbox_files.pull_id', 'inbox_files.received_at')
}

export async function listInbox(db: Db, benchTestId: number, state?: InboxState): Promise<InboxFile[]> {
  const query = inboxQuery(db, benchTestId).orderBy('inbox_files.id', 'desc').limit(1000)
  if (state) query.where('inbox_files.state', state)
  return (await query as InboxRow[]).map(toInboxFile)
}

async function inboxFile(db: Db, benchTestId: number, fileId: number): Promise<InboxFile> {
  const row = await inboxQuery(db, benchTestId).where('inbox_files.id', fileId).first() as InboxRow | undefined
  if (!row) missing('No such file in this bench test\'s inbox.')
  return toInboxFile(row)
}

async function inboxBytes(db: Db, fileId: number): Promise<Buffer> {
  const row = await db('inbox_files').where({ id: fileId }).first('content') as { content: Buffer }
  return row.content
}

/** The stored file checked again, with a column mapping; nothing is saved. */
export async function previewInboxFile(db: Db, benchTestId: number, fileId: number, mapping?: Record<string, ColumnRole>): Promise<PullFilePreview> {
  const file = await inboxFile(db, benchTestId, fileId)
  const [preview] = await checkUploadedFiles([{ name: file.fileName, bytes: await inboxBytes(db, fileId), mapping }])
  return preview!
}

/** Every item becomes a pull, in one transaction, or none does. Returns the pull ids in order. */
export async function assignInboxFiles(db: Db, userId: number, benchTestId: number, standard: CorrectionStandard, input: AssignInboxInput): Promise<number[]> {
  const files = await Promise.all(input.items.map(item => inboxFile(db, benchTestId, item.fileId)))
  if (new Set(input.items.map(i => i.fileId)).size !== input.items.length) throw httpError(400, 'A file is listed twice.')
  const notWaiting = files.find(f => f.state !== 'waiting')
  if (notWaiting) throw httpError(409, `${notWaiting.fileName} was already ${notWaiting.state}.`)
  const stored = await Promise.all(files.map(f => inboxBytes(db, f.id)))
  // Decoded and checked in the pull-check pool (server/services/workspace/pull-pool.ts), never on the server's thread.
  const checked = await checkStoredPullBatch(input.items.map((item, i) => ({
    name: files[i]!.fileName, bytes: stored[i]!, mapping: item.mapping, setupId: item.setupId, weather: item.weather, dynoCorrected: item.dynoCorrected,
  })), standard)
  return db.transaction(async (trx) => {
    const ids: number[] = []
    for (const [i, item] of input.items.entries()) {
      const row = await trx('inbox_files').where({ id: item.fileId, bench_test_id: benchTestId }).forUpdate().first('state')
      if (row?.state !== 'waiting') throw httpError(409, `${files[i]!.fileName} was assigned or dismissed meanwhile; nothing was saved.`)
      const [pullId] = await insertCheckedPulls(trx, benchTestId, [checked[i]!], { operatorLinkId: files[i]!.link.id }, () => `items.${i}.setupId`)
      await trx('inbox_files').where({ id: item.fileId }).update({ state: 'assigned', pull_id: pullId, handled_by: userId, handled_at: trx.raw('NOW(3)') })
      ids.push(pullId!)
    }
    return ids
  })
}

export async function dismissInboxFile(db: Db, userId: number, benchTestId: number, fileId: number): Promise<InboxFile> {
  const file = await inboxFile(db, benchTestId, fileId)
  if (file.state !== 'waiting') throw httpError(409, `${file.fileName} was already ${file.state}.`)
  await db('inbox_files').where({ id: fileId, state: 'waiting' }).update({ state: 'dismissed', handled_by: userId, handled_at: db.raw('NOW(3)') })
  return inboxFile(db, benchTestId, fileId)
}

/** File names of some inbox files of this bench test, in the order asked (for messages); unknown ids give undefined. */
export async function inboxFileNames(db: Db, benchTestId: number, ids: readonly unknown[]): Promise<(string | undefined)[]> {
  const wanted = ids.filter((id): id is number => Number.isInteger(id) && (id as number) > 0)
  if (!wanted.length) return ids.map(() => undefined)
  const rows = await db('inbox_files').where('bench_test_id', benchTestId).whereIn('id', wanted).select('id', 'file_name') as { id: number, file_name: string }[]
  const byId = new Map(rows.map(r => [r.id, r.file_name]))
  return ids.map(id => (typeof id === 'number' ? byId.get(id) : undefined))
}
