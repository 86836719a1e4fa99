// A story's standalone figure, worked out from its figures the way the page draws
// it (FigureGraph's server picture, FigureResultsTable's rows), for drawing outside
// the page: print exports, the social card.
import { GainGraphProps, PullGraphProps, ResultsTableProps, type FigureOptionsResult, type GainGraphOptions } from '#shared/types/story-figures'
import { formatFigureNumber } from '#shared/stories/figure-values'
import type { StoryFigures } from '#shared/types/stories'
import type { PullChartOption } from '#shared/utils/chart-options'
import { graphChartOptions } from '#shared/utils/figure-charts'
import { chartUnits, gainCurves, graphSetups, overlayCurves, resultsTableRows, type GraphView, type ResultsTableRow } from '#shared/utils/figure-data'
import { standaloneFigure, type StandaloneFigure } from '#shared/figures/story-figure-list'

export interface GraphModel {
  kind: 'graph'
  title: string
  /** "Corrected to SAE J1349 ..." and, for gains, what they are taken against. */
  note: string
  view: GraphView
  /** Two-panel or one-panel options without a legend (the print style lays one out). */
  option: PullChartOption
}

export interface TableModel {
  kind: 'table'
  title: string
  note: string
  rows: ResultsTableRow[]
}

/** The columns of the results table, as the page heads them. */
export const RESULTS_COLUMNS: { key: keyof ResultsTableRow, label: string }[] = [
  { key: 'label', label: 'Setup' },
  { key: 'peakPower', label: 'Peak power (at rpm)' },
  { key: 'peakTorque', label: 'Peak torque (at rpm)' },
  { key: 'averagePower', label: 'Average power' },
  { key: 'powerGain', label: 'Peak power gain' },
  { key: 'torqueGain', label: 'Peak torque gain' },
  { key: 'averagePowerGain', label: 'Average power gain' },
  { key: 'powerBand', label: 'Power band (rpm)' },
  { key: 'idleVacuum', label: 'Idle vacuum' },
]

const notFound = (message: string) => createError({ statusCode: 404, statusMessage: 'Not Found', message })
const unusable = (message: string) => createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message })

function optionsOf<T>(parsed: FigureOptionsResult<T>): T {
  if (!parsed.success) throw unusable(`The figure's options are not right: ${parsed.error.issues.map(i => i.message).join('; ')}.`)
  return parsed.data
}

export function graphModel(figure: StandaloneFigure, figures: StoryFigures): GraphModel {
  const analysis = figures.analysis
  if (!analysis) throw unusable(figures.analysisProblem ?? 'The bench test has no analysed pulls yet.')
  const gain = figure.name === 'gain-graph'
  const o = gain ? optionsOf(GainGraphProps.safeParse(figure.props)) : optionsOf(PullGraphProps.safeParse(figure.props))
  const chosen = graphSetups(analysis, o.setups)
  if (chosen.missing.length) throw unusable(`Setup ${chosen.missing.join(', ')} has no analysed pulls in this bench test.`)
  const baselineId = (gain ? (o as GainGraphOptions).baseline : undefined) ?? analysis.baselineSetupId
  const baselineLabel = analysis.setups.find(s => s.setupId === baselineId)?.label ?? 'the baseline'
  const win = { from: o.from, to: o.to, units: 'hp-lbft' as const }
  const curves = gain ? gainCurves(analysis, baselineId, chosen.setups, win) : overlayCurves(analysis, chosen.setups, win)
  const option = graphChartOptions({ kind: gain ? 'gain' : 'overlay', curves, units: chartUnits('hp-lbft'), view: o.channel, baselineLabel })
  const title = o.caption || (gain ? `Gains over ${baselineLabel}` : chosen.setups.map(s => s.label).join(' vs '))
  const note = `Corrected to ${analysis.standardLabel}.${gain ? ` Each setup minus ${baselineLabel} at the same rpm.` : ''}`
  return { kind: 'graph', title, note, view: o.channel, option }
}

export function tableModel(figure: StandaloneFigure, figures: StoryFigures): TableModel {
  const analysis = figures.analysis
  if (!analysis) throw unusable(figures.analysisProblem ?? 'The bench test has no analysed pulls yet.')
  const o = optionsOf(ResultsTableProps.safeParse(figure.props))
  const baselineId = o.baseline ?? analysis.baselineSetupId
  const known = new Set(analysis.table.rows.map(r => r.setupId))
  const missing = [...(o.setups ?? []), baselineId].filter(id => !known.has(id))
  if (missing.length) throw unusable(`Setup ${missing.join(', ')} has no analysed pulls in this bench test.`)
  const baselineLabel = analysis.setups.find(s => s.setupId === baselineId)?.label ?? 'the baseline'
  const band = analysis.table.band
  const bandText = `${formatFigureNumber(band.fromRpm, 0)}-${formatFigureNumber(band.toRpm, 0)} rpm`
  return {
    kind: 'table',
    title: o.caption || 'Results',
    note: `Corrected to ${analysis.standardLabel}. Averages over ${bandText}; gains are over ${baselineLabel}.`,
    rows: resultsTableRows(analysis, figures.comparisons, o.setups, baselineId),
  }
}

/** The figure with this number in the story, or 404. */
export function requireStandaloneFigure(body: string, number: number): StandaloneFigure {
  const figure = standaloneFigure(body, number)
  if (!figure) throw notFound(`The story has no figure ${number}.`)
  return figure
}
