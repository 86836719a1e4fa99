import type { StoryFigures } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<StoryFigures> => {
  const { user, params } = await requireStoryRoute(event)
  return getStoryFigures(user, params.id)
})
