// Pulls as stored: summaries, points, repeatability and the pull's own changes (docs/api/workspace.md).
import { z } from 'zod'
import type { AtRpm, CorrectionStandard, PowerUnit, Problem, TorqueUnit, VacuumUnit, Weather } from '../dyno/types'
import { text } from '../workspace/fields'
import { VersionSchema, WeatherSchema } from './workspace'

/** A data-check problem of an import, naming its file; `text` is the whole sentence to show. */
export interface ImportProblem extends Problem {
  file: string
  text: string
}

export interface PullSummary {
  id: number
  setupId: number
  /** 1, 2, 3 ... in upload order within the setup. */
  number: number
  fileName: string
  uploadedAt: string
  uploadedBy: { kind: 'user', userId: number, name: string } | { kind: 'operator-link', linkId: number, label: string }
  weather: Weather | null
  dynoCorrected: boolean
  included: boolean
  exclusionReason: string
  rowCount: number
  pointCount: number
  rpmFrom: number
  rpmTo: number
  units: { torque?: TorqueUnit, power?: PowerUnit, vacuum?: VacuumUnit }
  /** Observed peaks, uncorrected. */
  peakPower: AtRpm
  peakTorque: AtRpm
  problems: Problem[]
  version: number
}

/** A point of a stored pull: observed, lb-ft, hp, inHg. */
export interface StoredPoint { rpm: number, torqueLbFt: number, powerHp: number, vacuumInHg?: number, afr?: number }

export interface PullDetail extends PullSummary {
  points: StoredPoint[]
  extraColumns: string[]
}

/** Repeatability of one setup's included pulls, corrected to the bench test's default standard. */
export interface SetupRepeatability {
  setupId: number
  includedPulls: number
  /** Largest spread of power between the pulls, percent; null with fewer than 2 pulls. */
  spreadPct: number | null
  rpmOfLargestSpread: number | null
  /** Needs 3 pulls or more. */
  outlier: { pullId: number, deviationPct: number, beyondRepeatability: boolean } | null
  /** spreadPct within the common-practice limit (REPEATABILITY_PCT of shared/dyno). */
  withinLimit: boolean | null
  /** Why it could not be computed (pulls share no rpm range ...). */
  problem: string | null
}

export interface PullList {
  pulls: PullSummary[]
  repeatability: SetupRepeatability[]
  standard: CorrectionStandard
}

/** PATCH /api/bench-tests/:id/pulls/:pullId. Excluding needs a reason. */
export const UpdatePullBody = z.object({
  version: VersionSchema,
  included: z.boolean().optional(),
  exclusionReason: text(500, 'the reason').optional(),
  weather: WeatherSchema.nullable().optional(),
  dynoCorrected: z.boolean().optional(),
  setupId: z.number().int().positive().optional(),
}).refine(b => b.included !== false || (b.exclusionReason ?? '').length > 0, { message: 'Say why the pull is left out', path: ['exclusionReason'] })
export type UpdatePullInput = z.infer<typeof UpdatePullBody>
