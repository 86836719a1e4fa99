// What a story's graphs and tables show, worked out from the story's figures
// (GET /api/stories/:id/figures, or the reader's view): which setups, which
// curves in which units, the gain curves against any setup, the rows of the data
// table under each graph and the written summary for screen readers. Pure: the
// server's SVG render, the live graph and the tables all read the same numbers.
import { scaleCurve } from '../dyno/unit-scale'
import type { AnalysisGains, AnalysisResponse, CurvePoint } from '../types/analysis-results'
import type { FigureComparison } from '../types/story-figures'
import { formatFigureNumber } from '../stories/figure-values'
import { curveValueAt, type ChartCurve, type ChartUnits } from './chart-options'

export const FIGURE_UNIT_CHOICES = [
  { id: 'hp-lbft', label: 'hp and lb-ft', power: 'hp', torque: 'lb-ft' },
  { id: 'kw-nm', label: 'kW and N-m', power: 'kW', torque: 'N-m' },
] as const
export type FigureUnitChoice = typeof FIGURE_UNIT_CHOICES[number]['id']

export function chartUnits(choice: FigureUnitChoice): ChartUnits {
  const u = FIGURE_UNIT_CHOICES.find(c => c.id === choice) ?? FIGURE_UNIT_CHOICES[0]
  return { power: u.power, torque: u.torque }
}

/** The story's figures are in hp and lb-ft (docs/api/stories.md); other units by shared/dyno's one conversion. */
export function convertPoints(points: readonly CurvePoint[], choice: FigureUnitChoice): CurvePoint[] {
  return choice === 'hp-lbft' ? points.slice() : scaleCurve(points, choice)
}

export function clipPoints(points: readonly CurvePoint[], from?: number, to?: number): CurvePoint[] {
  return points.filter(p => (from === undefined || p.rpm >= from) && (to === undefined || p.rpm <= to))
}

/**
 * At most `max` points for drawing, evenly over the rpm range with both ends and the
 * highest power and torque kept, so a thinned curve still peaks where the data does.
 */
export function thinCurve(points: readonly CurvePoint[], max: number): CurvePoint[] {
  if (points.length <= max || max < 4) return points.slice()
  const keep = new Set<number>([0, points.length - 1])
  let maxPower = 0
  let maxTorque = 0
  points.forEach((p, i) => {
    if (p.power > points[maxPower]!.power) maxPower = i
    if (p.torque > points[maxTorque]!.torque) maxTorque = i
  })
  keep.add(maxPower).add(maxTorque)
  const step = (points.length - 1) / (max - keep.size + 1)
  for (let x = step; x < points.length - 1 && keep.size < max; x += step) keep.add(Math.round(x))
  return [...keep].sort((a, b) => a - b).map(i => points[i]!)
}

export interface GraphSetup { setupId: number, label: string, isBaseline: boolean, styleIndex: number }

/**
 * The setups a figure names that have data, in the order written (or every analysed
 * setup), each keeping one look across all graphs of the story (its place in the
 * analysis), and the ids that have no data.
 */
export function graphSetups(analysis: Pick<AnalysisResponse, 'setups'>, ids?: readonly number[]): { setups: GraphSetup[], missing: number[] } {
  const all = analysis.setups.map((s, i) => ({ setupId: s.setupId, label: s.label, isBaseline: s.isBaseline, styleIndex: i }))
  if (!ids || !ids.length) return { setups: all, missing: [] }
  const setups: GraphSetup[] = []
  const missing: number[] = []
  for (const id of ids) {
    const found = all.find(s => s.setupId === id)
    if (found) setups.push(found)
    else missing.push(id)
  }
  return { setups, missing }
}

export interface CurveWindow { from?: number, to?: number, units: FigureUnitChoice }

/** Each setup's corrected curve, in the chosen units and rpm window. */
export function overlayCurves(analysis: Pick<AnalysisResponse, 'setups'>, setups: readonly GraphSetup[], win: CurveWindow): ChartCurve[] {
  return setups.flatMap((s) => {
    const data = analysis.setups.find(a => a.setupId === s.setupId)
    if (!data) return []
    return [{ id: s.setupId, label: s.label, styleIndex: s.styleIndex, points: convertPoints(clipPoints(data.curve, win.from, win.to), win.units) }]
  })
}

