// "Download the data": the results table as the page shows it, as CSV.
export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  const query = await getValidatedQuery(event, zodParser(ReaderAnalysisQuery))
  const story = await findReaderStory(slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  const { analysis, problem } = await readerAnalysis(story, query)
  if (!analysis) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: problem ?? 'This story has no data.' })
  return sendCsvFile(event, `${slug}-results.csv`, analysisCsv(analysis))
})
