// The figures of a story that stand on their own outside the page: graphs and
// tables a print layout, a social card or another site's page can take. Each has
// a number, its place among these in the body (1, 2, ...), which the export and
// embed addresses use: `/embed/<slug>/2` is the story's second such figure.
import { findFigures, type FigureUse } from '../utils/story-markup'

/** Figures that carry data; photos, galleries and cautions belong to the page. */
export const STANDALONE_FIGURES = ['pull-graph', 'gain-graph', 'results-table', 'spec-box', 'cam-card'] as const
export type StandaloneFigureName = typeof STANDALONE_FIGURES[number]

/** Which of them print exports give as a drawing (SVG, PDF) and which as a table (PDF table, CSV). */
export const GRAPH_FIGURES: readonly StandaloneFigureName[] = ['pull-graph', 'gain-graph']
export const TABLE_FIGURES: readonly StandaloneFigureName[] = ['results-table']

export interface StandaloneFigure {
  number: number
  name: StandaloneFigureName
  /** Options as written. */
  props: Record<string, string>
  line: number
  /** The figure's markup alone, as a body of its own (opening line and `::`). */
  markup: string
}

export function standaloneFigures(body: string): StandaloneFigure[] {
  return findFigures(body)
    .filter((f): f is FigureUse & { name: StandaloneFigureName } => f.kind === 'block' && (STANDALONE_FIGURES as readonly string[]).includes(f.name))
    .map((f, i) => ({ number: i + 1, name: f.name, props: f.props, line: f.line, markup: `${f.source}\n::\n` }))
}

export function standaloneFigure(body: string, number: number): StandaloneFigure | null {
  return standaloneFigures(body).find(f => f.number === number) ?? null
}

const KIND_LABEL: Record<StandaloneFigureName, string> = {
  'pull-graph': 'Graph',
  'gain-graph': 'Gain graph',
  'results-table': 'Results table',
  'spec-box': 'Build sheet',
  'cam-card': 'Cam card',
}

/** "Figure 2, gain graph: Gains over the baseline" (the caption when the writer gave one). */
export function standaloneFigureLabel(figure: Pick<StandaloneFigure, 'number' | 'name' | 'props'>): string {
  const kind = KIND_LABEL[figure.name]
  const caption = figure.props.caption?.trim()
  return caption ? `Figure ${figure.number}, ${kind.toLowerCase()}: ${caption}` : `Figure ${figure.number}, ${kind.toLowerCase()}`
}