/**
 * Gain curves of setups over any setup of the analysis, as shared/dyno computed them
 * from the full curves (every ordered pair a story may draw is in analysis.gains).
 */
export function gainCurves(analysis: Pick<AnalysisResponse, 'setups' | 'gains' | 'baselineSetupId'>, baselineId: number, setups: readonly GraphSetup[], win: CurveWindow): ChartCurve[] {
  if (!analysis.setups.some(s => s.setupId === baselineId)) return []
  return setups.filter(s => s.setupId !== baselineId).flatMap((s) => {
    const curve = analysis.gains.find(g => g.setupId === s.setupId && g.againstSetupId === baselineId)?.curve
    if (!curve?.length) return []
    return [{ id: s.setupId, label: s.label, styleIndex: s.styleIndex, points: convertPoints(clipPoints(curve, win.from, win.to), win.units) }]
  })
}

export interface DataTableColumn { label: string, unit: string, values: (number | null)[] }
export interface DataTable { rpm: number[], columns: DataTableColumn[] }

export type GraphView = 'both' | 'power' | 'torque'

/** The graph's numbers every `stepRpm` (and at both ends), one column per curve and channel. */
export function graphDataTable(curves: readonly ChartCurve[], units: ChartUnits, view: GraphView, stepRpm = 250, labelOf: (c: ChartCurve) => string = c => c.label): DataTable {
  let from = Infinity
  let to = -Infinity
  for (const c of curves) {
    const first = c.points[0]
    const last = c.points[c.points.length - 1]
    if (first && first.rpm < from) from = first.rpm
    if (last && last.rpm > to) to = last.rpm
  }
  if (!Number.isFinite(from)) return { rpm: [], columns: [] }
  const rpm: number[] = []
  for (let r = Math.ceil(from / stepRpm) * stepRpm; r <= to; r += stepRpm) rpm.push(r)
  const channels = view === 'both' ? (['power', 'torque'] as const) : [view]
  const columns = channels.flatMap(channel => curves.map(c => ({
    label: `${labelOf(c)}, ${channel}`,
    unit: units[channel],
    values: rpm.map(r => curveValueAt(c.points, r, channel)),
  })))
  return { rpm, columns }
}

const whole = (n: number) => formatFigureNumber(n, 0)
const oneDecimal = (n: number) => formatFigureNumber(n, 1)

function peakOf(points: readonly CurvePoint[], channel: 'power' | 'torque'): CurvePoint | undefined {
  let best: CurvePoint | undefined
  for (const p of points) if (!best || p[channel] > best[channel]) best = p
  return best
}

function lowestOf(points: readonly CurvePoint[], channel: 'power' | 'torque'): CurvePoint | undefined {
  let low: CurvePoint | undefined
  for (const p of points) if (!low || p[channel] < low[channel]) low = p
  return low
}

function rpmSpan(curves: readonly ChartCurve[]): string {
  const rpms = curves.flatMap(c => c.points.map(p => p.rpm))
  if (!rpms.length) return ''
  return `from ${whole(Math.min(...rpms))} to ${whole(Math.max(...rpms))} rpm`
}

/** What an overlay graph shows, in words (its peaks within the window drawn). */
export function overlaySummary(curves: readonly ChartCurve[], units: ChartUnits, view: GraphView): string {
  if (!curves.length) return 'The graph has no setups with data to show.'
  const channels = view === 'both' ? (['power', 'torque'] as const) : [view]
  const what = view === 'both' ? 'Power and torque' : view === 'power' ? 'Power' : 'Torque'
  const parts = curves.map((c) => {
    const peaks = channels.map((ch) => {
      const p = peakOf(c.points, ch)
      return p ? `${whole(p[ch])} ${units[ch]} at ${whole(p.rpm)} rpm` : ''
    }).filter(Boolean)
    return `${c.label} peaks at ${peaks.join(' and ')}`
  })
  return `${what} against engine speed ${rpmSpan(curves)} for ${curves.map(c => c.label).join(', ')}. ${parts.join('. ')}.`
}

