import { UpdateStoryBody, type StoryResponse } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<StoryResponse> => {
  const { user, params } = await requireStoryRoute(event)
  const body = await readValidatedBody(event, zodParser(UpdateStoryBody))
  return { story: await saveStoryContent(user, params.id, body) }
})
