import { MagazineSlugParams } from '~~/server/services/magazine/lists'
import { findReaderStory, readerAnalysis, ReaderAnalysisQuery, readerCacheHeaders } from '~~/server/services/magazine/story'
// The story's curves and results with the reader's correction standard and units.
export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  const query = await getValidatedQuery(event, zodParser(ReaderAnalysisQuery))
  const story = await findReaderStory(useDb(), slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  const { analysis, problem } = await readerAnalysis(useDb(), story, query)
  if (!analysis) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: problem ?? 'This story has no data.' })
  return analysis
})