/** What a gain graph shows, in words: the largest gain and loss of each setup over the baseline. */
export function gainSummary(curves: readonly ChartCurve[], units: ChartUnits, view: GraphView, baselineLabel: string): string {
  if (!curves.length) return `The graph has no setups to compare with ${baselineLabel}.`
  const channels = view === 'both' ? (['power', 'torque'] as const) : [view]
  const parts = curves.map((c) => {
    const words = channels.map((ch) => {
      const hi = peakOf(c.points, ch)
      const lo = lowestOf(c.points, ch)
      if (!hi || !lo) return ''
      const gain = hi[ch] > 0 ? `gains up to ${oneDecimal(hi[ch])} ${units[ch]} of ${ch} at ${whole(hi.rpm)} rpm` : `gains no ${ch}`
      const loss = lo[ch] < 0 ? `, loses up to ${oneDecimal(-lo[ch])} ${units[ch]} at ${whole(lo.rpm)} rpm` : ''
      return gain + loss
    }).filter(Boolean)
    return `${c.label} ${words.join('; ')}`
  })
  return `Gain over ${baselineLabel} at each engine speed ${rpmSpan(curves)}. ${parts.join('. ')}.`
}

/** Gains of `setupId` over `vsId`: the analysis row's own when it is the baseline, else the comparison. */
export function gainsBetween(analysis: Pick<AnalysisResponse, 'table' | 'baselineSetupId'>, comparisons: readonly FigureComparison[], setupId: number, vsId: number): AnalysisGains | null {
  if (setupId === vsId) return null
  if (vsId === analysis.baselineSetupId) {
    const row = analysis.table.rows.find(r => r.setupId === setupId)
    if (row?.vsBaseline) return row.vsBaseline
  }
  return comparisons.find(c => c.setupId === setupId && c.vsSetupId === vsId)?.gains ?? null
}

/** A gain as a table shows it: "+12.4", "-3.0"; "0.0" carries no sign. */
export function signedFigure(value: number, decimals = 1): string {
  const text = formatFigureNumber(value, decimals)
  return /^-?[0.,]+$/.test(text) ? text.replace(/^-/, '') : value > 0 ? `+${text}` : text
}

export interface ResultsTableRow {
  setupId: number
  label: string
  isBaseline: boolean
  peakPower: string
  peakTorque: string
  averagePower: string
  averageTorque: string
  powerGain: string
  torqueGain: string
  averagePowerGain: string
  powerBand: string
  idleVacuum: string
}

/**
 * The results table of a story: every chosen setup's peaks (rounded to the unit),
 * averages over the shared band, peak-to-peak and average gains over the chosen
 * baseline (one decimal, or "within repeatability"), power band and idle vacuum.
 */
export function resultsTableRows(analysis: Pick<AnalysisResponse, 'table' | 'baselineSetupId' | 'units'>, comparisons: readonly FigureComparison[], setupIds: readonly number[] | undefined, baselineId: number): ResultsTableRow[] {
  const rows = setupIds?.length
    ? setupIds.flatMap(id => analysis.table.rows.filter(r => r.setupId === id))
    : analysis.table.rows
  const { power, torque } = analysis.units
  const gain = (value: number, within: boolean | null, unit: string) => (within ? 'within repeatability' : `${signedFigure(value)} ${unit}`)
  return rows.map((r) => {
    const g = r.setupId === baselineId ? null : gainsBetween(analysis, comparisons, r.setupId, baselineId)
    return {
      setupId: r.setupId,
      label: r.label,
      isBaseline: r.setupId === baselineId,
      peakPower: `${whole(r.peakPower.value)} ${power} at ${whole(r.peakPower.rpm)}`,
      peakTorque: `${whole(r.peakTorque.value)} ${torque} at ${whole(r.peakTorque.rpm)}`,
      averagePower: `${oneDecimal(r.averagePower)} ${power}`,
      averageTorque: `${oneDecimal(r.averageTorque)} ${torque}`,
      powerGain: g ? gain(g.peakPower, g.withinRepeatability.peakPower, power) : '–',
      torqueGain: g ? gain(g.peakTorque, g.withinRepeatability.peakTorque, torque) : '–',
      averagePowerGain: g ? gain(g.averagePower, g.withinRepeatability.averagePower, power) : '–',
      powerBand: `${whole(r.powerBand.fromRpm)}-${whole(r.powerBand.toRpm)}`,
      idleVacuum: r.idleVacuumInHg === null ? '–' : `${oneDecimal(r.idleVacuumInHg)} inHg`,
    }
  })
}
