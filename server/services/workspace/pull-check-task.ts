// The messages between the server and the pull check worker (server/pull-worker/).
// Request bodies and uploaded files travel in MessagePorts whose queues hold their
// chunks, moved as they arrived (server/utils/port-bytes.ts); the worker takes them.
import type { MessagePort } from 'node:worker_threads'
import type { ColumnRole, CorrectionStandard, Weather } from '../../../shared/dyno/index'
import type { PullFilePreview } from '../../../shared/types/pull-imports'
import { PULL_LIMITS } from '../../../shared/types/workspace'
import type { CheckedPull } from './pull-import'

export type PullCheckTask
  /** A JSON body of POST .../pulls/preview, its chunks waiting in the port (readLimitedBodyInto). */
  = | { kind: 'preview-body', body: MessagePort }
  /** A JSON body of POST .../pulls/import, as received, and the bench test's correction standard. */
    | { kind: 'import-body', body: MessagePort, standard: CorrectionStandard }
  /** Stored files as bytes (a stored inbox file checked again). */
    | { kind: 'files', files: { name: string, bytes: Uint8Array, mapping?: Record<string, ColumnRole> }[] }
  /**
   * The operator's uploaded files, each file's chunks waiting in its port: the worker
   * joins each file, checks it, and posts the joined bytes back on the same port.
   */
    | { kind: 'upload-files', files: { name: string, port: MessagePort }[] }
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
