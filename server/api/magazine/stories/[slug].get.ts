import { MagazineSlugParams } from '~~/server/services/magazine/lists'
import { readerStoryFor } from '~~/server/services/magazine/story'
// A story for readers (StoryReaderView): published, or a preview for its desk.
export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  return readerStoryFor(useDb(), event, slug)
})
