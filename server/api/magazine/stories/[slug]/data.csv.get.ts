import { MagazineSlugParams } from '~~/server/services/magazine/lists'
import { findReaderStory, readerAnalysis, ReaderAnalysisQuery, readerCacheHeaders } from '~~/server/services/magazine/story'
import { storyDataCsv } from '~~/server/services/workspace/analysis-csv'
import { sendCsvFile } from '~~/server/services/workspace/route'
// "Download the data": from the edition readers see, everything needed to redo the
// analysis (pulls and weather, averaged and corrected curves, the results table).
export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  const query = await getValidatedQuery(event, zodParser(ReaderAnalysisQuery))
  const story = await findReaderStory(useDb(), slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  const { analysis, problem, source } = await readerAnalysis(useDb(), story, query)
  if (!analysis) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: problem ?? 'This story has no data.' })
  return sendCsvFile(event, `${slug}-data.csv`, storyDataCsv(source.data, analysis))
})
