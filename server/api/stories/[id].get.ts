import type { StoryResponse } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<StoryResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return { story: await getStory(user, params.id) }
})
