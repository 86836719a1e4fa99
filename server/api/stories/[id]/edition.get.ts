import type { StoryEditionStatus } from '#shared/types/story-data'
import { storyEditionStatus } from '~~/server/services/stories/editions'
import { requireStoryRoute } from '~~/server/services/stories/route'

// The story's editions and whether the data its figures use moved since the last approval.
export default defineEventHandler(async (event): Promise<StoryEditionStatus> => {
  const { user, params } = await requireStoryRoute(event)
  return storyEditionStatus(useDb(), user, params.id)
})
