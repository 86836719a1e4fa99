import { CreateStoryBody, type StoryResponse } from '#shared/types/stories'
import { rolesAtLeast } from '#shared/accounts/roles'
import { createStoryDraft } from '~~/server/services/stories/save'

export default defineEventHandler(async (event): Promise<StoryResponse> => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const body = await readValidatedBody(event, zodParser(CreateStoryBody))
  const story = await createStoryDraft(useDb(), user, body)
  setResponseStatus(event, 201)
  return { story }
})
