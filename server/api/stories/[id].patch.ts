import { UpdateStoryBody, type StoryResponse } from '#shared/types/stories'
import { requireStoryRoute } from '~~/server/services/stories/route'
import { saveStoryContent } from '~~/server/services/stories/save'

export default defineEventHandler(async (event): Promise<StoryResponse> => {
  const { user, params } = await requireStoryRoute(event)
  const body = await readValidatedBody(event, zodParser(UpdateStoryBody))
  return { story: await saveStoryContent(useDb(), user, params.id, body) }
})
