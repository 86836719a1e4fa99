import { MyStoriesQuery, type MyStoriesResponse } from '#shared/types/stories'
import { rolesAtLeast } from '#shared/accounts/roles'
import { myStories } from '~~/server/services/stories/lists'

export default defineEventHandler(async (event): Promise<MyStoriesResponse> => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const { state } = await getValidatedQuery(event, zodParser(MyStoriesQuery))
  return myStories(useDb(), user, state)
})
