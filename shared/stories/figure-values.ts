// Inline figure values (`:figure-value{...}`) as the reader sees them, computed from
// the story's figures after reporting rounding; the figures and their options are in
// shared/types/story-figures.ts.
import { reportFixed, reportRound } from '../dyno/round'
import type { AnalysisGains, AnalysisRow } from '../types/analysis-results'
import {
  DEFAULT_DECIMALS, INLINE_FIGURES,
  type FigureSource, type FigureUnit, type FigureValueOptions, type InlineFigureKey, type InlineFigureValue,
} from '../types/story-figures'

/** A reported number as text: ties away from zero, thousands grouped ("6,200"). */
export function formatFigureNumber(value: number, decimals: number): string {
  const fixed = reportFixed(value, decimals)
  const negative = fixed.startsWith('-')
  const [whole = '0', frac] = (negative ? fixed.slice(1) : fixed).split('.')
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',')
  return `${negative ? '-' : ''}${grouped}${frac === undefined ? '' : `.${frac}`}`
}

export function withUnit(number: string, unit: FigureUnit): string {
  return unit === '%' ? `${number}%` : `${number} ${unit}`
}

export function inlineFigureMeta(key: InlineFigureKey) {
  return INLINE_FIGURES.find(f => f.id === key)!
}

type Raw = { value: number | null, text?: string, withinRepeatability?: boolean | null }

function singleFigure(key: InlineFigureKey, row: AnalysisRow): Raw {
  switch (key) {
    case 'peak-power': return { value: row.peakPower.value }
    case 'peak-power-rpm': return { value: row.peakPower.rpm }
    case 'peak-torque': return { value: row.peakTorque.value }
    case 'peak-torque-rpm': return { value: row.peakTorque.rpm }
    case 'average-power': return { value: row.averagePower }
    case 'average-torque': return { value: row.averageTorque }
    case 'power-band-width': return { value: row.powerBand.toRpm - row.powerBand.fromRpm }
    case 'idle-vacuum': return { value: row.idleVacuumInHg }
    default: return { value: null }
  }
}

function pairFigure(key: InlineFigureKey, g: AnalysisGains): Raw {
  const r = g.withinRepeatability
  switch (key) {
    case 'peak-power-gain': return { value: g.peakPower, withinRepeatability: r.peakPower }
    case 'peak-power-gain-pct': return { value: g.peakPowerPct, withinRepeatability: r.peakPower }
    case 'peak-torque-gain': return { value: g.peakTorque, withinRepeatability: r.peakTorque }
    case 'peak-torque-gain-pct': return { value: g.peakTorquePct, withinRepeatability: r.peakTorque }
    case 'average-power-gain': return { value: g.averagePower, withinRepeatability: r.averagePower }
    case 'average-power-gain-pct': return { value: g.averagePowerPct, withinRepeatability: r.averagePower }
    case 'average-torque-gain': return { value: g.averageTorque, withinRepeatability: r.averageTorque }
    case 'average-torque-gain-pct': return { value: g.averageTorquePct, withinRepeatability: r.averageTorque }
    case 'largest-power-gain': return { value: g.largestGain.power.value }
    case 'largest-power-gain-rpm': return { value: g.largestGain.power.rpm }
    case 'largest-torque-gain': return { value: g.largestGain.torque.value }
    case 'largest-torque-gain-rpm': return { value: g.largestGain.torque.rpm }
    // The smallest gain is a loss only when it is below zero.
    case 'largest-power-loss': return g.largestLoss.power.value < 0 ? { value: -g.largestLoss.power.value } : { value: null, text: 'no loss' }
    case 'largest-torque-loss': return g.largestLoss.torque.value < 0 ? { value: -g.largestLoss.torque.value } : { value: null, text: 'no loss' }
    case 'torque-crossover-rpm': return g.crossovers.torqueRpm.length ? { value: g.crossovers.torqueRpm[0]! } : { value: null, text: 'no crossover' }
    case 'power-crossover-rpm': return g.crossovers.powerRpm.length ? { value: g.crossovers.powerRpm[0]! } : { value: null, text: 'no crossover' }
    case 'idle-vacuum-change': return { value: g.idleVacuumInHg }
    default: return { value: null }
  }
}

function missingFigure(key: InlineFigureKey, label: string, problem: string): InlineFigureValue {
  return { text: '[no such figure]', value: null, unit: inlineFigureMeta(key).unit, label, withinRepeatability: null, problem }
}

/**
 * The text of an inline value after reporting rounding, from the story's figures.
 * The editor's preview and the reader's page both call this, so they cannot differ.
 */
export function inlineFigureValue(source: FigureSource, options: FigureValueOptions): InlineFigureValue {
  const meta = inlineFigureMeta(options.of)
  const decimals = options.decimals ?? DEFAULT_DECIMALS[meta.unit]
  const setupLabel = (id: number) => source.analysis.setups.find(s => s.setupId === id)?.label
  const name = setupLabel(options.setup)
  if (source.analysis.units.power !== 'hp') return missingFigure(options.of, meta.label, 'Figures are given in hp and lb-ft.')
  if (!name) return missingFigure(options.of, meta.label, `Setup ${options.setup} has no analysed pulls in this bench test.`)

  let raw: Raw
  let label: string = `${meta.label}, ${name}`
  if (meta.pair) {
    const vs = options.vs ?? source.analysis.baselineSetupId
    const vsName = setupLabel(vs)
    if (!vsName) return missingFigure(options.of, label, `Setup ${vs} has no analysed pulls in this bench test.`)
    if (vs === options.setup) return missingFigure(options.of, label, 'A gain compares two different setups.')
    label = `${meta.label}, ${name} vs ${vsName}`
    const comparison = source.comparisons.find(c => c.setupId === options.setup && c.vsSetupId === vs)
    if (!comparison) return missingFigure(options.of, label, `No comparison of setup ${options.setup} with setup ${vs}.`)
    raw = pairFigure(options.of, comparison.gains)
  }
  else {
    const row = source.analysis.table.rows.find(r => r.setupId === options.setup)
    if (!row) return missingFigure(options.of, label, `Setup ${options.setup} is not in the results table.`)
    if (options.of === 'power-band') {
      const text = `${formatFigureNumber(row.powerBand.fromRpm, decimals)}-${withUnit(formatFigureNumber(row.powerBand.toRpm, decimals), 'rpm')}`
      return { text, value: null, unit: 'rpm', label, withinRepeatability: null, problem: null }
    }
    raw = singleFigure(options.of, row)
  }

  const withinRepeatability = raw.withinRepeatability ?? null
  if (raw.value === null || !Number.isFinite(raw.value)) {
    if (raw.text) return { text: raw.text, value: null, unit: meta.unit, label, withinRepeatability, problem: null }
    return missingFigure(options.of, label, meta.unit === 'inHg' ? 'No idle vacuum was measured for this setup.' : 'The data gives no such figure.')
  }
  const value = reportRound(raw.value, decimals)
  // Brief: a gain smaller than the spread of repeat pulls is shown as within repeatability, not as a gain.
  const text = withinRepeatability === true ? 'within repeatability' : withUnit(formatFigureNumber(raw.value, decimals), meta.unit)
  return { text, value, unit: meta.unit, label, withinRepeatability, problem: null }
}
