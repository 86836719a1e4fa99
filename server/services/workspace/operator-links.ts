// Upload links for the dyno operator: expiring, revocable, rate limited, and good for
// one thing only, dropping files into one bench test's inbox. The token is 32 random
// bytes shown once; the database keeps its SHA-256.
import { createHash, randomBytes } from 'node:crypto'
import type { Db } from '../../utils/db'
import type { CreatedOperatorLink, CreateOperatorLinkInput, OperatorLink, OperatorLinkState, UploadLinkInfo, UploadReceipt } from '../../../shared/types/operator-links'
import { OPERATOR_LINK_LIMITS, PULL_LIMITS } from '../../../shared/types/workspace'
import { fileArrivalIntoPlan, planArrivals } from './dyno-day-filing'
import { bumpLiveMark } from './live-marks'
import { checkIncomingFiles, type IncomingFile } from './pull-pool'
import { httpError, missing } from '../../utils/http-errors'
import { asBool, isoTime, isoTimeRequired } from '../../utils/rows'

interface LinkRow {
  id: number
  bench_test_id: number
  label: string
  created_at: Date | string
  creator_name: string
  expires_at: Date | string
  revoked_at: Date | string | null
  max_files: number
  max_file_bytes: number
  files_received: number
  expired: number
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

function stateOf(row: LinkRow): OperatorLinkState {
  if (row.revoked_at) return 'revoked'
  if (asBool(row.expired)) return 'expired'
  if (row.files_received >= row.max_files) return 'used-up'
  return 'active'
}

function toLink(row: LinkRow): OperatorLink {
  return {
    id: row.id,
    benchTestId: row.bench_test_id,
    label: row.label,
    createdAt: isoTimeRequired(row.created_at),
    createdByName: row.creator_name,
    expiresAt: isoTimeRequired(row.expires_at),
    revokedAt: isoTime(row.revoked_at),
    maxFiles: row.max_files,
    maxFileBytes: row.max_file_bytes,
    filesReceived: row.files_received,
    state: stateOf(row),
  }
}

// Expiry is judged by the database clock, the same one that stamps received_at.
function linkQuery(db: Db) {
  return db('operator_links').join('users as creator', 'creator.id', 'operator_links.created_by')
    .select('operator_links.*', 'creator.display_name as creator_name', db.raw('(operator_links.expires_at <= NOW(3)) AS expired'))
}

export async function listOperatorLinks(db: Db, benchTestId: number): Promise<OperatorLink[]> {
  const rows = await linkQuery(db).where('operator_links.bench_test_id', benchTestId).orderBy('operator_links.id', 'desc') as LinkRow[]
  return rows.map(toLink)
}

async function linkById(db: Db, benchTestId: number, linkId: number): Promise<OperatorLink> {
  const row = await linkQuery(db).where({ 'operator_links.id': linkId, 'operator_links.bench_test_id': benchTestId }).first() as LinkRow | undefined
  if (!row) missing('No such upload link on this bench test.')
  return toLink(row)
}

export async function createOperatorLink(db: Db, userId: number, benchTestId: number, input: CreateOperatorLinkInput, baseUrl: string): Promise<CreatedOperatorLink> {
  const token = randomBytes(32).toString('base64url')
  const link = await db.transaction(async (trx) => {
    const [id] = await trx('operator_links').insert({
      bench_test_id: benchTestId,
      token_hash: hashToken(token),
      label: input.label ?? '',
      created_by: userId,
      expires_at: trx.raw('NOW(3) + INTERVAL ? HOUR', [input.expiresInHours]),
      max_files: input.maxFiles ?? OPERATOR_LINK_LIMITS.defaultMaxFiles,
      max_file_bytes: OPERATOR_LINK_LIMITS.maxFileBytes,
    })
    return linkById(trx, benchTestId, Number(id))
  })
  return { link, url: `${baseUrl}/upload/${token}`, token }
}

export async function revokeOperatorLink(db: Db, benchTestId: number, linkId: number): Promise<OperatorLink> {
  await linkById(db, benchTestId, linkId)
  await db('operator_links').where({ id: linkId, bench_test_id: benchTestId }).whereNull('revoked_at').update({ revoked_at: db.raw('NOW(3)') })
  return linkById(db, benchTestId, linkId)
}

/** The link behind a token: 404 for a token that never existed, 410 for one that no longer works. */
async function usableLink(db: Db, token: string, opts: { lock?: boolean } = {}): Promise<LinkRow & { bench_test_title: string }> {
  const query = linkQuery(db).join('bench_tests', 'bench_tests.id', 'operator_links.bench_test_id')
    .select('bench_tests.title as bench_test_title', 'bench_tests.deleted_at as bench_test_deleted_at')
    .where('operator_links.token_hash', hashToken(token))
  if (opts.lock) query.forUpdate()
  const row = await query.first() as (LinkRow & { bench_test_title: string, bench_test_deleted_at: Date | null }) | undefined
  if (!row) missing('This upload link does not exist. Ask the writer for a new one.')
  const state = stateOf(row)
  if (state === 'revoked' || row.bench_test_deleted_at) throw httpError(410, 'This upload link was withdrawn. Ask the writer for a new one.')
  if (state === 'expired') throw httpError(410, 'This upload link has expired. Ask the writer for a new one.')
  if (state === 'used-up') throw httpError(410, `This upload link has taken all the ${row.max_files} files it was made for. Ask the writer for a new one.`)
  return row
}

/**
 * The checks an upload makes before reading any of its body: an unknown, expired,
 * revoked or used-up link costs a database lookup and nothing else.
 */
export async function openUploadLink(db: Db, token: string): Promise<{ maxFileBytes: number, filesLeft: number }> {
  const row = await usableLink(db, token)
  return { maxFileBytes: row.max_file_bytes, filesLeft: row.max_files - row.files_received }
}

export async function uploadLinkInfo(db: Db, token: string): Promise<UploadLinkInfo> {
  const row = await usableLink(db, token)
  return {
    benchTestTitle: row.bench_test_title,
    expiresAt: isoTimeRequired(row.expires_at),
    maxFileBytes: row.max_file_bytes,
    filesLeft: row.max_files - row.files_received,
    rate: { files: OPERATOR_LINK_LIMITS.rateFiles, minutes: OPERATOR_LINK_LIMITS.rateMinutes },
  }
}

/** A file name as sent by any operating system, reduced to its last part, printable. */
export function cleanFileName(raw: string | undefined, fallback: string): string {
  const base = (raw ?? '').split(/[\\/]/).pop() ?? ''
  // eslint-disable-next-line no-control-regex
  const printable = base.replace(/[\u0000-\u001F\u007F]/g, '').trim().slice(0, 255)
  return printable || fallback
}

/**
 * Files into the inbox, all or none: the link row is locked so the rate limit and the
 * file allowance hold even when the operator sends several requests at once.
 */
export async function receiveUploads(db: Db, token: string, incoming: IncomingFile[]): Promise<UploadReceipt> {
  if (incoming.length === 0 || incoming.length > PULL_LIMITS.maxFilesPerBatch) {
    for (const f of incoming) f.close()
    throw httpError(400, incoming.length === 0 ? 'No file was sent: attach one or more CSV files as "file".' : `Send at most ${PULL_LIMITS.maxFilesPerBatch} files at once.`)
  }
  // Joined and checked in the worker pool before the link row is locked: a slow check holds no lock.
  const files = await checkIncomingFiles(incoming)
  const previews = files.map(f => f.preview)
  // During a dyno day a good file goes straight to the plan's current step: checked as a pull now, in the pool too.
  const planned = await planArrivals(db, (await usableLink(db, token)).bench_test_id, files.map((f, i) => ({ name: f.name, bytes: f.data, ok: previews[i]!.ok, weather: previews[i]!.weather })))
  return db.transaction(async (trx) => {
    const link = await usableLink(trx, token, { lock: true })
    for (const f of files) {
      if (f.data.byteLength > link.max_file_bytes) {
        throw httpError(413, `${f.name} is ${(f.data.byteLength / 1024 / 1024).toFixed(1)} MB; files up to ${(link.max_file_bytes / 1024 / 1024).toFixed(0)} MB are accepted. Nothing of this upload was kept.`)
      }
    }
    if (link.files_received + files.length > link.max_files) {
      throw httpError(410, `This link takes ${link.max_files - link.files_received} more file(s); ${files.length} were sent. Nothing of this upload was kept.`)
    }
    const recent = await trx('inbox_files').where('operator_link_id', link.id)
      .where('received_at', '>', trx.raw('NOW(3) - INTERVAL ? MINUTE', [OPERATOR_LINK_LIMITS.rateMinutes]))
      .first(trx.raw('COUNT(*) AS n'), trx.raw(`TIMESTAMPDIFF(SECOND, NOW(3), MIN(received_at) + INTERVAL ${OPERATOR_LINK_LIMITS.rateMinutes} MINUTE) AS wait`)) as { n: number, wait: number | null }
    if (Number(recent.n) + files.length > OPERATOR_LINK_LIMITS.rateFiles) {
      const retryAfterSeconds = Math.max(1, Number(recent.wait ?? 60))
      throw httpError(429, `This link takes at most ${OPERATOR_LINK_LIMITS.rateFiles} files per ${OPERATOR_LINK_LIMITS.rateMinutes} minutes. Try again in ${Math.ceil(retryAfterSeconds / 60)} minute(s).`, { retryAfterSeconds })
    }
    const received: UploadReceipt['received'] = []
    for (const [i, f] of files.entries()) {
      const preview = previews[i]!
      const [inboxId] = await trx('inbox_files').insert({
        bench_test_id: link.bench_test_id,
        operator_link_id: link.id,
        file_name: f.name,
        content: Buffer.from(f.data.buffer, f.data.byteOffset, f.data.byteLength),
        size_bytes: f.data.byteLength,
        preview: JSON.stringify(preview),
        ok: preview.ok,
      })
      // During a dyno day the file goes straight to the plan's current setup (server/services/workspace/dyno-day-filing.ts).
      const filedTo = await fileArrivalIntoPlan(trx, link.bench_test_id, link.id, Number(inboxId), planned[i]!)
      received.push({ name: f.name, sizeBytes: f.data.byteLength, ok: preview.ok, problemCount: preview.problems.length, ...(filedTo ? { filedTo } : {}) })
    }
    await trx('operator_links').where({ id: link.id }).update({ files_received: trx.raw('files_received + ?', [files.length]) })
    await bumpLiveMark(trx, link.bench_test_id)
    return { received, filesLeft: link.max_files - link.files_received - files.length }
  })
}

/** The bench test behind a usable link, for the operator's view of the plan. */
export async function linkBenchTestId(db: Db, token: string): Promise<number> {
  return (await usableLink(db, token)).bench_test_id
}
