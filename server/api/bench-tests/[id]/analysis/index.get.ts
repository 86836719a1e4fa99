import { AnalysisQuery, type AnalysisResponse } from '#shared/types/analysis-results'
import { runAnalysis } from '~~/server/services/workspace/analysis'
import { findBenchTest } from '~~/server/services/workspace/bench-tests'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event): Promise<AnalysisResponse> => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const query = await getValidatedQuery(event, zodParser(AnalysisQuery))
  const db = useDb()
  return runAnalysis(db, await findBenchTest(db, user, params.id), query)
})
