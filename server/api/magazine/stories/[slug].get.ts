// A story for readers (StoryReaderView): published, or a preview for its desk.
export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  return readerStoryFor(event, slug)
})
