// How the analysis is computed and shown, without zod: the reader's graphs and
// switches read these, and the analysis request schema (analysis-results.ts) builds on them.

/**
 * Grids of the analysis (common practice). A setup's curve is the mean of its pulls on
 * a fine grid, and peaks, averages and the power band come from it; gains, crossovers
 * and the spread between repeat pulls are judged at the trade's usual 100 rpm steps.
 */
export const ANALYSIS_GRID = { curveStepRpm: 10, compareStepRpm: 100 } as const

export const ANALYSIS_UNITS = [
  { id: 'hp-lbft', label: 'hp and lb-ft', power: 'hp', torque: 'lb-ft' },
  { id: 'kw-nm', label: 'kW and N-m', power: 'kW', torque: 'N-m' },
] as const
export type AnalysisUnits = typeof ANALYSIS_UNITS[number]['id']
