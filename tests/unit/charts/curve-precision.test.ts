import { describe, expect, it } from 'vitest'
import { roundCurve, withRoundedCurves } from '../../../shared/utils/curve-precision'
import type { AnalysisResponse } from '../../../shared/types/workspace'

// Rounding for display only (common practice: a value is carried to a finer step
// than it is shown, here 0.01 against the readout's 0.1).
describe('curves rounded for readers', () => {
  const points = [
    { rpm: 3000, torque: 378.71953549751515, power: 216.28945525956047 },
    { rpm: 3010, torque: 379.0749999, power: 217.235 },
  ]

  it('rounds torque and power to the places asked and keeps rpm', () => {
    expect(roundCurve(points, 2)).toEqual([
      { rpm: 3000, torque: 378.72, power: 216.29 },
      { rpm: 3010, torque: 379.07, power: 217.24 },
    ])
  })

  it('moves no value by more than half of the last place', () => {
    for (const [a, b] of roundCurve(points, 2).map((p, i) => [p, points[i]!] as const)) {
      expect(Math.abs(a.torque - b.torque)).toBeLessThanOrEqual(0.005 + 1e-12)
      expect(Math.abs(a.power - b.power)).toBeLessThanOrEqual(0.005 + 1e-12)
    }
  })

  it('copies the analysis: the cached original keeps its full values', () => {
    const analysis = {
      setups: [{ setupId: 1, curve: points }],
      gains: [{ setupId: 2, againstSetupId: 1, curve: points }],
      table: { band: { fromRpm: 3000, toRpm: 3010 }, rows: [] },
    } as unknown as AnalysisResponse
    const rounded = withRoundedCurves(analysis, 1)
    expect(rounded.setups[0]!.curve[0]).toEqual({ rpm: 3000, torque: 378.7, power: 216.3 })
    expect(rounded.gains[0]!.curve[1]).toEqual({ rpm: 3010, torque: 379.1, power: 217.2 })
    expect(analysis.setups[0]!.curve[0]!.torque).toBe(378.71953549751515)
    expect(rounded.table).toBe(analysis.table)
  })
})
