// Unit scaling of analysed figures: hp and lb-ft (how the analysis stores them) to the
// reader's units. Its own module, free of the analysis' imports (the downsampling
// library among them), because the reader's page scales curves in the browser.
import type { AnalysisUnits } from '../types/analysis'
import type { CurvePoint } from '../types/analysis-results'
import { hpToKw, lbFtToNm } from './units'

export interface UnitScale { power: number, torque: number }

/** Multipliers from hp and lb-ft to the chosen units (SI conversions in units.ts). */
export function unitScale(units: AnalysisUnits): UnitScale {
  return units === 'kw-nm' ? { power: hpToKw(1), torque: lbFtToNm(1) } : { power: 1, torque: 1 }
}

/** Drawn curve points in other units (for tables built from an hp and lb-ft copy). */
export function scaleCurve(points: readonly CurvePoint[], units: AnalysisUnits): CurvePoint[] {
  const s = unitScale(units)
  return points.map(p => ({ rpm: p.rpm, torque: p.torque * s.torque, power: p.power * s.power }))
}
