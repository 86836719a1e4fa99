import { RestoreRevisionBody, type StoryResponse } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<StoryResponse> => {
  const { user, params } = await requireStoryRoute(event, StoryRevisionParams)
  const body = await readValidatedBody(event, zodParser(RestoreRevisionBody))
  return { story: await restoreRevision(user, params.id, params.revisionId, body.version) }
})
