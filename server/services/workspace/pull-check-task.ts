// The messages between the server and the pull check worker (server/pull-worker/).
import type { ColumnRole, CorrectionStandard, Weather } from '../../../shared/dyno/index'
import { PULL_LIMITS, type PullFilePreview } from '../../../shared/types/workspace'
import type { CheckedPull } from './pull-import'

export type PullCheckTask
  /** A JSON body of POST .../pulls/preview, as received: its pieces in order (readLimitedBodySegments). */
  = | { kind: 'preview-body', body: Uint8Array[] }
  /** A JSON body of POST .../pulls/import, as received, and the bench test's correction standard. */
    | { kind: 'import-body', body: Uint8Array[], standard: CorrectionStandard }
  /** Files as uploaded bytes (the operator's upload, a stored inbox file). */
    | { kind: 'files', files: { name: string, bytes: Uint8Array, mapping?: Record<string, ColumnRole> }[] }
  /** Stored files (inbox assignment, dyno-day filing) checked as one batch before they are saved. */
    | { kind: 'batch-files', files: StoredPullToCheck[], standard: CorrectionStandard }

/** A stored file as bytes, with what the import needs beside it. */
export interface StoredPullToCheck {
  name: string
  bytes: Uint8Array
  mapping?: Record<string, ColumnRole>
  setupId: number
  weather: Weather | null
  dynoCorrected?: boolean
}

/** A refusal, answered as it is: 400 (body: data.issues), 413 (rows), 422 (a refused batch: ImportRefusedData). */
export interface PullCheckRefusal { ok: false, status: 400 | 413 | 422, message: string, data?: unknown }

export type PullCheckAnswer = { ok: true, previews: PullFilePreview[] } | PullCheckRefusal

/** Checked pulls ready for insertCheckedPulls; points arrive encoded. */
export type PullImportAnswer = { ok: true, pulls: CheckedPull[] } | PullCheckRefusal

/** Lines one check request may hold across its files (each file has its own cap too). */
export const pullCheckRowsCap = PULL_LIMITS.maxRows * 4
