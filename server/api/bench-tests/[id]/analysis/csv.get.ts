import { AnalysisQuery } from '#shared/types/analysis-results'
import { runAnalysis } from '~~/server/services/workspace/analysis'
import { analysisCsv } from '~~/server/services/workspace/analysis-csv'
import { findBenchTest } from '~~/server/services/workspace/bench-tests'
import { BenchTestParams, requireWorkspace, sendCsvFile } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const query = await getValidatedQuery(event, zodParser(AnalysisQuery))
  const db = useDb()
  const benchTest = await findBenchTest(db, user, params.id)
  const analysis = await runAnalysis(db, benchTest, query)
  return sendCsvFile(event, `${benchTest.slug}-results-${analysis.standard}.csv`, analysisCsv(analysis))
})
