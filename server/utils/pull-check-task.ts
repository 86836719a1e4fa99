// The messages between the server and the pull check worker (server/pull-worker/).
import type { ColumnRole } from '../../shared/dyno/index'
import { PULL_LIMITS, type PullFilePreview } from '../../shared/types/workspace'

export type PullCheckTask
  /** A JSON body of POST .../pulls/preview, as received. */
  = | { kind: 'preview-body', body: Uint8Array }
  /** Files as uploaded bytes (the operator's upload, a stored inbox file). */
    | { kind: 'files', files: { name: string, bytes: Uint8Array, mapping?: Record<string, ColumnRole> }[] }

export type PullCheckAnswer
  = | { ok: true, previews: PullFilePreview[] }
    | { ok: false, status: 400 | 413, message: string, issues?: { path: string, message: string }[] }

/** Lines one check request may hold across its files (each file has its own cap too). */
export const pullCheckRowsCap = PULL_LIMITS.maxRows * 4
