import type { StoryResponse } from '#shared/types/stories'
import { requireStoryRoute } from '~~/server/services/stories/route'
import { getStory } from '~~/server/services/stories/stories'

export default defineEventHandler(async (event): Promise<StoryResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return { story: await getStory(useDb(), user, params.id) }
})
