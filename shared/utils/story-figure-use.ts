// What a story's body uses of its bench test, and what its inline values read: the
// parts of the story view the reader's page needs in the browser. Kept apart from
// story-view.ts, whose analysis (and the downsampling library it imports) stays on
// the server and in the editor.
import type { FigureSource } from '../types/story-figures'
import type { StoryFigures } from '../types/stories'
import { parseFigure } from './story-body'
import { findFigures } from './story-markup'

export interface SetupsUsed {
  /** Setup ids the figures name (setups, setup, vs, baseline), in order of first mention. */
  ids: number[]
  /**
   * Every setup of the bench test: a graph or table without a setup list shows them
   * all, and a text that names none is about the whole test (its prose numbers are
   * checked against all of it).
   */
  all: boolean
  /** The body shows the build sheet. */
  buildSheet: boolean
  /** The body shows the test day, the plan against what happened (optional for callers that predate it). */
  dayReport?: boolean
}

const idsOf = (v: unknown): number[] => (Array.isArray(v) ? v.filter((x): x is number => typeof x === 'number') : typeof v === 'number' ? [v] : [])

const TAKES_SETUPS = new Set(['pull-graph', 'gain-graph', 'results-table'])

/** Which setups (and whether the build sheet) the body's figures use. */
export function setupsUsed(body: string): SetupsUsed {
  const ids: number[] = []
  let all = false
  let buildSheet = false
  let dayReport = false
  for (const use of findFigures(body)) {
    const parsed = parseFigure(use)
    if (!parsed?.success) continue
    const o = parsed.data as Record<string, unknown>
    if (use.name === 'spec-box') buildSheet = true
    if (use.name === 'day-report') dayReport = true
    if (TAKES_SETUPS.has(use.name) && !idsOf(o.setups).length) all = true
    ids.push(...idsOf(o.setups), ...idsOf(o.setup), ...idsOf(o.vs), ...idsOf(o.baseline))
  }
  return { ids: [...new Set(ids)], all: all || ids.length === 0, buildSheet, dayReport }
}

/** What inline values are read from (the analysis in hp and lb-ft and every pair's gains). */
export function figureSourceOf(figures: Pick<StoryFigures, 'analysis' | 'comparisons'> | null): FigureSource | null {
  const a = figures?.analysis
  if (!a || !figures) return null
  return {
    analysis: { baselineSetupId: a.baselineSetupId, table: a.table, units: a.units, setups: a.setups.map(s => ({ setupId: s.setupId, label: s.label })) },
    comparisons: figures.comparisons,
  }
}
