// The analysis answer and its query (GET /api/bench-tests/:id/analysis); the zod-free
// grids and units it builds on are in ./analysis.ts.
import { z } from 'zod'
import type { AtRpm, CorrectionStandard, RpmRange, Weather } from '../dyno/types'
import { ids } from '../workspace/fields'
import { ANALYSIS_UNITS, type AnalysisUnits } from './analysis'
import { CorrectionStandardSchema, IdSchema } from './workspace'

const idList = z.string().regex(/^\d+(,\d+)*$/, 'A comma-separated list of setup ids')
  .transform(s => [...new Set(s.split(',').map(Number))])
  .refine(list => list.length <= 30, 'At most 30 setups')

/** GET /api/bench-tests/:id/analysis and .../analysis/csv */
export const AnalysisQuery = z.object({
  /** Setup ids; default every live setup with included pulls. */
  setups: idList.optional(),
  /** Setup the gains are taken against; default the bench test's baseline (or the first chosen). */
  baseline: IdSchema.optional(),
  /** Default the bench test's default standard. */
  standard: CorrectionStandardSchema.optional(),
  units: z.enum(ids(ANALYSIS_UNITS)).optional(),
  /** Points per displayed curve (LTTB); figures always come from the full data. */
  maxPoints: z.coerce.number().int().min(20).max(2000).optional(),
})
export type AnalysisQueryInput = z.infer<typeof AnalysisQuery>

export interface CurvePoint { rpm: number, torque: number, power: number }

export interface AnalysisPull {
  pullId: number
  number: number
  fileName: string
  weather: Weather | null
  dynoCorrected: boolean
  /** Correction factor applied to this pull (1 for a pull the dyno already corrected, or for 'none'). */
  factor: number
  /** Peak power of the pull's own samples, corrected by its factor. */
  peakPower: AtRpm
}

export interface AnalysisSetup {
  setupId: number
  label: string
  position: number
  /** The setup this analysis takes gains against (baselineSetupId). */
  isBaseline: boolean
  pulls: AnalysisPull[]
  spreadPct: number | null
  outlierPullId: number | null
  idleVacuumInHg: number | null
  rpmFrom: number
  rpmTo: number
  /** The averaged, corrected curve thinned for drawing. */
  curve: CurvePoint[]
}

export interface GainCurve { setupId: number, againstSetupId: number, curve: CurvePoint[] }

export interface AnalysisGains {
  peakPower: number
  peakPowerPct: number
  peakTorque: number
  peakTorquePct: number
  averagePower: number
  averagePowerPct: number
  averageTorque: number
  averageTorquePct: number
  largestGain: { power: AtRpm, torque: AtRpm }
  /** Smallest gain on the grid: negative where the setup loses. */
  largestLoss: { power: AtRpm, torque: AtRpm }
  crossovers: { powerRpm: number[], torqueRpm: number[] }
  idleVacuumInHg: number | null
  /** null when no setup of the two has repeat pulls to judge by. */
  withinRepeatability: { peakPower: boolean | null, peakTorque: boolean | null, averagePower: boolean | null, averageTorque: boolean | null }
}

export interface AnalysisRow {
  setupId: number
  label: string
  isBaseline: boolean
  peakPower: AtRpm
  peakTorque: AtRpm
  /** Over the table's shared band. */
  averagePower: number
  averageTorque: number
  powerBand: RpmRange
  spreadPct: number | null
  idleVacuumInHg: number | null
  vsBaseline: AnalysisGains | null
  vsPrevious: AnalysisGains | null
}

export interface AnalysisResponse {
  benchTestId: number
  standard: CorrectionStandard
  standardLabel: string
  units: { id: AnalysisUnits, power: 'hp' | 'kW', torque: 'lb-ft' | 'N-m' }
  /** The setup gains are taken against; first row of the table. */
  baselineSetupId: number
  /** Chosen setups in table order: baseline first, then by position. */
  setups: AnalysisSetup[]
  /** Gain curves (setup minus baseline) on the shared grid. */
  gains: GainCurve[]
  table: { band: RpmRange, rows: AnalysisRow[] }
  /** Setups left out (no included pulls) and other notes for the page. */
  notes: string[]
}
