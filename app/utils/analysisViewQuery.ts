// The workspace analysis page's choices as URL query parameters (issue 15 item 15):
// setups shown, baseline, correction standard and units, so a view can be bookmarked
// and shared. Pure: parse what a link carries (ignoring anything unknown or malformed,
// so an old or edited link still opens) and write a choice back.
import { ANALYSIS_UNITS, type AnalysisUnits } from '#shared/types/analysis'
import { CORRECTION_STANDARD_IDS, type CorrectionStandard } from '#shared/dyno'

export interface AnalysisView {
  /** null: every setup with included pulls. */
  setupIds: number[] | null
  baselineId: number | null
  standard: CorrectionStandard | null
}

export interface AnalysisViewQuery extends AnalysisView {
  /** null: the query does not say; the page keeps the reader's last units. */
  units: AnalysisUnits | null
}

export const ANALYSIS_VIEW_KEYS = ['setups', 'baseline', 'standard', 'units'] as const

type QueryValue = string | null | undefined | (string | null)[]

const single = (v: QueryValue): string | undefined => (Array.isArray(v) ? v[0] ?? undefined : v ?? undefined)
const id = (s: string) => (/^\d{1,9}$/.test(s) && Number(s) > 0 ? Number(s) : null)

export function parseAnalysisView(query: Record<string, QueryValue>): AnalysisViewQuery {
  const setups = single(query.setups)?.split(',').map(s => id(s.trim()))
  const standard = single(query.standard)
  const units = single(query.units)
  return {
    setupIds: setups?.length && setups.every(n => n !== null) ? [...new Set(setups as number[])] : null,
    baselineId: id(single(query.baseline) ?? ''),
    standard: (CORRECTION_STANDARD_IDS as readonly string[]).includes(standard ?? '') ? standard as CorrectionStandard : null,
    units: ANALYSIS_UNITS.some(u => u.id === units) ? units as AnalysisUnits : null,
  }
}

/** True when the query names any of the page's choices. */
export function hasAnalysisView(query: Record<string, QueryValue>): boolean {
  return ANALYSIS_VIEW_KEYS.some(k => query[k] !== undefined)
}

/**
 * The query for a choice, keeping any other parameters the URL carries; a choice
 * left to its default (all setups, the bench test's baseline and standard) is left out.
 */
export function analysisViewQuery(view: AnalysisView & { units: AnalysisUnits }, others: Record<string, QueryValue> = {}): Record<string, QueryValue> {
  const out: Record<string, QueryValue> = Object.fromEntries(Object.entries(others).filter(([k]) => !(ANALYSIS_VIEW_KEYS as readonly string[]).includes(k)))
  if (view.setupIds) out.setups = view.setupIds.join(',')
  if (view.baselineId !== null) out.baseline = String(view.baselineId)
  if (view.standard) out.standard = view.standard
  out.units = view.units
  return out
}
