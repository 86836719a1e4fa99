// A story's figures from its data (story-data.ts): the one builder behind the
// editor's preview, preview links, the number check, the desk and the reader's page.
// Pure: the server calls it on a live snapshot or on an edition, and the same data
// gives the same figures, whoever looks.
import { AnalysisInputError, analyseBench, type BenchAnalysis } from '../dyno/analyse'
import type { CorrectionStandard } from '../dyno/types'
import type { AnalysisUnits } from '../types/analysis'
import { DEFAULT_DECIMALS, type FigureSource, type FigureValueOptions } from '../types/story-figures'
import { inlineFigureValue } from '../stories/figure-values'
import type { MovedFigure, StoryData } from '../types/story-data'
import type { StoryFigures, StoryPhoto } from '../types/stories'
import { parseFigure } from './story-body'
import { findFigures } from './story-markup'
import { formatReported } from './figures'
import { figureSourceOf } from './story-figure-use'

export interface FigureSettings {
  /** Default: the data's (the bench test's standard when frozen). */
  standard?: CorrectionStandard
  units?: AnalysisUnits
}

/** The analysis of the story's data with every ordered pair compared; null with the reason when there is none. */
export function storyAnalysis(data: StoryData, settings: FigureSettings = {}): { analysis: BenchAnalysis | null, problem: string | null } {
  try {
    return { analysis: analyseBench(data.bench, { standard: settings.standard, units: settings.units, pairs: 'all', maxPoints: 400 }), problem: null }
  }
  catch (e) {
    if (!(e instanceof AnalysisInputError)) throw e
    return { analysis: null, problem: e.message }
  }
}

/** Everything the body's figures are drawn from, built from the data alone. */
export function storyFiguresFromData(data: StoryData, photos: StoryPhoto[], settings: FigureSettings = {}): StoryFigures {
  const { analysis, problem } = storyAnalysis(data, settings)
  let comparisons: StoryFigures['comparisons'] = []
  let shown: StoryFigures['analysis'] = null
  if (analysis) {
    const { comparisons: pairs, ...rest } = analysis
    comparisons = pairs
    shown = rest
  }
  return {
    benchTestId: data.benchTest.id,
    analysis: shown,
    analysisProblem: problem,
    comparisons,
    buildSheet: data.buildSheet,
    // Only when the data has it: other stories' payloads stay as they were.
    ...(data.dayReport !== undefined ? { dayReport: data.dayReport } : {}),
    setups: data.setups,
    photos,
    problems: [],
  }
}

/** Keys sorted at every level, so equal data always gives the same text (and hash). */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) => {
    if (!v || typeof v !== 'object' || Array.isArray(v)) return v
    return Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
  })
}

export const STORY_ROUNDING: StoryData['rounding'] = { decimals: DEFAULT_DECIMALS, curvePlaces: 2 }

function inlineTexts(body: string, source: FigureSource | null): Map<string, { label: string, text: string }> {
  const out = new Map<string, { label: string, text: string }>()
  for (const use of findFigures(body)) {
    if (use.kind !== 'inline') continue
    const parsed = parseFigure(use)
    if (!parsed?.success) continue
    const value = source ? inlineFigureValue(source, parsed.data as FigureValueOptions) : null
    out.set(use.source, { label: value?.label ?? use.source, text: value?.text ?? '[no data]' })
  }
  return out
}

function tableTexts(figures: StoryFigures): Map<string, { label: string, text: string }> {
  const out = new Map<string, { label: string, text: string }>()
  const a = figures.analysis
  if (!a) return out
  for (const r of a.table.rows) {
    const put = (what: string, text: string) => out.set(`${r.setupId}:${what}`, { label: `${what}, ${r.label}`, text })
    put('Peak power', `${formatReported(r.peakPower.value)} hp at ${formatReported(r.peakPower.rpm)} rpm`)
    put('Peak torque', `${formatReported(r.peakTorque.value)} lb-ft at ${formatReported(r.peakTorque.rpm)} rpm`)
    put('Average power', `${formatReported(r.averagePower, 1)} hp`)
    put('Average torque', `${formatReported(r.averageTorque, 1)} lb-ft`)
    put('Power band', `${formatReported(r.powerBand.fromRpm)}-${formatReported(r.powerBand.toRpm)} rpm`)
    if (r.vsBaseline) put('Peak power gain over the baseline', `${formatReported(r.vsBaseline.peakPower, 1)} hp`)
  }
  return out
}

function dayReportTexts(figures: StoryFigures): Map<string, { label: string, text: string }> {
  const out = new Map<string, { label: string, text: string }>()
  if (figures.dayReport) out.set('day-report', { label: 'The test day, plan against what happened', text: figures.dayReport.summary })
  return out
}

/**
 * Every figure of the story whose reported value differs between two sets of data:
 * the inline values of the body, each setup's row of the results table and the
 * test day's sentences.
 */
export function movedFigures(body: string, before: StoryFigures, after: StoryFigures): MovedFigure[] {
  const moved: MovedFigure[] = []
  const compare = (a: Map<string, { label: string, text: string }>, b: Map<string, { label: string, text: string }>) => {
    for (const key of new Set([...a.keys(), ...b.keys()])) {
      const old = a.get(key)
      const now = b.get(key)
      if (old?.text === now?.text) continue
      moved.push({ label: now?.label ?? old?.label ?? key, figure: key, old: old?.text ?? 'not in the data', new: now?.text ?? 'not in the data' })
    }
  }
  compare(inlineTexts(body, figureSourceOf(before)), inlineTexts(body, figureSourceOf(after)))
  compare(tableTexts(before), tableTexts(after))
  compare(dayReportTexts(before), dayReportTexts(after))
  return moved
}

/**
 * The gain curves the body's graphs draw ("setup:against"): each gain graph's setups
 * over its baseline (default the analysis's), and every setup over the baseline for
 * the page's own data section. Numbers of every pair travel anyway; curves are heavier.
 */
export function gainPairsShown(body: string, analysis: { baselineSetupId: number, setups: { setupId: number }[] }): Set<string> {
  const out = new Set<string>()
  const ids = analysis.setups.map(s => s.setupId)
  for (const id of ids) out.add(`${id}:${analysis.baselineSetupId}`)
  for (const use of findFigures(body)) {
    if (use.name !== 'gain-graph') continue
    const parsed = parseFigure(use)
    if (!parsed?.success) continue
    const o = parsed.data as { setups?: number[], baseline?: number }
    const base = o.baseline ?? analysis.baselineSetupId
    for (const id of o.setups?.length ? o.setups : ids) out.add(`${id}:${base}`)
  }
  return out
}
