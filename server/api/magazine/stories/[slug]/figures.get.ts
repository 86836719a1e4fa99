import { MagazineSlugParams } from '~~/server/services/magazine/lists'
import { findReaderStory, ReaderAnalysisQuery, readerCacheHeaders, readerFigures } from '~~/server/services/magazine/story'
// The story's figures in the reader's correction standard and units: every graph and
// table of the page is drawn from these (the prose keeps the edition's own figures).
export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  const query = await getValidatedQuery(event, zodParser(ReaderAnalysisQuery))
  const story = await findReaderStory(useDb(), slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  return readerFigures(useDb(), story, query)
})
