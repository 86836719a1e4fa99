// A story for readers (StoryReaderView): published, or a preview for its desk.
export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  const story = await findReaderStory(slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  return readerView(story)
})
