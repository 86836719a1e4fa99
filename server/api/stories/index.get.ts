import { StoryListQuery, type StoryListResponse } from '#shared/types/stories'
import { rolesAtLeast } from '#shared/accounts/roles'
import { listStories } from '~~/server/services/stories/lists'

export default defineEventHandler(async (event): Promise<StoryListResponse> => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const query = await getValidatedQuery(event, zodParser(StoryListQuery))
  return { stories: await listStories(useDb(), user, query) }
})
