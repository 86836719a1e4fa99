// The story's figures in the reader's correction standard: every graph, table and
// inline value of the body is drawn from these.
export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  const { standard } = await getValidatedQuery(event, zodParser(ReaderAnalysisQuery.pick({ standard: true })))
  const story = await findReaderStory(slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  return readerFigures(story, standard)
})
