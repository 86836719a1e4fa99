// Curves sent to readers' pages are for drawing and for a readout shown to 0.1:
// seventeen significant digits per value only make every page's payload heavier.
// Peaks, gains and the results table come from the full data and are not touched.
import type { AnalysisResponse, CurvePoint } from '../types/workspace'

function roundTo(value: number, places: number): number {
  const scale = 10 ** places
  return Math.round(value * scale) / scale
}

/** The points with torque and power rounded to `places` decimals; rpm as it was. */
export function roundCurve(points: readonly CurvePoint[], places: number): CurvePoint[] {
  return points.map(p => ({ rpm: p.rpm, torque: roundTo(p.torque, places), power: roundTo(p.power, places) }))
}

/** A copy of the analysis whose drawn curves (each setup's and each gain curve) are rounded. */
export function withRoundedCurves(analysis: AnalysisResponse, places: number): AnalysisResponse {
  return {
    ...analysis,
    setups: analysis.setups.map(s => ({ ...s, curve: roundCurve(s.curve, places) })),
    gains: analysis.gains.map(g => ({ ...g, curve: roundCurve(g.curve, places) })),
  }
}
