// The pull import in two steps, preview then commit (docs/api/workspace.md).
import { z } from 'zod'
import type { ColumnRole } from '../dyno/csv'
import type { AtRpm, PowerUnit, TorqueUnit, VacuumUnit, Weather } from '../dyno/types'
import { weatherUnlessCorrected } from '../workspace/fields'
import type { ImportProblem, PullSummary } from './pulls'
import { ColumnMappingSchema, PULL_LIMITS, WeatherSchema } from './workspace'

export const FileNameSchema = z.string().trim().min(1, 'The file needs a name').max(255, 'File names up to 255 characters')

/** A file as read by the browser (File.text()); mapping gives roles to unrecognised headers. */
export const ImportFileSchema = z.object({
  name: FileNameSchema,
  text: z.string(),
  mapping: ColumnMappingSchema.optional(),
})

/** POST /api/bench-tests/:id/pulls/preview: nothing is saved. */
export const PreviewPullsBody = z.object({
  files: z.array(ImportFileSchema).min(1, 'Choose at least one file').max(PULL_LIMITS.maxFilesPerBatch, `At most ${PULL_LIMITS.maxFilesPerBatch} files at once`),
})
export type PreviewPullsInput = z.infer<typeof PreviewPullsBody>

/** Where a file goes and the weather it was pulled in; weather may be null only when the dyno already corrected it. */
export const PullAssignment = z.object({
  setupId: z.number({ error: 'Choose the setup this pull was made with (none is assumed)' }).int().positive(),
  weather: WeatherSchema.nullable(),
  dynoCorrected: z.boolean().optional(),
})

export const CommitFileSchema = ImportFileSchema.extend(PullAssignment.shape)
  .refine(f => f.weather !== null || f.dynoCorrected === true, weatherUnlessCorrected)

/** POST /api/bench-tests/:id/pulls/import: all files saved in one transaction, or none. */
export const CommitPullsBody = z.object({
  files: z.array(CommitFileSchema).min(1, 'Choose at least one file').max(PULL_LIMITS.maxFilesPerBatch, `At most ${PULL_LIMITS.maxFilesPerBatch} files at once`),
})
export type CommitPullsInput = z.infer<typeof CommitPullsBody>

export interface PreviewPoint { rpm: number, torqueLbFt: number, powerHp: number }

export interface PullFilePreview {
  name: string
  /** No error-severity problem: the file may be imported. */
  ok: boolean
  sizeBytes: number
  /** Lines of the file. */
  rowCount: number
  pointCount: number
  rpmFrom: number | null
  rpmTo: number | null
  units: { torque?: TorqueUnit, power?: PowerUnit, vacuum?: VacuumUnit }
  columns: { header: string, role: ColumnRole }[]
  /** Headers read as extra channels or refused for their unit: candidates for the mapping step. */
  unrecognisedHeaders: string[]
  /** Weather lines found in the file (converted to inHg, F, %). */
  weather: Partial<Weather> | null
  peakPower: AtRpm | null
  peakTorque: AtRpm | null
  /** At most 120 points for a small preview graph, observed. */
  curve: PreviewPoint[]
  problems: ImportProblem[]
}

export interface PreviewPullsResponse { files: PullFilePreview[] }
export interface CommitPullsResponse { pulls: PullSummary[] }
/** 422 body (`data`) when a batch is refused: every file's preview with its problems. */
export interface ImportRefusedData { files: PullFilePreview[], problems: ImportProblem[] }
