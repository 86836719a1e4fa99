// Curves once (issue 19): a story page's payload carries each setup's drawn curve
// only every PAGE_CURVE_STEP_RPM, which is what the page's server-drawn graph, its
// table of numbers (every 250 rpm) and the readout's slider steps (50 rpm) need; the
// server renders from the very same thinned view, so the browser hydrates against
// identical numbers. A graph turning live asks for the edition's full curves (the
// reader's figures answer, cached like a page), so the readout follows the pointer on
// the analysis grid with the workspace's values. Pure.
import type { MagazineStoryResponse } from '#shared/types/magazine'

export const PAGE_CURVE_STEP_RPM = 50

/** The points on every `step` rpm, plus the first and the last (the curve keeps its range). */
export function pointsEvery<T extends { rpm: number }>(points: readonly T[], step: number): T[] {
  return points.filter((p, i) => i === 0 || i === points.length - 1 || Math.round(p.rpm) % step === 0)
}

/** The view a story page is rendered from and carries: curves thinned, everything else as is. */
export function withPageCurves(view: MagazineStoryResponse): MagazineStoryResponse {
  const a = view.figures.analysis
  if (!a) return view
  return {
    ...view,
    curvesStepRpm: PAGE_CURVE_STEP_RPM,
    figures: { ...view.figures, analysis: { ...a, setups: a.setups.map(s => ({ ...s, curve: pointsEvery(s.curve, PAGE_CURVE_STEP_RPM) })) } },
  }
}
