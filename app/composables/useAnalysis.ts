import type { AnalysisUnits } from '#shared/types/analysis'
import type { AnalysisResponse } from '#shared/types/analysis-results'
import type { CorrectionStandard } from '#shared/dyno'

export interface AnalysisChoice {
  /** null: every setup with included pulls (the server's default). */
  setupIds: number[] | null
  baselineId: number | null
  standard: CorrectionStandard | null
  units: AnalysisUnits
}

/** The query both the analysis and its CSV download send. */
export function analysisQuery(choice: AnalysisChoice, maxPoints?: number): Record<string, string> {
  const q: Record<string, string> = { units: choice.units }
  if (choice.setupIds) q.setups = choice.setupIds.join(',')
  if (choice.baselineId !== null) q.baseline = String(choice.baselineId)
  if (choice.standard) q.standard = choice.standard
  if (maxPoints) q.maxPoints = String(maxPoints)
  return q
}

export const analysisKey = (benchTestId: number, query: Record<string, string>) =>
  `analysis:${benchTestId}:${new URLSearchParams(query).toString()}`

export function useAnalysis(benchTestId: MaybeRefOrGetter<number>, choice: MaybeRefOrGetter<AnalysisChoice>) {
  const query = computed(() => analysisQuery(toValue(choice), 400))
  return useFetch<AnalysisResponse>(() => benchTestPath(toValue(benchTestId), '/analysis'), {
    key: computed(() => analysisKey(toValue(benchTestId), query.value)),
    query,
    // The graphs are drawn in the browser only; no need to hold the page's first paint for them.
    server: false,
  })
}

export function analysisCsvUrl(benchTestId: number, choice: AnalysisChoice): string {
  return `${benchTestPath(benchTestId, '/analysis/csv')}?${new URLSearchParams(analysisQuery(choice)).toString()}`
}
