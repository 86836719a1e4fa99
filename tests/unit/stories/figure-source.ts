// A small hand-made figure source: two setups with round, readable figures, so
// each check can name the value it expects. Invented numbers (demo data).
import type { FigureSource } from '#shared/types/story-figures'
import type { AnalysisGains, AnalysisRow } from '#shared/types/analysis-results'

export const BASE = 11
export const CAM = 12
export const HEADERS = 13

export function gains(over: Partial<AnalysisGains> = {}): AnalysisGains {
  return {
    peakPower: 31.4,
    peakPowerPct: 6.44,
    peakTorque: 8.6,
    peakTorquePct: 1.86,
    averagePower: 12.25,
    averagePowerPct: 3.1,
    averageTorque: 4.04,
    averageTorquePct: 1.0,
    largestGain: { power: { value: 41.7, rpm: 6500 }, torque: { value: 33.6, rpm: 6500 } },
    largestLoss: { power: { value: -9.2, rpm: 3000 }, torque: { value: -16.1, rpm: 3000 } },
    crossovers: { powerRpm: [4180], torqueRpm: [4180] },
    idleVacuumInHg: -3.5,
    withinRepeatability: { peakPower: false, peakTorque: false, averagePower: false, averageTorque: true },
    ...over,
  }
}

export function row(over: Partial<AnalysisRow> & Pick<AnalysisRow, 'setupId' | 'label'>): AnalysisRow {
  return {
    isBaseline: false,
    peakPower: { value: 487.5, rpm: 6190 },
    peakTorque: { value: 462.3, rpm: 4400 },
    averagePower: 395.04,
    averageTorque: 402.7,
    powerBand: { fromRpm: 4800, toRpm: 6600 },
    spreadPct: 0.6,
    idleVacuumInHg: 17.5,
    vsBaseline: null,
    vsPrevious: null,
    ...over,
  }
}

export function source(): FigureSource {
  const camGains = gains()
  const headerGains = gains({ peakPower: 12.6, peakPowerPct: 2.4, crossovers: { powerRpm: [], torqueRpm: [] }, idleVacuumInHg: null, withinRepeatability: { peakPower: true, peakTorque: true, averagePower: true, averageTorque: true } })
  const rows: AnalysisRow[] = [
    row({ setupId: BASE, label: 'Baseline', isBaseline: true }),
    row({ setupId: CAM, label: 'Long cam', peakPower: { value: 518.9, rpm: 6400 }, peakTorque: { value: 470.9, rpm: 4700 }, idleVacuumInHg: 14, vsBaseline: camGains, vsPrevious: camGains }),
    row({ setupId: HEADERS, label: 'Long cam + headers', peakPower: { value: 531.5, rpm: 6500 }, idleVacuumInHg: null, vsBaseline: gains({ peakPower: 44 }), vsPrevious: headerGains }),
  ]
  return {
    analysis: {
      baselineSetupId: BASE,
      units: { id: 'hp-lbft', power: 'hp', torque: 'lb-ft' },
      table: { band: { fromRpm: 3000, toRpm: 6500 }, rows },
      setups: rows.map(r => ({ setupId: r.setupId, label: r.label })),
    },
    comparisons: [
      { setupId: CAM, vsSetupId: BASE, gains: camGains },
      { setupId: HEADERS, vsSetupId: BASE, gains: gains({ peakPower: 44 }) },
      { setupId: HEADERS, vsSetupId: CAM, gains: headerGains },
      { setupId: BASE, vsSetupId: CAM, gains: gains({ peakPower: -31.4, peakPowerPct: -6.05 }) },
    ],
  }
}
